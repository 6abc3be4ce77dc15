import { describe, expect, it } from 'vitest';
import { atmosphereBasis, fitArgonFactor, MIN_ARGON_COUPONS } from '~/lib/tint/atmosphere';
import { colourAt } from '~/lib/tint/ladder';
import { findTintModel } from '~/lib/tint/models';
import { MIN_LIBRARY_COUPONS, NoPredictionError, predictTint } from '~/lib/tint/predict';
import type { CouponObservation } from '~/lib/tint/fit';

const ti64 = findTintModel('ti-grade-5')!;
const heat = (temperatureC: number, holdMinutes: number, atmosphere?: 'air' | 'argon' | 'other') =>
  ({ process: 'heat', temperatureC, holdMinutes, atmosphere }) as const;

/** The error a heat throws, for looking at its reason and what it carries. */
function refusal(run: () => unknown): NoPredictionError {
  try {
    run();
  } catch (error) {
    if (error instanceof NoPredictionError) return error;
    throw error;
  }
  throw new Error('expected no prediction');
}

// Source: Int. J. Biomaterials 2015, 395657, Table 1 — Ti-6Al-4V 1 h in air: 23 nm at 500 °C, ≈ 50 nm at 600 °C.
const AIR_NM = { 500: 23, 600: 50 } as const;

/** Argon coupons at a fixed fraction of the published air films (synthetic: the fraction is what the fit must find). */
const argonCoupons = (fraction: number, count: number): CouponObservation[] =>
  Array.from({ length: count }, (_, i) => {
    const temperatureC = i % 2 === 0 ? 500 : 600;
    return { process: 'heat', temperatureC, holdMinutes: 60, thicknessNm: fraction * AIR_NM[temperatureC] * (1 + 0.05 * ((i % 3) - 1)) };
  });

describe('atmosphere in the heat prediction', () => {
  it('air is the basis of the published data: a heat without an atmosphere is a heat in air', () => {
    const unstated = predictTint(ti64, heat(600, 60));
    const air = predictTint(ti64, heat(600, 60, 'air'));
    expect(air.thicknessNm).toEqual(unstated.thicknessNm);
    expect(air.atmosphere).toBe('air');
    expect(unstated.atmosphere).toBe('air');
  });

  it('argon without the library’s argon coupons: no prediction, and it says why — never the air answer', () => {
    // The case: 1000 °C for 10 min gave the same film in air and argon.
    const error = refusal(() => predictTint(ti64, heat(1000, 10, 'argon')));
    expect(error.reason).toBe('argon-too-few-coupons');
    // Common practice: a good purge leaves the surface nearly bright; the reference data are heats in air
    // (every source in REFERENCES.md is a heat in air).
    expect(error.message).toMatch(/air only/);
    expect(error.message).toMatch(/little or no tint/);
    // The cautions still apply: argon displaces oxygen (BRIEF.md safety, common practice); no alpha case without oxygen.
    const codes = error.warnings.map((w) => w.code);
    expect(codes).toContain('inert-gas');
    expect(codes).toContain('fe-ti-eutectic');
    expect(codes).not.toContain('alpha-case');
  });

  it('with too few argon coupons, shows what the library has', () => {
    const few = fitArgonFactor(ti64, argonCoupons(0.2, MIN_ARGON_COUPONS - 1), null, MIN_LIBRARY_COUPONS);
    const error = refusal(() => predictTint(ti64, heat(600, 60, 'argon'), null, few));
    expect(error.argonCoupons).toHaveLength(MIN_ARGON_COUPONS - 1);
    expect(error.message).toMatch(/2 argon coupons/);
  });

  it('with enough argon coupons, the prediction rests on their thickness factor, count and spread', () => {
    const fit = fitArgonFactor(ti64, argonCoupons(0.2, 6), null, MIN_LIBRARY_COUPONS);
    // The synthetic coupons are a fifth of the published air films, ±5 %.
    expect(Math.exp(fit.lnFactor)).toBeGreaterThan(0.19);
    expect(Math.exp(fit.lnFactor)).toBeLessThan(0.21);
    expect(fit.couponCount).toBe(6);
    const prediction = predictTint(ti64, heat(600, 60, 'argon'), null, fit);
    expect(prediction.basis).toBe('library');
    expect(prediction.atmosphere).toBe('argon');
    expect(prediction.argon?.couponCount).toBe(6);
    // A fifth of the published 50 nm, ±25 % for the band's spread.
    expect(prediction.thicknessNm.mid).toBeGreaterThan(0.2 * AIR_NM[600] * 0.75);
    expect(prediction.thicknessNm.mid).toBeLessThan(0.2 * AIR_NM[600] * 1.25);
    // The argon band is wider than the air band in ln terms: it adds the coupons' spread.
    const air = predictTint(ti64, heat(600, 60));
    expect(Math.log(prediction.thicknessNm.high / prediction.thicknessNm.low)).toBeGreaterThan(Math.log(air.thicknessNm.high / air.thicknessNm.low));
  });

  it('bright argon coupons read from their colour give a silver prediction', () => {
    // Source: welding practice for titanium (REFERENCES.md, EN ISO 9606-5 / AWS G2.4 summary): a well-shielded
    // surface is silver. The coupons' colour is the bare metal's (zero film) from the optics.
    const bright = colourAt('tio2-on-titanium', 0).lab;
    const coupons: CouponObservation[] = [500, 550, 600, 650].map((temperatureC) => ({ process: 'heat', temperatureC, holdMinutes: 30, lab: bright }));
    const fit = fitArgonFactor(ti64, coupons, null, MIN_LIBRARY_COUPONS);
    expect(fit.couponCount).toBe(4);
    expect(predictTint(ti64, heat(600, 30, 'argon'), null, fit).colour.name).toBe('silver');
  });

  it('other atmospheres: no prediction, with the reason', () => {
    const error = refusal(() => predictTint(ti64, heat(600, 60, 'other')));
    expect(error.reason).toBe('other-atmosphere');
    expect(error.message).toMatch(/No prediction for this atmosphere/);
    expect(atmosphereBasis('other').kind).toBe('none');
  });

  it('anodizing has no atmosphere', () => {
    expect(predictTint(ti64, { process: 'anodize', volts: 20 }).atmosphere).toBeNull();
  });
});
