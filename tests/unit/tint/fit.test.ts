import { describe, expect, it } from 'vitest';
import { fitGrowth, heatFitPrediction, type CouponObservation } from '~/lib/tint/fit';
import { heatThicknessNm, type HeatGrowthLaw } from '~/lib/tint/growth';
import { colourAt } from '~/lib/tint/ladder';
import { findTintModel } from '~/lib/tint/models';
import { INTERVAL_Z, predictTint } from '~/lib/tint/predict';
import { gaussian, seededRandom } from './synthetic';

// Synthetic coupons from a known law with multiplicative noise: the check is that the fit recovers
// the parameters it was given (no published source needed; the priors it starts from are the
// published ones in src/lib/tint/models.ts).

const ti64 = findTintModel('ti-grade-5')!;

/** A titanium law away from the prior: 30 % thicker films and Q = 105 kJ/mol instead of ≈ 87. */
const titaniumTruth: HeatGrowthLaw = {
  exponent: 2,
  activationEnergyJPerMol: 105_000,
  reference: { temperatureC: 500, holdMinutes: 60, thicknessNm: 30 },
};

function heatCoupons(truth: HeatGrowthLaw, count: number, seed: number, temperatures: [number, number], holds: [number, number], noise = 0.1) {
  const random = seededRandom(seed);
  return Array.from({ length: count }, () => {
    const temperatureC = temperatures[0] + random() * (temperatures[1] - temperatures[0]);
    const holdMinutes = holds[0] * (holds[1] / holds[0]) ** random();
    const thicknessNm = heatThicknessNm(truth, temperatureC, holdMinutes) * Math.exp(noise * gaussian(random));
    return { process: 'heat' as const, temperatureC, holdMinutes, thicknessNm };
  });
}

