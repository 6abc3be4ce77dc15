import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';

/**
 * Answers that are pure functions of their request, computed once per process and revalidated by
 * browsers and caches with a strong ETag (RFC 9110 §8.8.3), so a repeat costs a 304 and no body.
 */

/** A map that forgets its least recently used entry beyond `max` entries. */
export class BoundedCache<K, V> {
  readonly #entries = new Map<K, V>();
  constructor(readonly max: number) {}

  get(key: K): V | undefined {
    const value = this.#entries.get(key);
    if (value === undefined) return undefined;
    // Map keeps insertion order: moving the entry to the end makes the first the least recently used.
    this.#entries.delete(key);
    this.#entries.set(key, value);
    return value;
  }

  set(key: K, value: V): void {
    this.#entries.delete(key);
    this.#entries.set(key, value);
    if (this.#entries.size > this.max) this.#entries.delete(this.#entries.keys().next().value as K);
  }

  /** The value for `key`, computed by `compute` the first time (or again once forgotten). */
  remember(key: K, compute: () => V): V {
    const known = this.get(key);
    if (known !== undefined) return known;
    const value = compute();
    this.set(key, value);
    return value;
  }

  delete(key: K): void {
    this.#entries.delete(key);
  }

  get size(): number {
    return this.#entries.size;
  }
}

/** One key per meaning of a validated request: its defined fields in sorted order. */
export const requestKey = (request: object): string =>
  JSON.stringify(
    Object.entries(request)
      .filter(([, value]) => value !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : 1)),
  );

/** One representation of a cached answer: the exact bytes sent and their strong validator. */
export interface Representation {
  bytes: Uint8Array<ArrayBuffer>;
  etag: string;
}

/**
 * A body ready to send: its bytes (encoded once, not on every request), its strong validator, and
 * a gzip-coded copy when that is worth sending (bodies of a kilobyte or more that shrink).
 */
export interface CachedBody {
  identity: Representation;
  gzip?: Representation;
  contentType: string;
}

/** A strong ETag: a digest of the exact bytes sent, so it changes whenever the content does. */
export function strongEtag(body: string | Uint8Array): string {
  return `"${createHash('sha256').update(body).digest('base64url').slice(0, 32)}"`;
}

const GZIP_FROM_BYTES = 1024;

export function cachedBody(body: string, contentType: string): CachedBody {
  const bytes = new TextEncoder().encode(body);
  const identity = { bytes, etag: strongEtag(bytes) };
  if (bytes.length < GZIP_FROM_BYTES) return { identity, contentType };
  const zipped = new Uint8Array(gzipSync(bytes, { level: 9 }));
  // A coded representation has a validator of its own (RFC 9110 §8.8.3: strong validators differ per content coding).
  return { identity, contentType, ...(zipped.length < bytes.length ? { gzip: { bytes: zipped, etag: strongEtag(zipped) } } : {}) };
}

export const cachedJson = (value: unknown): CachedBody => cachedBody(JSON.stringify(value), 'application/json; charset=utf-8');

/**
 * Whether an If-None-Match header matches `etag`: `*`, or a list naming it. The comparison is weak
 * (a `W/` prefix is ignored), as RFC 9110 §13.1.2 asks for If-None-Match.
 */
export function matchesIfNoneMatch(header: string | null, etag: string): boolean {
  if (!header) return false;
  if (header.trim() === '*') return true;
  const opaque = (tag: string) => tag.trim().replace(/^W\//, '');
  return header.split(',').some((tag) => opaque(tag) === opaque(etag));
}

/**
 * Whether an Accept-Encoding header lets us send gzip (RFC 9110 §12.5.3): `gzip` (or its alias
 * `x-gzip`) listed with a non-zero weight, or `*` with a non-zero weight and gzip not refused.
 */
export function acceptsGzip(header: string | null): boolean {
  if (!header) return false;
  let star = false;
  for (const part of header.split(',')) {
    const [coding, ...parameters] = part.split(';').map((piece) => piece.trim().toLowerCase());
    const weight = parameters.find((parameter) => parameter.startsWith('q='));
    const allowed = weight === undefined || Number(weight.slice(2)) > 0;
    if (coding === 'gzip' || coding === 'x-gzip') return allowed;
    if (coding === '*') star = allowed;
  }
  return star;
}

/**
 * Sends `cached` with its ETag and `cacheControl`, gzip-coded when the request accepts it. When the
 * request's If-None-Match names the chosen representation's ETag, a GET or HEAD gets 304 without a
 * body and any other method 412 (RFC 9110 §13.1.2); else 200 and the body.
 */
export function sendCached(request: Request, cached: CachedBody, cacheControl: string, extraHeaders: Record<string, string> = {}): Response {
  const coded = cached.gzip && acceptsGzip(request.headers.get('accept-encoding')) ? cached.gzip : undefined;
  const chosen = coded ?? cached.identity;
  const vary = [extraHeaders.vary, cached.gzip ? 'accept-encoding' : undefined].filter(Boolean).join(', ');
  const headers: Record<string, string> = { ...extraHeaders, etag: chosen.etag, 'cache-control': cacheControl, ...(vary ? { vary } : {}) };
  if (matchesIfNoneMatch(request.headers.get('if-none-match'), chosen.etag)) {
    const safe = request.method === 'GET' || request.method === 'HEAD';
    return new Response(null, { status: safe ? 304 : 412, headers });
  }
  if (coded) headers['content-encoding'] = 'gzip';
  return new Response(chosen.bytes, {
    status: 200,
    headers: { 'content-type': cached.contentType, 'content-length': String(chosen.bytes.length), ...headers },
  });
}

/**
 * A query string as an object for a zod schema: the first value of each parameter, and those named
 * in `numeric` as numbers when they read as one (anything else stays text, for zod to refuse).
 */
export function queryObject(url: URL, numeric: readonly string[]): Record<string, string | number> {
  const raw: Record<string, string | number> = {};
  for (const name of new Set(url.searchParams.keys())) {
    const value = url.searchParams.get(name)!;
    const number = Number(value);
    raw[name] = numeric.includes(name) && value.trim() !== '' && Number.isFinite(number) ? number : value;
  }
  return raw;
}
