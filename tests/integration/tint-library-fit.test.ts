import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { api, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { deleteCoupons, insertSyntheticCoupon, type SyntheticCoupon } from '../fixtures/library-coupons';
import { heatThicknessNm, type HeatGrowthLaw } from '~/lib/tint/growth';
import { findTintModel } from '~/lib/tint/models';
import { eq } from 'drizzle-orm';
import { alloys, photos, swatches, users } from '../../db/schema';
import { deleteAccount } from '~/lib/server/account-data';
import { setVisibility } from '~/lib/server/coupons';
import { deletePhoto } from '~/lib/server/photos/deletion';
import { libraryFit, libraryVersion } from '~/lib/server/tint-fit';
import type { Viewer } from '~/lib/server/visibility';

// The heat planner's library fit against the real database: coupons with swatches are inserted
// directly, their colours made by our own tint model at thicknesses from a known growth law
// (invented data), and the routes must fit them, count them by who may see them, and refit when
// the library changes. Titanium Grade 4 is used because the demo has no coupons of it (so no
// swatches either) and no other test gives it any.
const ALLOY = 'ti-grade-4';
const prior = findTintModel(ALLOY)!.heat!;
/** The known law: the prior's parabolic law, but 30 % thicker films (so the fit must move). */
const knownLaw: HeatGrowthLaw = { ...prior.law, reference: { ...prior.law.reference, thicknessNm: prior.law.reference.thicknessNm * 1.3 } };

const heat = (temperatureC: number, holdMinutes: number) => ({ temperatureC, holdMinutes, thicknessNm: heatThicknessNm(knownLaw, temperatureC, holdMinutes) });

const library: SyntheticCoupon[] = [
  { ownerEmail: demo.member2, alloy: ALLOY, visibility: 'public', ...heat(480, 60), photos: 2 },
  { ownerEmail: demo.member2, alloy: ALLOY, visibility: 'public', ...heat(520, 30) },
  { ownerEmail: demo.instructor, alloy: ALLOY, visibility: 'public', ...heat(580, 20), withoutMean: true },
  { ownerEmail: demo.instructor, alloy: ALLOY, visibility: 'members', ...heat(600, 45) },
  { ownerEmail: demo.member, alloy: ALLOY, visibility: 'private', ...heat(540, 90) },
  // Not for the member: another member's private coupon.
  { ownerEmail: demo.member2, alloy: ALLOY, visibility: 'private', ...heat(560, 40) },
  // Never in a heat fit: a heat under argon, and an anodized coupon (its own fit).
  { ownerEmail: demo.member2, alloy: ALLOY, visibility: 'public', ...heat(550, 60), atmosphere: 'argon' },
  { ownerEmail: demo.member2, alloy: ALLOY, visibility: 'public', process: 'anodize', volts: 20, thicknessNm: 48 },
];

const { db, pool } = testDatabase();
const inserted: number[] = [];
const jars: Partial<Record<keyof typeof demo, Jar>> = {};
const plan = { alloy: ALLOY, process: 'heat', temperatureC: 560, holdMinutes: 60 };

async function predict(jar?: Jar) {
  const response = await api('/api/tint/predict', { jar, json: plan });
  expect(response.status).toBe(200);
  return response.json();
}

beforeAll(async () => {
  for (const coupon of library) inserted.push(await insertSyntheticCoupon(db, coupon));
  for (const who of ['member', 'member2', 'instructor', 'admin'] as const) jars[who] = await signedIn(demo[who]);
});

afterAll(async () => {
  await deleteCoupons(db, inserted);
  await pool.end();
});

describe('the heat planner with the library fit', () => {
  it('a visitor gets the reference data', async () => {
    const body = await predict();
    expect(body.basis).toBe('reference');
    expect(body.couponCount).toBe(0);
  });

  it('a member gets the fit to the coupons they may see: public, members-only and their own', async () => {
    const body = await predict(jars.member);
    expect(body.basis).toBe('library');
    // 3 public + 1 members-only + their own private; not member2's private, the argon heat or the anodized coupon.
    expect(body.couponCount).toBe(5);
  });

  it('counts each person’s own private coupons for them alone', async () => {
    // member2: 2 public of their own + instructor's public and members-only + their own private.
    await expect(predict(jars.member2)).resolves.toMatchObject({ basis: 'library', couponCount: 5 });
    // The instructor has no private coupons here: public and members-only only.
    await expect(predict(jars.instructor)).resolves.toMatchObject({ basis: 'library', couponCount: 4 });
    // Admins may see every coupon (maySee in src/lib/server/visibility.ts), so their library holds both private ones.
    await expect(predict(jars.admin)).resolves.toMatchObject({ basis: 'library', couponCount: 6 });
  });

  it('moves the band towards the law the coupons were made from', async () => {
    const library = await predict(jars.member);
    const reference = await predict();
    const truth = heatThicknessNm(knownLaw, plan.temperatureC, plan.holdMinutes);
    // The coupons were made from the known law with exact model colours, so the fit should land
    // within 10 % of it (common practice for a recovery check), much closer than the prior.
    expect(Math.abs(Math.log(library.thicknessNm.mid / truth))).toBeLessThan(0.1);
    expect(Math.abs(Math.log(library.thicknessNm.mid / truth))).toBeLessThan(Math.abs(Math.log(reference.thicknessNm.mid / truth)));
    expect(library.thicknessNm.high - library.thicknessNm.low).toBeLessThan(reference.thicknessNm.high - reference.thicknessNm.low);
  });

  it('refits when a coupon is added, and again when it is deleted', async () => {
    const added = await insertSyntheticCoupon(db, { ownerEmail: demo.instructor, alloy: ALLOY, visibility: 'members', ...heat(500, 120) });
    inserted.push(added);
    await expect(predict(jars.member)).resolves.toMatchObject({ basis: 'library', couponCount: 6 });
    await deleteCoupons(db, [added]);
    await expect(predict(jars.member)).resolves.toMatchObject({ basis: 'library', couponCount: 5 });
  });

  it('refits when a coupon stops being shared', async () => {
    const [members] = inserted.slice(3, 4);
    await setVisibility(members, 'private');
    try {
      await expect(predict(jars.member)).resolves.toMatchObject({ couponCount: 4 });
      await expect(predict(jars.instructor)).resolves.toMatchObject({ couponCount: 4 });
    } finally {
      await setVisibility(members, 'members');
    }
    await expect(predict(jars.member)).resolves.toMatchObject({ couponCount: 5 });
  });
});

describe('the library version every writer bumps', () => {
  const idOf = async (email: string) => (await db.select({ id: users.id }).from(users).where(eq(users.email, email)))[0].id;
  let viewer: Viewer;
  const version = async () => (await libraryVersion(ALLOY, viewer))!.version;

  /** The version goes up by the write, and this process's next fit is a new one (a refit). */
  async function expectRefit(write: () => Promise<unknown>) {
    const before = await version();
    const fit = await libraryFit(ALLOY, viewer);
    await write();
    expect(await version()).toBeGreaterThan(before);
    expect(await libraryFit(ALLOY, viewer)).not.toBe(fit);
  }

  beforeAll(async () => {
    viewer = { id: await idOf(demo.member), role: 'member' };
  });

  it('a prediction with no change reads the version and reuses the fit', async () => {
    const fit = await libraryFit(ALLOY, viewer);
    expect(fit).not.toBeNull();
    const before = await version();
    expect(await libraryFit(ALLOY, viewer)).toBe(fit);
    expect(await version()).toBe(before);
  });

  it('a coupon edit (its heat record, through the API) bumps it', async () => {
    const [own] = inserted.slice(0, 1);
    await expectRefit(async () => {
      const response = await api(`/api/coupons/${own}`, { method: 'PATCH', jar: jars.member2, json: { holdSeconds: 3660, temperatureMethod: 'thermocouple' } });
      expect(response.status).toBe(200);
    });
  });

  it('a change of who may see a coupon bumps it', async () => {
    const [members] = inserted.slice(3, 4);
    await expectRefit(() => setVisibility(members, 'public'));
    await expectRefit(() => setVisibility(members, 'members'));
  });

  it('a photo’s deletion bumps it', async () => {
    const [twoPhotos] = inserted.slice(0, 1);
    const [photo] = await db.select().from(photos).where(eq(photos.couponId, twoPhotos)).limit(1);
    await expectRefit(() => deletePhoto(photo));
  });

  it('a coupon’s deletion (through the API) bumps it', async () => {
    const added = await insertSyntheticCoupon(db, { ownerEmail: demo.instructor, alloy: ALLOY, visibility: 'members', ...heat(510, 50) });
    await expectRefit(async () => expect((await api(`/api/coupons/${added}`, { method: 'DELETE', jar: jars.instructor })).status).toBe(204));
  });

  it('an account’s deletion bumps it', async () => {
    const email = `leaving-${Date.now()}@example.test`;
    await db.insert(users).values({ name: 'Leaving member', email });
    await insertSyntheticCoupon(db, { ownerEmail: email, alloy: ALLOY, visibility: 'public', ...heat(530, 30) });
    const id = await idOf(email);
    await expectRefit(() => deleteAccount(id));
  });
});

describe('the laminate pair planner with the library fit', () => {
  // The other layer: a titanium grade with no measured coupon anywhere in the library (the demo
  // measures several grades, and which ones may change), so only reference data can cover it.
  let other = '';
  let request = {};
  beforeAll(async () => {
    const measured = await db.selectDistinct({ slug: alloys.slug }).from(swatches).innerJoin(alloys, eq(alloys.id, swatches.alloyId));
    const taken = new Set(measured.map((row) => row.slug));
    other = ['ti-grade-23', 'ti-grade-9', 'ti-grade-1', 'ti-grade-2', 'ti-grade-5'].find((slug) => slug !== ALLOY && !taken.has(slug)) ?? '';
    expect(other, 'a titanium grade the library has not measured').not.toBe('');
    request = { alloys: [ALLOY, other], holdMinutes: { min: 10, max: 60 } };
  });

  it('a visitor plans both layers on reference data', async () => {
    const response = await api('/api/tint/plan-pair', { json: request });
    expect(response.status).toBe(200);
    const body = await response.json();
    expect(body.bases).toEqual([
      { alloy: ALLOY, basis: 'reference', couponCount: 0 },
      { alloy: other, basis: 'reference', couponCount: 0 },
    ]);
    expect(body.suggestions.length).toBeGreaterThan(0);
  });

  it('a member plans the layer their library covers on its fit', async () => {
    const response = await api('/api/tint/plan-pair', { jar: jars.member, json: request });
    expect(response.status).toBe(200);
    const body = await response.json();
    expect(body.bases).toEqual([
      { alloy: ALLOY, basis: 'library', couponCount: 5 },
      { alloy: other, basis: 'reference', couponCount: 0 },
    ]);
  });

  it('still refuses bad input from a signed-in member, naming the field', async () => {
    const response = await api('/api/tint/plan-pair', { jar: jars.member, json: { alloys: [ALLOY, 'steel-304'] } });
    expect(response.status).toBe(422);
    await expect(response.json()).resolves.toMatchObject({ field: 'alloys.1' });
  });
});
