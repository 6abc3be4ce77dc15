import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { api } from '../support/app';
import { anotherClientAddress, confirmedAccount, demo, signedIn } from '../support/auth';

/**
 * Answers that are pure functions of their request carry a strong ETag and Cache-Control, and a
 * repeat naming the ETag in If-None-Match costs a 304 with no body (RFC 9110 §13.1.2 and §15.4.5);
 * answers for someone signed in are never kept by a shared cache.
 */
const revalidate = (path: string, etag: string, init: Parameters<typeof api>[1] = {}) =>
  api(path, { ...init, headers: { ...(init.headers as Record<string, string>), 'if-none-match': etag } });

/** RFC 9110 §8.8.3: a strong entity tag is a quoted string without the W/ prefix. */
const STRONG_ETAG = /^"[\x21\x23-\x7e]+"$/;

async function firstAndRepeat(path: string) {
  const first = await api(path);
  const body = await first.text();
  const etag = first.headers.get('etag')!;
  const repeat = await revalidate(path, etag);
  return { first, body, etag, repeat, repeatBody: await repeat.text() };
}

describe.each([
  ['GET /api/tint/ladder', '/api/tint/ladder?alloy=ti-grade-5'],
  ['GET /api/tint/predict (visitor)', '/api/tint/predict?alloy=ti-grade-5&process=heat&temperatureC=400&holdMinutes=30'],
  ['GET /api/alloys', '/api/alloys'],
  ['GET /api/coupons (visitor)', '/api/coupons?limit=5'],
  ['the tint ladder page (visitor)', '/tint-ladder?alloy=ti-grade-5'],
])('%s', (_name, path) => {
  it('carries a strong ETag and public Cache-Control, and a repeat with If-None-Match is a 304 without a body', async () => {
    const { first, etag, repeat, repeatBody } = await firstAndRepeat(path);
    expect(first.status).toBe(200);
    expect(etag).toMatch(STRONG_ETAG);
    expect(first.headers.get('cache-control')).toMatch(/^public\b/);
    expect(repeat.status).toBe(304);
    expect(repeatBody).toBe('');
    expect(repeat.headers.get('etag')).toBe(etag);
  });

  it('answers 200 with the body to a stale or unrelated ETag, and 304 to a list or weak form naming it', async () => {
    const { etag, body } = await firstAndRepeat(path);
    const stale = await revalidate(path, '"something-else"');
    expect(stale.status).toBe(200);
    expect(await stale.text()).toBe(body);
    // RFC 9110 §13.1.2: If-None-Match takes a list and compares weakly.
    expect((await revalidate(path, `"other", ${etag}`)).status).toBe(304);
    expect((await revalidate(path, `W/${etag}`)).status).toBe(304);
  });
});

describe('the ETag follows the content', () => {
  it.each([
    ['/api/tint/ladder?alloy=ti-grade-5', '/api/tint/ladder?alloy=ti-grade-5&illuminant=A'],
    ['/api/tint/ladder?alloy=ti-grade-5', '/api/tint/ladder?alloy=ti-grade-2'],
    [
      '/api/tint/predict?alloy=ti-grade-5&process=heat&temperatureC=400&holdMinutes=30',
      '/api/tint/predict?alloy=ti-grade-5&process=heat&temperatureC=420&holdMinutes=30',
    ],
    ['/tint-ladder?alloy=ti-grade-5', '/tint-ladder?alloy=ti-grade-2'],
  ])('%s and %s differ, and so do their ETags; the first ETag is no good for the second', async (one, other) => {
    const a = await api(one);
    const b = await api(other);
    expect(await a.text()).not.toBe(await b.text());
    expect(a.headers.get('etag')).not.toBe(b.headers.get('etag'));
    expect((await revalidate(other, a.headers.get('etag')!)).status).toBe(200);
  });

  it('is the same for the same content however it is asked for (query order, defaults written out, GET or POST)', async () => {
    const plain = await api('/api/tint/ladder?alloy=ti-grade-5');
    const spelled = await api('/api/tint/ladder?illuminant=D65&stepNm=5&toNm=300&fromNm=0&alloy=ti-grade-5');
    const posted = await api('/api/tint/ladder', { json: { alloy: 'ti-grade-5' } });
    const body = await plain.text();
    expect(await spelled.text()).toBe(body);
    expect(await posted.text()).toBe(body);
    expect(spelled.headers.get('etag')).toBe(plain.headers.get('etag'));
    expect(posted.headers.get('etag')).toBe(plain.headers.get('etag'));
  });

  it('names the exact bytes: equal ETags only for equal bodies (an independent SHA-256 of each body)', async () => {
    const paths = ['/api/tint/ladder?alloy=ti-grade-5', '/api/tint/ladder?alloy=steel-1095', '/api/alloys', '/api/tint/ladder?alloy=ti-grade-5&toNm=200'];
    const seen = new Map<string, string>();
    for (const path of paths) {
      const response = await api(path);
      const digest = createHash('sha256')
        .update(await response.text())
        .digest('hex');
      seen.set(response.headers.get('etag')!, digest);
    }
    expect(new Set(seen.values()).size).toBe(seen.size);
  });
});

