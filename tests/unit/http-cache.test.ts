import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { BoundedCache, acceptsGzip, cachedBody, matchesIfNoneMatch, queryObject, sendCached, strongEtag } from '~/lib/server/http-cache';

describe('BoundedCache', () => {
  it('forgets the least recently used entry past its size, and a read counts as a use', () => {
    const cache = new BoundedCache<string, number>(2);
    cache.set('a', 1);
    cache.set('b', 2);
    expect(cache.get('a')).toBe(1);
    cache.set('c', 3);
    expect(cache.get('b')).toBeUndefined();
    expect(cache.get('a')).toBe(1);
    expect(cache.get('c')).toBe(3);
    expect(cache.size).toBe(2);
  });

  it('computes a value once while it is kept', () => {
    const cache = new BoundedCache<string, object>(4);
    let runs = 0;
    const compute = () => ({ run: (runs += 1) });
    expect(cache.remember('k', compute)).toBe(cache.remember('k', compute));
    expect(runs).toBe(1);
  });
});

describe('If-None-Match', () => {
  const etag = '"xyzzy"';
  // Source: RFC 9110 §13.1.2 and its examples (from memory) — the header is "*" or a list of entity tags, compared with the weak
  // comparison of §8.8.3.2 (W/"xyzzy" matches "xyzzy").
  it.each([
    ['"xyzzy"', true],
    ['W/"xyzzy"', true],
    ['"r2d2xxxx", "c3piozzzz", "xyzzy"', true],
    ['*', true],
    ['"xyzzy2"', false],
    ['xyzzy', false],
    ['', false],
  ])('%j matches "xyzzy": %s', (header, expected) => {
    expect(matchesIfNoneMatch(header, etag)).toBe(expected);
  });

  it('a GET naming the ETag gets 304 with no body, a POST 412, anything else 200 with the body', async () => {
    const cached = cachedBody('{"a":1}', 'application/json');
    const ask = (method: string, ifNoneMatch?: string) =>
      sendCached(new Request('http://app.test/x', { method, headers: ifNoneMatch ? { 'if-none-match': ifNoneMatch } : {} }), cached, 'public, max-age=60');
    const notModified = ask('GET', cached.identity.etag);
    expect(notModified.status).toBe(304);
    expect(await notModified.text()).toBe('');
    expect(notModified.headers.get('cache-control')).toBe('public, max-age=60');
    expect(ask('POST', cached.identity.etag).status).toBe(412);
    const fresh = ask('GET', '"other"');
    expect(fresh.status).toBe(200);
    expect(await fresh.text()).toBe('{"a":1}');
    expect(fresh.headers.get('etag')).toBe(cached.identity.etag);
  });
});

describe('Accept-Encoding', () => {
  // Source: RFC 9110 §12.5.3 — its examples (the first five, from memory), weights of §12.4.2
  // (q=0 means "not acceptable"), and "x-gzip" as an alias of gzip (§8.4.1.3).
  it.each([
    ['compress, gzip', true],
    ['', false],
    ['*', true],
    ['compress;q=0.5, gzip;q=1.0', true],
    ['gzip;q=1.0, identity; q=0.5, *;q=0', true],
    ['gzip;q=0', false],
    ['*;q=0', false],
    ['*, gzip;q=0', false],
    ['identity', false],
    ['br, x-gzip', true],
    ['GZIP', true],
    ['gzip, deflate, br, zstd', true],
  ])('%j lets us send gzip: %s', (header, expected) => {
    expect(acceptsGzip(header)).toBe(expected);
  });
});

describe('a cached body sent gzip-coded', () => {
  const text = JSON.stringify({ ladder: Array.from({ length: 200 }, (_, index) => ({ nm: index, hex: '#4a6fa5' })) });
  const cached = cachedBody(text, 'application/json');
  const ask = (headers: Record<string, string>) => sendCached(new Request('http://app.test/x', { headers }), cached, 'no-cache', { vary: 'cookie' });

  it('decodes to the same bytes, with a validator of its own, and only for a request that accepts gzip', async () => {
    const coded = ask({ 'accept-encoding': 'gzip, deflate, br' });
    expect(coded.headers.get('content-encoding')).toBe('gzip');
    const bytes = Buffer.from(await coded.arrayBuffer());
    expect(coded.headers.get('content-length')).toBe(String(bytes.length));
    // Node's own gunzip, not ours, reads it back.
    expect(gunzipSync(bytes).toString('utf8')).toBe(text);
    expect(bytes.length).toBeLessThan(Buffer.byteLength(text));
    // Source: RFC 9110 §8.8.3 — a strong validator differs between representations, content codings included.
    expect(coded.headers.get('etag')).not.toBe(cached.identity.etag);
    expect(coded.headers.get('vary')).toBe('cookie, accept-encoding');

    const plain = ask({});
    expect(plain.headers.get('content-encoding')).toBeNull();
    expect(await plain.text()).toBe(text);
    expect(plain.headers.get('vary')).toBe('cookie, accept-encoding');
  });

  it('answers 304 only to the ETag of the representation it would send', () => {
    const codedEtag = ask({ 'accept-encoding': 'gzip' }).headers.get('etag')!;
    expect(ask({ 'accept-encoding': 'gzip', 'if-none-match': codedEtag }).status).toBe(304);
    expect(ask({ 'accept-encoding': 'gzip', 'if-none-match': cached.identity.etag }).status).toBe(200);
    expect(ask({ 'if-none-match': cached.identity.etag }).status).toBe(304);
    expect(ask({ 'if-none-match': codedEtag }).status).toBe(200);
  });

  it('is not made for a small body (under a kilobyte)', () => {
    expect(cachedBody('{"a":1}', 'application/json').gzip).toBeUndefined();
    expect(ask({}).status).toBe(200);
  });
});

describe('strongEtag', () => {
  it('is a strong entity tag (RFC 9110 §8.8.3: a quoted string, no W/) that differs when one byte does', () => {
    expect(strongEtag('ladder A')).toMatch(/^"[\x21\x23-\x7e]+"$/);
    expect(strongEtag('ladder A')).toBe(strongEtag('ladder A'));
    expect(strongEtag('ladder A')).not.toBe(strongEtag('ladder B'));
  });
});

describe('queryObject', () => {
  it('reads the named parameters as numbers when they are numbers, and leaves everything else as text for the schema to judge', () => {
    const url = new URL('http://app.test/?alloy=ti-grade-5&toNm=200&fromNm=&stepNm=1e1&illuminant=A&toNm=300&odd=lots');
    expect(queryObject(url, ['toNm', 'fromNm', 'stepNm', 'odd'])).toEqual({
      alloy: 'ti-grade-5',
      toNm: 200,
      fromNm: '',
      stepNm: 10,
      illuminant: 'A',
      odd: 'lots',
    });
  });
});
