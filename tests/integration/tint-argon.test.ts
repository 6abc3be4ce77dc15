import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { api, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { deleteCoupons, insertSyntheticCoupon, type SyntheticCoupon } from '../fixtures/library-coupons';
import { heatThicknessNm } from '~/lib/tint/growth';
import { findTintModel } from '~/lib/tint/models';

// Heats under argon against the real database: the member's own argon coupons (invented data: a fifth
// of the reference air film, coloured by our optics) must carry the prediction; people without them
// are told plainly that the reference data cover air only. Titanium Grade 4 has no demo coupons; the
// coupons here are private so no other test sees them.
const ALLOY = 'ti-grade-4';
const law = findTintModel(ALLOY)!.heat!.law;
const FRACTION = 0.2;
const argonHeat = (temperatureC: number, holdMinutes: number): SyntheticCoupon => ({
  ownerEmail: demo.member,
  alloy: ALLOY,
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
