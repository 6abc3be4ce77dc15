// Every error under /api/ is JSON of one shape, {error, field?}, never an empty body; route ids
// are plain digits.
import { beforeAll, describe, expect, it } from 'vitest';
import { api, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';

/** Checks the one error shape: a JSON object with a non-empty `error` and at most a `field`. */
async function expectErrorShape(response: Response) {
  expect(response.headers.get('content-type')).toMatch(/^application\/json/);
  const body = await response.json();
  expect(Object.keys(body).every((key) => key === 'error' || key === 'field')).toBe(true);
  expect(typeof body.error).toBe('string');
  expect(body.error.length).toBeGreaterThan(0);
  return body as { error: string; field?: string };
}

describe('errors under /api/', () => {
  it.each([
    ['an unknown API route', 'GET', '/api/no-such-route', 404],
    ['an unknown API route, posted to', 'POST', '/api/no-such-route', 404],
    ['an unknown API route below a real one', 'GET', '/api/coupons/1/no-such-thing', 404],
    ['an unknown Auth.js action', 'GET', '/api/auth/no-such-action', 404],
    ['an unknown Auth.js action, posted to', 'POST', '/api/auth/no-such-action', 404],
    ['an Auth.js route written with a doubled slash', 'GET', '/api/auth//session', 404],
    ['an Auth.js route with a percent-encoded letter', 'GET', '/api/%61uth/session', 404],
  ])('%s: %s %s answers %i as JSON', async (_label, method, path, status) => {
    const response = await api(path, { method });
    expect(response.status).toBe(status);
    await expectErrorShape(response);
  });

  it.each([
    ['an unknown API route', '/api/no-such-route'],
    ['an Auth.js route with a doubled slash before it', '/api//auth/signout'],
    ['an Auth.js route with a percent-encoded letter', '/api/%61uth/signout'],
  ])('%s, sent a JSON body (%s), answers 404 as JSON', async (_label, path) => {
    const response = await api(path, { json: { anything: 1 } });
    expect(response.status).toBe(404);
    await expectErrorShape(response);
  });

  it.each([
    // Allow lists the methods the route's module exports (HEAD comes with GET), per RFC 9110 §15.5.6.
    ['DELETE', '/api/alloys', 'GET, HEAD'],
    ['PUT', '/api/health', 'GET, HEAD'],
    ['OPTIONS', '/api/coupons', 'GET, HEAD, POST'],
    ['PUT', '/api/account', 'DELETE, GET, HEAD, PATCH'],
    ['GET', '/api/account/sign-out', 'POST'],
    ['PUT', '/api/auth/session', 'GET, HEAD, POST'],
  ])('a method the route lacks, %s %s, answers 405 with Allow: %s', async (method, path, allow) => {
    const response = await api(path, { method });
    expect(response.status).toBe(405);
    expect(response.headers.get('allow')).toBe(allow);
    await expectErrorShape(response);
  });

  it.each([
    ['a form post', { form: { anything: '1' } }],
    ['a JSON post', { json: {} }],
    ['a post with no body', { method: 'POST' }],
  ])('the cross-site refusal of %s is JSON', async (_label, init) => {
    const response = await api('/api/account/sign-out', { ...init, headers: { origin: 'http://evil.example' } });
    expect(response.status).toBe(403);
    await expectErrorShape(response);
  });

  it('a signed-out caller of a signed-in route gets JSON', async () => {
    const response = await api('/api/account');
    expect(response.status).toBe(401);
    await expectErrorShape(response);
  });
});

describe('route ids are plain digits', () => {
  let member: Jar;
  let couponId: number;
  let photoId: number;

  beforeAll(async () => {
    member = await signedIn(demo.member);
    const { coupons } = (await (await api('/api/coupons?mine=1&limit=100', { jar: member })).json()) as { coupons: { id: number }[] };
    for (const coupon of coupons) {
      const { photos } = (await (await api(`/api/coupons/${coupon.id}/photos`, { jar: member })).json()) as { photos: { id: number }[] };
      if (photos.length) {
        couponId = coupon.id;
        photoId = photos[0].id;
        break;
      }
    }
  });

  // Each spelling means the same number to JavaScript's Number() but is not the id as written.
  const spellings = (id: number) => [`${id}e0`, `0x${id.toString(16)}`, `${id}.0`, `+${id}`, `%20${id}`, `${id}%20`, `0${id}`, `${id}n`];

  it('the plain id is found', async () => {
    expect((await api(`/api/coupons/${couponId}`, { jar: member })).status).toBe(200);
    expect((await api(`/api/photos/${photoId}`, { jar: member })).status).toBe(200);
    expect((await api(`/coupons/${couponId}`, { jar: member })).status).toBe(200);
  });

  it('every other spelling of a coupon id is 404', async () => {
    for (const spelling of spellings(couponId)) {
      const response = await api(`/api/coupons/${spelling}`, { jar: member });
      expect(response.status, spelling).toBe(404);
      await expectErrorShape(response);
      expect((await api(`/api/coupons/${spelling}/photos`, { jar: member })).status, `${spelling}/photos`).toBe(404);
      expect((await api(`/coupons/${spelling}`, { jar: member })).status, `page ${spelling}`).toBe(404);
      expect((await api(`/coupons/${spelling}/edit`, { jar: member })).status, `edit page ${spelling}`).toBe(404);
    }
  });

  it('every other spelling of a photo id is 404', async () => {
    for (const spelling of spellings(photoId)) {
      expect((await api(`/api/photos/${spelling}`, { jar: member })).status, spelling).toBe(404);
      expect((await api(`/api/photos/${spelling}/regions`, { method: 'PUT', jar: member, json: { regions: [] } })).status, `${spelling}/regions`).toBe(404);
    }
  });

  it('an id too large for the database is 404, not an error', async () => {
    for (const path of ['/api/coupons/99999999999', '/api/photos/2147483648', '/coupons/99999999999']) {
      expect((await api(path, { jar: member })).status, path).toBe(404);
    }
  });

  it('is checked before any body is read (a bad id with a bad body is still 404)', async () => {
    const response = await api(`/api/coupons/${couponId}e0`, { method: 'PATCH', jar: member, json: { title: '' } });
    expect(response.status).toBe(404);
  });
});
