import { createHash } from 'node:crypto';

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

  get size(): number {
    return this.#entries.size;
  }
}

/** A body ready to send, with its strong validator. */
export interface CachedBody {
  body: string;
  etag: string;
  contentType: string;
}

/** A strong ETag: a digest of the exact bytes sent, so it changes whenever the content does. */
export function strongEtag(body: string): string {
  return `"${createHash('sha256').update(body).digest('base64url').slice(0, 32)}"`;
}

export function cachedBody(body: string, contentType: string): CachedBody {
  return { body, etag: strongEtag(body), contentType };
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
 * Sends `cached` with its ETag and `cacheControl`. When the request's If-None-Match names it, a GET
 * or HEAD gets 304 without a body and any other method 412 (RFC 9110 §13.1.2); else 200 and the body.
 */
export function sendCached(request: Request, cached: CachedBody, cacheControl: string, extraHeaders: Record<string, string> = {}): Response {
  const headers = { etag: cached.etag, 'cache-control': cacheControl, ...extraHeaders };
  if (matchesIfNoneMatch(request.headers.get('if-none-match'), cached.etag)) {
    const safe = request.method === 'GET' || request.method === 'HEAD';
    return new Response(null, { status: safe ? 304 : 412, headers });
  }
  return new Response(cached.body, { status: 200, headers: { 'content-type': cached.contentType, ...headers } });
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
