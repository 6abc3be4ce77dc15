import { differenceCiede2000 } from 'culori';
import { describe, expect, it } from 'vitest';
import { findTintModel } from '~/lib/tint';
import { colourAt } from '~/lib/tint/ladder';
import { measuredOnLadder, plannerRequestOf, stripLength, type CouponHeat } from '~/lib/tint/measured-vs-predicted';
import type { Prediction } from '~/lib/tint/predict';

// An independent CIEDE2000: culori's, itself checked against Sharma, Wu & Dalal (2005) in
// tests/unit/colour/delta-e.test.ts.
const ciede2000 = differenceCiede2000();
const independentDeltaE = (x: { l: number; a: number; b: number }, y: { l: number; a: number; b: number }) =>
  ciede2000({ mode: 'lab65', ...x }, { mode: 'lab65', ...y });

const heat = (changes: Partial<CouponHeat>): CouponHeat => ({
  process: 'oven',
  temperatureC: 550,
  holdSeconds: 3600,
  volts: null,
  atmosphere: 'air',
  ...changes,
});

describe('the heat planner’s request for a coupon’s own heat', () => {
  it('a heat: temperature, hold in minutes and the coupon’s atmosphere', () => {
    expect(plannerRequestOf('ti-grade-2', heat({ holdSeconds: 90, atmosphere: 'argon' }))).toEqual({
      ok: true,
      request: { alloy: 'ti-grade-2', process: 'heat', temperatureC: 550, holdMinutes: 1.5, atmosphere: 'argon' },
    });
  });

  it('anodizing: the voltage', () => {
    expect(plannerRequestOf('niobium', heat({ process: 'anodize', temperatureC: null, holdSeconds: null, volts: 30 }))).toEqual({
      ok: true,
      request: { alloy: 'niobium', process: 'anodize', volts: 30 },
    });
  });

  it.each([
    ['anodizing without volts', heat({ process: 'anodize', volts: null }), 'The coupon records no anodizing voltage, so the model cannot predict its tint.'],
    ['a heat without temperature', heat({ temperatureC: null }), 'The coupon records no temperature, so the model cannot predict its tint.'],
    [
      'a heat without either',
      heat({ temperatureC: null, holdSeconds: null }),
      'The coupon records no temperature or hold time, so the model cannot predict its tint.',
    ],
  ])('says plainly why not: %s', (_label, coupon, reason) => {
    expect(plannerRequestOf('ti-grade-2', coupon)).toEqual({ ok: false, reason });
  });

  it('a heat the planner refuses is refused with its words', () => {
    const result = plannerRequestOf('ti-grade-2', heat({ process: 'anodize', volts: 400 }));
    expect(result.ok).toBe(false);
    expect(!result.ok && result.reason).toBe('The heat planner cannot predict this heat (volts must be at most 150 V).');
  });
});

describe('a measured swatch on the tint ladder beside the predicted band', () => {
  const model = findTintModel('ti-grade-2')!;
  const optics = model.optics!;
  // Round trips through the model itself: the film a colour came from is where the marker goes.
  const measured = { hex: colourAt(optics, 50).hex, lab: colourAt(optics, 50).lab };
  const prediction = (low: number, mid: number, high: number): Prediction => {
    const centre = colourAt(optics, mid);
    return {
      alloy: 'ti-grade-2',
      thicknessNm: { low, mid, high },
      colour: { hex: centre.hex, lab: centre.lab, name: 'blue' },
      band: [],
      basis: 'reference',
      couponCount: 0,
      warnings: [],
      atmosphere: 'air',
    };
  };

  it('the strip runs past the furthest film, in whole hundreds, 200 to 1000 nm', () => {
    expect(stripLength(60, 90)).toBe(200);
    expect(stripLength(60, 250)).toBe(300);
    expect(stripLength(60, 2000)).toBe(1000);
  });

  it('marks the best matching film and the band around it, with ΔE00 to the band’s centre', () => {
    const view = measuredOnLadder(model, measured, prediction(40, 70, 110));
    expect(view.best!.thicknessNm).toBeCloseTo(50, 0);
    expect(view.ladder.toNm).toBe(200);
    // Hand-worked: 50 nm on a 200 nm strip is 25 %; the band 40–110 nm is 20 % to 55 %, its centre 70 nm 35 %.
    expect(view.best!.percent).toBeCloseTo(25, 0);
    expect(view.band).toMatchObject({ lowNm: 40, highNm: 110, leftPercent: 20, widthPercent: 35, midPercent: 35 });
    expect(view.insideBand).toBe(true);
    expect(view.inBand).toBeNull();
    expect(view.deltaE00).toBeCloseTo(independentDeltaE(measured.lab, colourAt(optics, 70).lab), 6);
  });

  it('outside the band, names a film of another order inside it that also matches', () => {
    // A first-order blue also matches the second-order blue (tests/unit/tint/inverse.test.ts).
    const view = measuredOnLadder(model, measured, prediction(140, 160, 220));
    expect(view.insideBand).toBe(false);
    expect(view.inBand!.thicknessNm).toBeGreaterThanOrEqual(140);
    expect(view.inBand!.thicknessNm).toBeLessThanOrEqual(220);
    expect(view.deltaE00).toBeCloseTo(independentDeltaE(measured.lab, colourAt(optics, 160).lab), 6);
  });

  it('without a prediction only the swatch is placed', () => {
    const view = measuredOnLadder(model, measured, null);
    expect(view.best!.thicknessNm).toBeCloseTo(50, 0);
    expect(view).toMatchObject({ band: null, deltaE00: null, insideBand: null });
  });
});
