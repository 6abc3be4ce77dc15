import { describe, expect, it } from 'vitest';
import { BoundedCache, cachedBody, matchesIfNoneMatch, queryObject, sendCached, strongEtag } from '~/lib/server/http-cache';

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
    const notModified = ask('GET', cached.etag);
    expect(notModified.status).toBe(304);
    expect(await notModified.text()).toBe('');
    expect(notModified.headers.get('cache-control')).toBe('public, max-age=60');
    expect(ask('POST', cached.etag).status).toBe(412);
    const fresh = ask('GET', '"other"');
    expect(fresh.status).toBe(200);
    expect(await fresh.text()).toBe('{"a":1}');
    expect(fresh.headers.get('etag')).toBe(cached.etag);
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