describe('a POST that names its ETag', () => {
  it('is refused with 412, not answered 304 (RFC 9110 §13.1.2: 304 is for GET and HEAD only)', async () => {
    const first = await api('/api/tint/predict', { json: { alloy: 'ti-grade-5', process: 'heat', temperatureC: 400, holdMinutes: 30 } });
    expect(first.status).toBe(200);
    const etag = first.headers.get('etag')!;
    expect(etag).toMatch(STRONG_ETAG);
    const again = await api('/api/tint/predict', {
      json: { alloy: 'ti-grade-5', process: 'heat', temperatureC: 400, holdMinutes: 30 },
      headers: { 'if-none-match': etag },
    });
    expect(again.status).toBe(412);
  });
});

describe('signed-in answers', () => {
  it('the tint ladder page is rendered for the person and never kept by a cache, even given the visitor’s ETag', async () => {
    const visitor = await api('/tint-ladder?alloy=ti-grade-5');
    await visitor.text();
    const member = await signedIn(demo.member, undefined, anotherClientAddress());
    const page = await revalidate('/tint-ladder?alloy=ti-grade-5', visitor.headers.get('etag')!, { jar: member });
    expect(page.status).toBe(200);
    expect(page.headers.get('cache-control')).toBe('no-store');
    expect(page.headers.get('etag')).toBeNull();
    const html = await page.text();
    expect(html).toContain('action="/api/account/sign-out"');
    expect(html).not.toContain('href="/sign-in"');
  });

  it('a prediction for someone signed in depends on their library: no ETag, no-store, never a 304', async () => {
    const path = '/api/tint/predict?alloy=ti-grade-5&process=heat&temperatureC=400&holdMinutes=30';
    const visitor = await api(path);
    await visitor.text();
    const member = await signedIn(demo.member, undefined, anotherClientAddress());
    const answer = await revalidate(path, visitor.headers.get('etag')!, { jar: member });
    expect(answer.status).toBe(200);
    expect(answer.headers.get('cache-control')).toBe('no-store');
    expect(answer.headers.get('etag')).toBeNull();
  });

  it('a visitor’s prediction and ladder page say they vary with the cookie, so a shared cache never gives them to someone signed in', async () => {
    const prediction = await api('/api/tint/predict?alloy=ti-grade-5&process=heat&temperatureC=400&holdMinutes=30');
    const page = await api('/tint-ladder');
    expect(prediction.headers.get('vary')?.toLowerCase()).toContain('cookie');
    expect(page.headers.get('vary')?.toLowerCase()).toContain('cookie');
  });
});

describe('bad queries', () => {
  it.each([
    ['/api/tint/ladder', 400, 'alloy'],
    ['/api/tint/ladder?alloy=ti-grade-5&toNm=lots', 400, 'toNm'],
    ['/api/tint/ladder?alloy=ti-grade-5&fromNm=100&toNm=50', 400, 'toNm'],
    ['/api/tint/ladder?alloy=unobtainium', 400, 'alloy'],
    ['/api/tint/predict?alloy=ti-grade-5&process=heat&temperatureC=hot&holdMinutes=30', 400, 'temperatureC'],
    ['/api/tint/predict?alloy=ti-grade-5&process=boil', 400, 'process'],
  ])('%s is a %i naming %s', async (path, status, field) => {
    const response = await api(path);
    expect(response.status).toBe(status);
    expect(((await response.json()) as { field?: string }).field).toBe(field);
  });
});

describe('the library list for visitors', () => {
  interface ListJson {
    coupons: { id: number; title: string; ownerName: string | null }[];
  }

  it('is kept per library version: a repeat is a 304, and each write through the app shows at once (an edit, a new name, made private)', async () => {
    const smith = await confirmedAccount();
    // A temperature no other coupon of the suite uses, so the view holds this coupon alone.
    const created = await api('/api/coupons', {
      jar: smith.jar,
      json: {
        title: 'Cached list test',
        layers: ['steel-1084'],
        surfacePrep: 'ground',
        process: 'oven',
        temperatureC: 1187,
        temperatureMethod: 'thermocouple',
        holdSeconds: 600,
        atmosphere: 'air',
        cooling: 'still-air',
        visibility: 'public',
      },
    });
    expect(created.status).toBe(201);
    const { id } = (await created.json()) as { id: number };
    const path = '/api/coupons?tempMin=1187&tempMax=1187&limit=10';
    const view = async (etag?: string) => {
      const response = etag ? await revalidate(path, etag) : await api(path);
      return { response, body: response.status === 200 ? ((await response.json()) as ListJson) : undefined };
    };

    const first = await view();
    expect(first.body!.coupons.map((coupon) => [coupon.id, coupon.title, coupon.ownerName])).toEqual([[id, 'Cached list test', 'Test Smith']]);
    const etag = first.response.headers.get('etag')!;
    expect(etag).toMatch(STRONG_ETAG);
    expect((await view(etag)).response.status).toBe(304);

    expect((await api(`/api/coupons/${id}`, { method: 'PATCH', jar: smith.jar, json: { title: 'Cached list test, renamed' } })).status).toBe(200);
    const edited = await view(etag);
    expect(edited.response.status).toBe(200);
    expect(edited.body!.coupons[0].title).toBe('Cached list test, renamed');

    expect((await api('/api/account', { method: 'PATCH', jar: smith.jar, json: { name: 'Test Smithson' } })).status).toBe(200);
    expect((await view(edited.response.headers.get('etag')!)).body?.coupons[0].ownerName).toBe('Test Smithson');

    expect((await api(`/api/coupons/${id}`, { method: 'PATCH', jar: smith.jar, json: { visibility: 'private' } })).status).toBe(200);
    expect((await view()).body!.coupons).toEqual([]);
  });
});
