/**
 * How large a request body may be. Every body the app reads is small JSON or a form (photos go
 * straight to storage through presigned URLs), so one cap covers them all.
 */
export const MAX_BODY_BYTES = 64 * 1024;
export const MAX_BODY_LABEL = '64 kB';

/**
 * True when the body is larger than `max` bytes. A declared Content-Length decides alone: over the
 * cap it is refused unread, and within it nothing needs counting, as Node's HTTP parser never hands
 * on more body than the declared length (the rest is read as the next request on the connection,
 * or refused as a malformed one). Only a chunked body (no length declared) has the bytes of a copy
 * counted as they stream in, stopping at the first byte over the cap, so no more than `max` bytes
 * plus one chunk are ever held. The request's own body is left unread for the route.
 */
export async function bodyTooLarge(request: Request, max = MAX_BODY_BYTES): Promise<boolean> {
  if (!request.body) return false;
  const declared = request.headers.get('content-length');
  if (declared !== null) return !(Number(declared) <= max);
  const reader = request.clone().body!.getReader();
  let received = 0;
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) return false;
      received += value.byteLength;
      if (received > max) return true;
    }
  } finally {
    reader.cancel().catch(() => {});
  }
}
