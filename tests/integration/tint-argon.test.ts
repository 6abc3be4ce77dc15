import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { alloys, libraryVersions } from '../../db/schema';
import { api, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { deleteCoupons, insertSyntheticCoupon, type SyntheticCoupon } from '../fixtures/library-coupons';
import { heatThicknessNm } from '~/lib/tint/growth';
import { findTintModel } from '~/lib/tint/models';
import { bumpLibraryVersions } from '~/lib/server/library-versions';

// Heats under argon against the real database: the member's own argon coupons (invented data: a fifth
// of the reference air film, coloured by our optics) must carry the prediction; people without them
// are told plainly that the reference data cover air only. Titanium Grade 4 has no demo coupons; the
// coupons here are private so no other test sees them.
const ALLOY = 'ti-grade-4';
const law = findTintModel(ALLOY)!.heat!.law;
const FRACTION = 0.2;
const argonHeat = (temperatureC: number, holdMinutes: number, alloy = ALLOY): SyntheticCoupon => ({
  ownerEmail: demo.member,
  alloy,
  visibility: 'private',
  atmosphere: 'argon',
  temperatureC,
  holdMinutes,
  thicknessNm: FRACTION * heatThicknessNm(law, temperatureC, holdMinutes),
});
const library = [argonHeat(550, 60), argonHeat(600, 60), argonHeat(620, 90), argonHeat(640, 120)];

const { db, pool } = testDatabase();
const inserted: number[] = [];
let member: Jar;
let member2: Jar;
const plan = { alloy: ALLOY, process: 'heat', temperatureC: 640, holdMinutes: 120, atmosphere: 'argon' };

async function predict(body: object, jar?: Jar) {
  const response = await api('/api/tint/predict', { jar, json: body });
  expect(response.status).toBe(200);
  return response.json();
}

beforeAll(async () => {
  for (const coupon of library) inserted.push(await insertSyntheticCoupon(db, coupon));
  member = await signedIn(demo.member);
  member2 = await signedIn(demo.member2);
});

afterAll(async () => {
  await deleteCoupons(db, inserted);
  await pool.end();
});

describe('the heat planner under argon', () => {
  it('a visitor is told the reference data cover air only, never given the air answer', async () => {
    const body = await predict(plan);
    expect(body.outcome).toBe('none');
    expect(body.reason).toBe('argon-too-few-coupons');
    expect(body.message).toMatch(/air only/);
    expect(body.thicknessNm).toBeUndefined();
    expect(body.warnings.map((w: { code: string }) => w.code)).toContain('inert-gas');
  });

  it('someone who cannot see the argon coupons gets no argon prediction either', async () => {
    const body = await predict(plan, member2);
    expect(body.outcome).toBe('none');
  });

  it('the member’s own argon coupons carry the prediction: thinner than air, with their count', async () => {
    const argon = await predict(plan, member);
    expect(argon.outcome).toBe('prediction');
    expect(argon.atmosphere).toBe('argon');
    expect(argon.argon.couponCount).toBeGreaterThanOrEqual(library.length);
    expect(argon.argon.factor).toBeLessThan(0.6);
    const air = await predict({ ...plan, atmosphere: 'air' }, member);
    expect(argon.thicknessNm.mid).toBeLessThan(air.thicknessNm.mid);
  });

  it('"other" atmospheres get no prediction, with the reason', async () => {
    const body = await predict({ ...plan, atmosphere: 'other' }, member);
    expect(body.outcome).toBe('none');
    expect(body.reason).toBe('other-atmosphere');
  });
});

describe('the argon fit is kept by alloy and library version', () => {
  // An alloy no other test file writes coupons of, so only this test moves its library version.
  const KEPT = 'ti-grade-1';
  const keptPlan = { ...plan, alloy: KEPT };
  const argonCount = async () => {
    const body = await predict(keptPlan, member);
    expect(body.outcome).toBe('prediction');
    return body.argon.couponCount as number;
  };
  const version = async (alloyId: number) => {
    const [row] = await db.select({ version: libraryVersions.version }).from(libraryVersions).where(eq(libraryVersions.alloyId, alloyId));
    return row?.version ?? 0;
  };

  it('a new argon coupon refits at once, a version that did not move keeps the fit, and a writer’s bump refits', async () => {
    const [{ id: alloyId }] = await db.select({ id: alloys.id }).from(alloys).where(eq(alloys.slug, KEPT));
    for (const [temperatureC, holdMinutes] of [
      [550, 60],
      [600, 60],
      [620, 90],
    ]) {
      inserted.push(await insertSyntheticCoupon(db, argonHeat(temperatureC, holdMinutes, KEPT)));
    }
    const first = await argonCount();
    expect(first).toBeGreaterThanOrEqual(3);

    // The fixture bumps the version as the app's writers do: the next prediction counts the new coupon.
    inserted.push(await insertSyntheticCoupon(db, argonHeat(640, 120, KEPT)));
    expect(await argonCount()).toBe(first + 1);

    // A coupon written with the version put back (as a write that forgot to bump would leave it):
    // the fit kept for that version answers, without the coupon.
    const before = await version(alloyId);
    inserted.push(await insertSyntheticCoupon(db, argonHeat(630, 45, KEPT)));
    await db.update(libraryVersions).set({ version: before }).where(eq(libraryVersions.alloyId, alloyId));
    expect(await argonCount()).toBe(first + 1);

    // The writers' own bump (library-versions.ts) gives a fresh fit that counts it.
    await bumpLibraryVersions(db, [alloyId]);
    expect(await argonCount()).toBe(first + 2);
  });
});
