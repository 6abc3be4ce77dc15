// An independent AWS Signature Version 4 check of a presigned S3 URL, written from the published
// algorithm rather than the SDK, so a test can show which header values a URL is signed for.
// Source: Amazon S3 API Reference, "Authenticating Requests: Using Query Parameters (AWS Signature
// Version 4)" — canonical request, string to sign, signing key; and AWS IAM User Guide, "Create a
// signed AWS API request" (URI encoding, sorted query, lowercase header names, trimmed values).
import { createHash, createHmac } from 'node:crypto';

const hmac = (key: string | Buffer, data: string) => createHmac('sha256', key).update(data).digest();
const sha256Hex = (data: string) => createHash('sha256').update(data).digest('hex');

/** RFC 3986 unreserved characters stay; everything else is %XX with upper-case hex. */
const uriEncode = (text: string) => encodeURIComponent(text).replace(/[!'()*]/g, (char) => `%${char.charCodeAt(0).toString(16).toUpperCase()}`);

/**
 * The signature a presigned URL must carry for a request sending these header values (names in
 * lower case; each header the URL lists in X-Amz-SignedHeaders must be given).
 */
export function presignedSignature(method: string, url: URL, headers: Record<string, string>, secretAccessKey: string): string {
  const query = [...url.searchParams]
    .filter(([name]) => name !== 'X-Amz-Signature')
    .map(([name, value]) => [uriEncode(name), uriEncode(value)])
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    .map(([name, value]) => `${name}=${value}`)
    .join('&');
  const signed = url.searchParams.get('X-Amz-SignedHeaders')!.split(';');
  const canonicalHeaders = signed.map((name) => `${name}:${(headers[name] ?? '').trim()}\n`).join('');
  // S3 presigned URLs carry an unsigned payload.
  const payload = url.searchParams.get('X-Amz-Content-Sha256') ?? 'UNSIGNED-PAYLOAD';
  // The path as the URL has it is already URI-encoded once, as S3 wants it (no double encoding).
  const canonicalRequest = [method, url.pathname, query, canonicalHeaders, signed.join(';'), payload].join('\n');
  const [, date, region, service] = url.searchParams.get('X-Amz-Credential')!.split('/');
  const scope = `${date}/${region}/${service}/aws4_request`;
  const stringToSign = ['AWS4-HMAC-SHA256', url.searchParams.get('X-Amz-Date')!, scope, sha256Hex(canonicalRequest)].join('\n');
  const signingKey = hmac(hmac(hmac(hmac(`AWS4${secretAccessKey}`, date), region), service), 'aws4_request');
  return createHmac('sha256', signingKey).update(stringToSign).digest('hex');
}
