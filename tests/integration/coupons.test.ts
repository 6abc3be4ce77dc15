import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { api, newJar, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { couponsChanged, deleteCoupons } from '../fixtures/library-coupons';
import { objectExists, putTestObject } from '../support/storage';
import { alloys, couponLayers, coupons, photos, swatches, users } from '../../db/schema';

const { db, pool } = testDatabase();
afterAll(() => pool.end());

const aCoupon = {
  title: 'Grade 2 / Grade 5 straw test',
  layers: ['ti-grade-2', 'ti-grade-5'],
  surfacePrep: 'ground',
  surfaceGrit: 400,
  process: 'oven',
  temperatureC: 540,
  temperatureMethod: 'thermocouple',
  holdSeconds: 1800,
  atmosphere: 'air',
  cooling: 'still-air',
  notes: 'Logged by the test suite.',
  visibility: 'private',
};

interface CouponJson {
  id: number;
  visibility: string;
  title: string;
  layers: { position: number; alloy: string; alloyName: string }[];
  canEdit: boolean;
  temperatureC: number | null;
  holdSeconds: number | null;
}

let member: Jar;
let member2: Jar;
let admin: Jar;
const visitor = newJar();
beforeAll(async () => {
  member = await signedIn(demo.member);
  member2 = await signedIn(demo.member2);
  admin = await signedIn(demo.admin);
});

async function create(jar: Jar, changes: Record<string, unknown> = {}): Promise<CouponJson> {
  const response = await api('/api/coupons', { jar, json: { ...aCoupon, ...changes } });
  expect(response.status).toBe(201);
  return response.json();
}

describe('POST /api/coupons', () => {
  it('logs a two-layer coupon and answers it with its id, visibility and layers in order', async () => {
    const coupon = await create(member);
    expect(coupon).toMatchObject({ title: aCoupon.title, visibility: 'private', temperatureC: 540, holdSeconds: 1800, canEdit: true });
    expect(coupon.id).toBeGreaterThan(0);
    expect(coupon.layers.map((layer) => layer.alloy)).toEqual(['ti-grade-2', 'ti-grade-5']);
    const [row] = await db.select().from(coupons).where(eq(coupons.id, coupon.id));
    expect(row.layerKey).toBe('ti-grade-2+ti-grade-5');
  });

  it.each([
    ['an unknown alloy', { layers: ['unobtainium'] }, 'layers.0'],
    ['a temperature above 1600 °C', { temperatureC: 1700 }, 'temperatureC'],
    ['a negative hold', { holdSeconds: -60 }, 'holdSeconds'],
    ['a heat with no temperature', { temperatureC: null }, 'temperatureC'],
    ['argon with no flow', { atmosphere: 'argon' }, 'argonFlowLpm'],
    ['anodizing with no voltage', { process: 'anodize' }, 'volts'],
    ['a missing title', { title: '' }, 'title'],
    ['a visibility of "friends"', { visibility: 'friends' }, 'visibility'],
  ])('refuses %s with a 400 naming the field', async (_label, change, field) => {
    const response = await api('/api/coupons', { jar: member, json: { ...aCoupon, ...change } });
    expect(response.status).toBe(400);
    const body = await response.json();
    expect(body.field).toBe(field);
    expect(body.error).toMatch(new RegExp(`^${field.replace('.', '\\.')}: `));
  });

  it('refuses a body that is not JSON, and a visitor', async () => {
    expect((await api('/api/coupons', { jar: member, body: 'title=x', method: 'POST', headers: { 'content-type': 'application/json' } })).status).toBe(400);
    expect((await api('/api/coupons', { jar: visitor, json: aCoupon })).status).toBe(401);
  });
});

describe('who sees which coupon', () => {
  let ids: Record<'private' | 'members' | 'public', number>;
  beforeAll(async () => {
    ids = {
      private: (await create(member, { visibility: 'private' })).id,
      members: (await create(member, { visibility: 'members' })).id,
      public: (await create(member, { visibility: 'public' })).id,
    };
  });

  it.each([
    ['visitor', 'private', 404],
    ['visitor', 'members', 404],
    ['visitor', 'public', 200],
    ['member2', 'private', 404],
    ['member2', 'members', 200],
    ['member2', 'public', 200],
    ['member', 'private', 200],
    ['admin', 'private', 200],
  ] as const)('%s opening a %s coupon → %d', async (who, visibility, status) => {
    const jar = { visitor, member, member2, admin }[who];
    expect((await api(`/api/coupons/${ids[visibility]}`, { jar })).status).toBe(status);
  });

  it('applies the rules to lists too: every listed coupon carries its id and visibility', async () => {
    const seen = async (jar: Jar) => {
      const body = await (await api('/api/coupons?limit=100', { jar })).json();
      for (const coupon of body.coupons) {
        expect(coupon.id).toEqual(expect.any(Number));
        expect(['private', 'members', 'public']).toContain(coupon.visibility);
      }
      return body;
    };
    const forVisitor = await seen(visitor);
    expect(forVisitor.coupons.every((coupon: CouponJson) => coupon.visibility === 'public')).toBe(true);
    const forMember2 = await seen(member2);
    expect(forMember2.coupons.some((coupon: CouponJson) => coupon.id === ids.members)).toBe(true);
    expect(forMember2.coupons.some((coupon: CouponJson) => coupon.id === ids.private)).toBe(false);
    const [{ id: member2Id }] = await db.select({ id: users.id }).from(users).where(eq(users.email, demo.member2));
    const member2Private = await db
      .select({ id: coupons.id })
      .from(coupons)
      .where(and(eq(coupons.ownerId, member2Id), eq(coupons.visibility, 'private')));
    const listedForMember2 = new Set(forMember2.coupons.map((coupon: CouponJson) => coupon.id));
    expect(member2Private.length).toBeGreaterThan(0);
    const totalForMember2 = forMember2.total;
    expect(totalForMember2).toBeGreaterThan(forVisitor.total);
    expect(listedForMember2.size).toBeLessThanOrEqual(100);
  });

  it('lists my own coupons, newest first, with ?mine=1', async () => {
    // Other test files log coupons for the same member meanwhile: check the order of ours.
    const body = await (await api('/api/coupons?mine=1&limit=100', { jar: member })).json();
    const order = body.coupons.map((coupon: CouponJson) => coupon.id);
    expect(order.indexOf(ids.public)).toBeLessThan(order.indexOf(ids.members));
    expect(order.indexOf(ids.members)).toBeLessThan(order.indexOf(ids.private));
    expect(order.indexOf(ids.private)).toBeGreaterThanOrEqual(0);
    expect(body.coupons.every((coupon: CouponJson) => coupon.canEdit)).toBe(true);
    expect((await api('/api/coupons?mine=1', { jar: visitor })).status).toBe(401);
    expect((await api('/api/coupons?limit=1000', { jar: member })).status).toBe(400);
  });
});

describe('changing and deleting', () => {
  it('lets the owner change fields, keeps the rest, and checks the merged record', async () => {
    const coupon = await create(member);
    const response = await api(`/api/coupons/${coupon.id}`, { method: 'PATCH', jar: member, json: { visibility: 'members', temperatureC: 560 } });
    expect(response.status).toBe(200);
    expect(await response.json()).toMatchObject({ visibility: 'members', temperatureC: 560, holdSeconds: 1800, title: aCoupon.title });
    const bad = await api(`/api/coupons/${coupon.id}`, { method: 'PATCH', jar: member, json: { process: 'anodize' } });
    expect(bad.status).toBe(400);
    expect((await bad.json()).field).toBe('volts');
    const [row] = await db.select().from(coupons).where(eq(coupons.id, coupon.id));
    expect(row.process).toBe('oven');
  });

  it('answers 403 to another member who can see it, 404 when they cannot', async () => {
    const shared = await create(member, { visibility: 'members' });
    const hidden = await create(member, { visibility: 'private' });
    expect((await api(`/api/coupons/${shared.id}`, { method: 'PATCH', jar: member2, json: { title: 'Mine now' } })).status).toBe(403);
    expect((await api(`/api/coupons/${hidden.id}`, { method: 'PATCH', jar: member2, json: { title: 'Mine now' } })).status).toBe(404);
    expect((await api(`/api/coupons/${shared.id}`, { method: 'DELETE', jar: member2 })).status).toBe(403);
    expect((await api(`/api/coupons/${hidden.id}`, { method: 'DELETE', jar: member2 })).status).toBe(404);
    expect((await api(`/api/coupons/${shared.id}`, { method: 'DELETE', jar: visitor })).status).toBe(401);
    const [row] = await db.select().from(coupons).where(eq(coupons.id, shared.id));
    expect(row.title).toBe(aCoupon.title);
  });

  it('keeps a layer’s swatches when only its alloy changes, and moves them to the new alloy', async () => {
    const coupon = await create(member);
    const [owner] = await db.select({ id: coupons.ownerId }).from(coupons).where(eq(coupons.id, coupon.id));
    const [layer] = await db
      .select()
      .from(couponLayers)
      .where(and(eq(couponLayers.couponId, coupon.id), eq(couponLayers.position, 0)));
    const [{ id: photoId }] = await db
      .insert(photos)
      .values({
        couponId: coupon.id,
        ownerId: owner.id,
        originalKey: 'k1',
        displayKey: 'k2',
        thumbKey: 'k3',
        contentType: 'image/jpeg',
        byteSize: 1,
        width: 10,
        height: 10,
      })
      .$returningId();
    await db.insert(swatches).values({
      photoId,
      couponId: coupon.id,
      layerId: layer.id,
      alloyId: layer.alloyId,
      rank: 0,
      share: 1,
      spread: 0,
      hex: '#c8a050',
      labL: 68,
      labA: 8,
      labB: 45,
      oklabL: 0.72,
      oklabA: 0.02,
      oklabB: 0.1,
    });
    await couponsChanged(db, [coupon.id]);

    expect((await api(`/api/coupons/${coupon.id}`, { method: 'PATCH', jar: member, json: { layers: ['ti-grade-23', 'ti-grade-5'] } })).status).toBe(200);
    const [grade23] = await db.select().from(alloys).where(eq(alloys.slug, 'ti-grade-23'));
    const kept = await db.select().from(swatches).where(eq(swatches.layerId, layer.id));
    expect(kept).toHaveLength(1);
    expect(kept[0].alloyId).toBe(grade23.id);
    await deleteCoupons(db, [coupon.id]);
  });

  it('lets an admin change anyone’s coupon', async () => {
    const coupon = await create(member2);
    expect((await api(`/api/coupons/${coupon.id}`, { method: 'PATCH', jar: admin, json: { visibility: 'private' } })).status).toBe(200);
  });

  it('deletes a coupon and its photos’ files from storage', async () => {
    const coupon = await create(member);
    const [owner] = await db.select({ id: coupons.ownerId }).from(coupons).where(eq(coupons.id, coupon.id));
    const keys = ['a.jpg', 'a.webp', 'a-thumb.webp', 'a-analysis.png'].map((name) => `users/${owner.id}/test-delete/${coupon.id}/${name}`);
    for (const key of keys) await putTestObject(key);
    await db.insert(photos).values({
      couponId: coupon.id,
      ownerId: owner.id,
      originalKey: keys[0],
      displayKey: keys[1],
      thumbKey: keys[2],
      analysisKey: keys[3],
      contentType: 'image/jpeg',
      byteSize: 1,
      width: 1,
      height: 1,
    });

    expect((await api(`/api/coupons/${coupon.id}`, { method: 'DELETE', jar: member })).status).toBe(204);
    expect((await api(`/api/coupons/${coupon.id}`, { jar: member })).status).toBe(404);
    for (const key of keys) expect(await objectExists(key), key).toBe(false);
  });

  it.each(['abc', '0', '-1', '99999999'])('answers 404 for coupon id %s', async (id) => {
    expect((await api(`/api/coupons/${id}`, { jar: member })).status).toBe(404);
  });
});
