import {
  DeleteObjectsCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { config } from './config';

let client: S3Client | undefined;

/** The S3 client. Checksums only when required: s3rver stores chunk framing otherwise. */
export function s3(): S3Client {
  const settings = config();
  client ??= new S3Client({
    endpoint: settings.S3_ENDPOINT,
    region: settings.S3_REGION,
    forcePathStyle: true,
    credentials: { accessKeyId: settings.S3_ACCESS_KEY_ID, secretAccessKey: settings.S3_SECRET_ACCESS_KEY },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  return client;
}

const bucket = () => config().S3_BUCKET;

export async function pingStorage(): Promise<void> {
  await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
}

export async function putObject(key: string, body: Uint8Array, contentType: string): Promise<void> {
  await s3().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType }));
}

/** Reads a whole object; undefined when it does not exist. */
export async function getObject(key: string): Promise<Uint8Array | undefined> {
  try {
    const result = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    return result.Body ? await result.Body.transformToByteArray() : new Uint8Array();
  } catch (error) {
    if ((error as { name?: string }).name === 'NoSuchKey') return undefined;
    throw error;
  }
}

/** What storage says of an object without reading it: its size and the content type it was stored with. */
export interface StoredObject {
  size: number;
  contentType: string | undefined;
}

/** An object's size and stored content type; undefined when it does not exist. */
export async function headObject(key: string): Promise<StoredObject | undefined> {
  try {
    const result = await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
    return { size: result.ContentLength ?? 0, contentType: result.ContentType };
  } catch (error) {
    const failure = error as { name?: string; $metadata?: { httpStatusCode?: number } };
    if (failure.name === 'NotFound' || failure.name === 'NoSuchKey' || failure.$metadata?.httpStatusCode === 404) return undefined;
    throw error;
  }
}

/** An object's size in bytes without reading it; undefined when it does not exist. */
export async function objectSize(key: string): Promise<number | undefined> {
  return (await headObject(key))?.size;
}

export async function deleteObjects(keys: string[]): Promise<void> {
  for (let start = 0; start < keys.length; start += 1000) {
    const batch = keys.slice(start, start + 1000);
    if (batch.length === 0) continue;
    await s3().send(new DeleteObjectsCommand({ Bucket: bucket(), Delete: { Objects: batch.map((Key) => ({ Key })) } }));
  }
}

export async function listKeys(prefix: string): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const page = await s3().send(new ListObjectsV2Command({ Bucket: bucket(), Prefix: prefix, ContinuationToken: token }));
    for (const item of page.Contents ?? []) if (item.Key) keys.push(item.Key);
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return keys;
}

/**
 * A presigned PUT the browser uses to upload straight to storage. Content-Type and Content-Length
 * are signed headers, so storage refuses a file of another type or size (the presigner leaves the
 * content type unsigned unless asked).
 */
export async function presignPut(key: string, contentType: string, byteSize: number, expiresInSeconds: number): Promise<string> {
  const command = new PutObjectCommand({ Bucket: bucket(), Key: key, ContentType: contentType, ContentLength: byteSize });
  return getSignedUrl(s3(), command, { expiresIn: expiresInSeconds, signableHeaders: new Set(['content-type', 'content-length']) });
}

/** A presigned GET to download a file: storage answers with this content type, as an attachment, whatever the object was stored with. */
export async function presignDownload(key: string, contentType: string, expiresInSeconds: number): Promise<string> {
  const command = new GetObjectCommand({ Bucket: bucket(), Key: key, ResponseContentType: contentType, ResponseContentDisposition: 'attachment' });
  return getSignedUrl(s3(), command, { expiresIn: expiresInSeconds });
}

/** A presigned GET for showing a stored file; a fixed `signingDate` gives the same URL (so browsers can cache it). */
export async function presignGet(key: string, expiresInSeconds = 3600, signingDate?: Date): Promise<string> {
  return getSignedUrl(s3(), new GetObjectCommand({ Bucket: bucket(), Key: key }), { expiresIn: expiresInSeconds, signingDate });
}
