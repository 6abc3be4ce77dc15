import { DeleteObjectsCommand, HeadObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';

/** A direct client for the test S3 fake, for checking what the app stored or removed. */
export const testS3 = new S3Client({
  endpoint: process.env.S3_ENDPOINT,
  region: 'us-east-1',
  forcePathStyle: true,
  credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
  requestChecksumCalculation: 'WHEN_REQUIRED',
  responseChecksumValidation: 'WHEN_REQUIRED',
});

const Bucket = process.env.S3_BUCKET;

export const putTestObject = (key: string, body: string | Uint8Array = 'x') => testS3.send(new PutObjectCommand({ Bucket, Key: key, Body: body }));

/** Every key under a prefix (all pages of the listing). */
export async function keysUnder(prefix: string): Promise<string[]> {
  const keys: string[] = [];
  let ContinuationToken: string | undefined;
  do {
    const page = await testS3.send(new ListObjectsV2Command({ Bucket, Prefix: prefix, ContinuationToken }));
    keys.push(...(page.Contents ?? []).map((item) => item.Key!));
    ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (ContinuationToken);
  return keys;
}

export async function deleteTestObjects(keys: string[]): Promise<void> {
  for (let start = 0; start < keys.length; start += 1000) {
    const Objects = keys.slice(start, start + 1000).map((Key) => ({ Key }));
    if (Objects.length) await testS3.send(new DeleteObjectsCommand({ Bucket, Delete: { Objects } }));
  }
}

export async function objectExists(key: string): Promise<boolean> {
  try {
    await testS3.send(new HeadObjectCommand({ Bucket, Key: key }));
    return true;
  } catch (error) {
    if ((error as { name?: string }).name === 'NotFound') return false;
    throw error;
  }
}