describe('fitting the heat law to coupons', () => {
  const coupons: CouponObservation[] = heatCoupons(titaniumTruth, 80, 7, [450, 620], [10, 180]);

  it('recovers d_ref and Q of a parabolic law from 80 noisy coupons', () => {
    const fit = fitGrowth('ti-grade-5', coupons).heat!;
    expect(fit.couponCount).toBe(80);
    expect(fit.law.exponent).toBe(2);
    expect(fit.law.reference.thicknessNm).toBeGreaterThan(30 * 0.95);
    expect(fit.law.reference.thicknessNm).toBeLessThan(30 * 1.05);
    expect(fit.law.activationEnergyJPerMol / 1000).toBeGreaterThan(105 * 0.9);
    expect(fit.law.activationEnergyJPerMol / 1000).toBeLessThan(105 * 1.1);
    expect(fit.residualSd).toBeGreaterThan(0.07);
    expect(fit.residualSd).toBeLessThan(0.13);
    expect(fit.outlierCount).toBeLessThanOrEqual(1);
  });

  it('is robust to outliers: ten coupons three times too thick barely move it', () => {
    const spoiled = coupons.map((coupon, i) => (i % 8 === 0 && coupon.process === 'heat' ? { ...coupon, thicknessNm: coupon.thicknessNm! * 3 } : coupon));
    const fit = fitGrowth('ti-grade-5', spoiled).heat!;
    expect(fit.outlierCount).toBe(10);
    expect(fit.law.reference.thicknessNm).toBeGreaterThan(30 * 0.93);
    expect(fit.law.reference.thicknessNm).toBeLessThan(30 * 1.07);
  });

  it('reads thickness from swatch colours, choosing the order the prior expects', () => {
    const random = seededRandom(11);
    const fromColours: CouponObservation[] = heatCoupons(titaniumTruth, 40, 3, [470, 600], [20, 120], 0.05).map((coupon) => {
      const { lab } = colourAt('tio2-on-titanium', coupon.thicknessNm);
      return {
        process: 'heat',
        temperatureC: coupon.temperatureC,
        holdMinutes: coupon.holdMinutes,
        lab: { l: lab.l + gaussian(random), a: lab.a + gaussian(random), b: lab.b + gaussian(random) },
      };
    });
    const fit = fitGrowth('ti-grade-5', fromColours).heat!;
    expect(fit.couponCount).toBe(40);
    expect(fit.law.reference.thicknessNm).toBeGreaterThan(30 * 0.9);
    expect(fit.law.reference.thicknessNm).toBeLessThan(30 * 1.1);
  });

  it('frees the exponent for steel and recovers n from holds of 2–120 minutes', () => {
    const truth: HeatGrowthLaw = { exponent: 4, activationEnergyJPerMol: 150_000, reference: { temperatureC: 260, holdMinutes: 5, thicknessNm: 38 } };
    const fit = fitGrowth('steel-1084', heatCoupons(truth, 120, 5, [200, 330], [2, 120], 0.08)).heat!;
    expect(1 / fit.law.exponent).toBeGreaterThan(0.25 - 0.03);
    expect(1 / fit.law.exponent).toBeLessThan(0.25 + 0.03);
    expect(fit.law.reference.thicknessNm).toBeGreaterThan(38 * 0.95);
    expect(fit.law.reference.thicknessNm).toBeLessThan(38 * 1.05);
  });

  it('its 80 % prediction interval holds about 80 % of new coupons', () => {
    const fit = fitGrowth('ti-grade-5', coupons).heat!;
    const fresh = heatCoupons(titaniumTruth, 400, 99, [450, 620], [10, 180]);
    const inside = fresh.filter((coupon) => {
      const { lnMean, lnSd } = heatFitPrediction(fit, coupon.temperatureC, coupon.holdMinutes);
      return Math.abs(Math.log(coupon.thicknessNm) - lnMean) <= INTERVAL_Z * lnSd;
    }).length;
    expect(inside / fresh.length).toBeGreaterThan(0.72);
    expect(inside / fresh.length).toBeLessThan(0.88);
  });

  it('with no coupons there is no fit, and a prediction rests on the reference prior', () => {
    const fit = fitGrowth('ti-grade-5', []);
    expect(fit.heat).toBeNull();
    const prediction = predictTint(ti64, { process: 'heat', temperatureC: 550, holdMinutes: 60 }, fit);
    expect(prediction.basis).toBe('reference');
    expect(prediction.couponCount).toBe(0);
  });

  it('a fit with enough coupons becomes the basis of the prediction', () => {
    const fit = fitGrowth('ti-grade-5', coupons);
    const prediction = predictTint(ti64, { process: 'heat', temperatureC: 500, holdMinutes: 60 }, fit);
    expect(prediction.basis).toBe('library');
    expect(prediction.couponCount).toBe(80);
    expect(prediction.thicknessNm.mid).toBeGreaterThan(28);
    expect(prediction.thicknessNm.mid).toBeLessThan(32);
    expect(prediction.thicknessNm.low).toBeLessThan(prediction.thicknessNm.mid);
    expect(prediction.thicknessNm.high).toBeGreaterThan(prediction.thicknessNm.mid);
  });
});

describe('fitting the growth per volt', () => {
  it('recovers a library that anodizes 20 % thicker than the published line', () => {
    // The published line, worked out here: least squares through Int. J. Biomaterials 2015, Table 1
    // (20 V 48 nm, 40 V 92 nm, 60 V 130 nm) is 8 nm + 2.05 nm/V. Synthetic coupons at 1.2 × that, 5 % noise.
    const random = seededRandom(21);
    const coupons: CouponObservation[] = Array.from({ length: 30 }, () => {
      const volts = 10 + random() * 80;
      return { process: 'anodize', volts, thicknessNm: 1.2 * (8 + 2.05 * volts) * Math.exp(0.05 * gaussian(random)) };
    });
    const fit = fitGrowth('ti-grade-2', coupons).anodize!;
    expect(fit.scale).toBeGreaterThan(1.17);
    expect(fit.scale).toBeLessThan(1.23);
    expect(fit.nmPerVolt).toBeCloseTo(1.2 * 2.05, 1);
  });
});
