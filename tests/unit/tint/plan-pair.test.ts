import { describe, expect, it } from 'vitest';
import { deltaE2000 } from '~/lib/colour';
import { fitArgonFactor } from '~/lib/tint/atmosphere';
import { fitGrowth } from '~/lib/tint/fit';
import { heatThicknessNm } from '~/lib/tint/growth';
import { referenceColourAt } from '~/lib/tint/ladder';
import { findTintModel } from '~/lib/tint/models';
import { calibratedIntersection, PairRangeError, planPair } from '~/lib/tint/plan-pair';
import { MIN_LIBRARY_COUPONS, ModelUnavailableError, NoPredictionError, predictTint } from '~/lib/tint/predict';
import { fahrenheitToCelsius } from '~/lib/units';

// The planner is a search over the model; its guard rails are checked against the temperatures the
// published sources cover, worked out here from the sources themselves.
const titanium = findTintModel('ti-grade-5')!;
const grade2 = findTintModel('ti-grade-2')!;
const steel = findTintModel('steel-1084')!;

// Source: Int. J. Biomaterials 2015, 395657, Table 1 — the titanium heat-tint anchors are 1 h at 500 and 600 °C.
const TITANIUM_ANCHORS_C = [500, 600];
// Source: Colvin & Juthe (1922) Table 26 and Great Soviet Encyclopedia, "Temper color": temper colours from
// yellow at 430 °F to light grey at 350 °C.
const STEEL_TABLES_C = [fahrenheitToCelsius(430), 350];

describe('pair planner guard rails', () => {
  it('titanium and carbon steel share no calibrated temperature: the default search refuses plainly', () => {
    // The sources themselves do not overlap: the steel tables end below titanium's first anchor.
    expect(STEEL_TABLES_C[1]).toBeLessThan(TITANIUM_ANCHORS_C[0]);
    expect(calibratedIntersection([titanium, steel])).toBeNull();
    expect(() => planPair([titanium, steel])).toThrow(NoPredictionError);
    expect(() => planPair([titanium, steel])).toThrow(/wider search/);
  });

  it('by default searches only inside both layers’ calibrated ranges, and says nothing is extrapolated', () => {
    const suggestions = planPair([titanium, grade2], {
      target: [referenceColourAt('tio2-on-titanium', 40).lab, referenceColourAt('tio2-on-titanium', 40).lab],
    });
    expect(suggestions.length).toBeGreaterThan(0);
    for (const suggestion of suggestions) {
      // Source: the anchors (500, 600 °C) lie inside every searched heat's range, which stays within ±50 °C of them.
      expect(suggestion.temperatureC).toBeGreaterThanOrEqual(TITANIUM_ANCHORS_C[0] - 50);
      expect(suggestion.temperatureC).toBeLessThanOrEqual(TITANIUM_ANCHORS_C[1] + 50);
      expect(suggestion.outsideCalibrated).toBe(false);
      expect(suggestion.warnings.map((w) => w.code)).not.toContain('outside-reference-range');
    }
  });

  it('library coupons widen a layer’s calibrated range to the heats they cover', () => {
    // Synthetic coupons of both grades from 400 to 700 °C (invented data): the search may go where they are.
    const coupons = Array.from({ length: 7 }, (_, i) => ({
      process: 'heat' as const,
      temperatureC: 400 + i * 50,
      holdMinutes: 60,
      thicknessNm: heatThicknessNm(titanium.heat!.law, 400 + i * 50, 60),
    }));
    const fits = [fitGrowth(titanium, coupons), fitGrowth(grade2, coupons)] as const;
    expect(calibratedIntersection([titanium, grade2], fits)).toEqual({ min: 400, max: 700 });
    expect(() => planPair([titanium, grade2], { fits, temperatureC: { min: 420, max: 680 } })).not.toThrow();
  });

  it('a requested range outside the calibrated one is refused unless a wider search is asked for', () => {
    expect(() => planPair([titanium, grade2], { temperatureC: { min: 300, max: 500 } })).toThrow(PairRangeError);
    expect(planPair([titanium, grade2], { temperatureC: { min: 300, max: 500 }, widen: true }).length).toBeGreaterThan(0);
  });

  it('a wider search marks every heat outside a layer’s data and names the layer', () => {
    const suggestions = planPair([titanium, steel], { widen: true, temperatureC: { min: 200, max: 340 } });
    expect(suggestions.length).toBeGreaterThan(0);
    for (const suggestion of suggestions) {
      // Every heat here is below titanium's anchors (Int. J. Biomaterials 2015): titanium is extrapolated.
      expect(suggestion.outsideCalibrated).toBe(true);
      const outside = suggestion.warnings.filter((w) => w.code === 'outside-reference-range');
      expect(outside.some((w) => w.message.includes(titanium.alloy.name))).toBe(true);
    }
  });

  it('each suggestion carries every warning a single prediction of either layer would', () => {
    const suggestions = planPair([titanium, grade2], { widen: true, temperatureC: { min: 900, max: 1000 }, holdMinutes: { min: 1, max: 5 } });
    expect(suggestions.length).toBeGreaterThan(0);
    for (const suggestion of suggestions) {
      const codes = new Set(suggestion.warnings.map((w) => w.code));
      for (const model of [titanium, grade2]) {
        for (const warning of predictTint(model, { process: 'heat', temperatureC: suggestion.temperatureC, holdMinutes: suggestion.holdMinutes }).warnings) {
          expect(codes).toContain(warning.code);
        }
      }
      // Common practice / from memory (warnings.ts): alpha case in air from 600 °C, the Fe–Ti eutectic of a steel
      // can near forge-welding heats, the grade 2 transus (≈ 910 °C) and the hot-work caution.
      for (const code of ['alpha-case', 'fe-ti-eutectic', 'forge-welding-range', 'beta-transus', 'hot-work']) expect(codes).toContain(code);
    }
  });

  it('under argon the pair needs both layers’ argon coupons; other atmospheres get no suggestions', () => {
    expect(() => planPair([titanium, grade2], { atmosphere: 'argon' })).toThrow(/air only/);
    expect(() => planPair([titanium, grade2], { atmosphere: 'other' })).toThrow(NoPredictionError);
    // Three argon coupons per layer at a fifth of the air film (synthetic): the search runs on the argon basis.
    const coupons = [500, 550, 600].map((temperatureC) => ({
      process: 'heat' as const,
      temperatureC,
      holdMinutes: 60,
      thicknessNm: 0.2 * heatThicknessNm(titanium.heat!.law, temperatureC, 60),
    }));
    const argon = [fitArgonFactor(titanium, coupons, null, MIN_LIBRARY_COUPONS), fitArgonFactor(grade2, coupons, null, MIN_LIBRARY_COUPONS)] as const;
    const [best] = planPair([titanium, grade2], { atmosphere: 'argon', argon });
    expect(best.layers[0].thicknessNm).toBeLessThan(0.25 * heatThicknessNm(titanium.heat!.law, best.temperatureC, best.holdMinutes));
    expect(best.warnings.map((w) => w.code)).toContain('inert-gas');
  });
});

describe('pair planner search', () => {
  it('finds the heat that made a wanted pair of colours', () => {
    const temperatureC = 300;
    const holdMinutes = 30;
    const target = [
      referenceColourAt('tio2-on-titanium', heatThicknessNm(titanium.heat!.law, temperatureC, holdMinutes)).lab,
      referenceColourAt('iron-oxide-on-iron', heatThicknessNm(steel.heat!.law, temperatureC, holdMinutes)).lab,
    ] as const;
    const [best] = planPair([titanium, steel], { target, widen: true, temperatureC: { min: 250, max: 340 }, holdMinutes: { min: 5, max: 120 } });
    // Temperature and time trade against each other, so the check is on the colours, not the heat.
    expect(best.score).toBeLessThan(2);
    expect(best.layers.map((layer) => layer.alloy)).toEqual(['ti-grade-5', 'steel-1084']);
  });

  it('without a target, ranks by contrast between the layers, best first, all different looks', () => {
    const suggestions = planPair([titanium, steel], { widen: true, temperatureC: { min: 200, max: 340 } });
    expect(suggestions.length).toBe(5);
    for (let i = 1; i < suggestions.length; i += 1) expect(suggestions[i].score).toBeLessThanOrEqual(suggestions[i - 1].score);
    const best = suggestions[0];
    // The score is the ΔE00 between the two layer colours it reports (CIEDE2000, checked against Sharma et al. 2005 elsewhere).
    const labs = best.layers.map((layer, i) => referenceColourAt(i === 0 ? 'tio2-on-titanium' : 'iron-oxide-on-iron', layer.thicknessNm).lab);
    expect(deltaE2000(labs[0], labs[1])).toBeCloseTo(best.score, 1);
  });

  it('never suggests a heat that takes steel past its temper range', () => {
    const suggestions = planPair([titanium, steel], { widen: true, temperatureC: { min: 300, max: 700 } });
    // Source: Great Soviet Encyclopedia, "Temper color": light grey at 330–350 °C is the last temper colour.
    for (const suggestion of suggestions) expect(suggestion.layers[1].name).not.toMatch(/order (gold|rose|violet|blue|teal|green)/);
  });

  it('two grades with the same reference law give no contrast until the library separates them', () => {
    expect(planPair([titanium, grade2])[0].score).toBe(0);
    const coupons = Array.from({ length: 12 }, (_, i) => ({
      process: 'heat' as const,
      temperatureC: 450 + i * 15,
      holdMinutes: 60,
      thicknessNm: 1.4 * heatThicknessNm(titanium.heat!.law, 450 + i * 15, 60),
    }));
    const suggestions = planPair([titanium, grade2], { fits: [null, fitGrowth(grade2, coupons)] });
    expect(suggestions[0].score).toBeGreaterThan(10);
  });

  it('an alloy with no model answers "library data only"', () => {
    expect(() => planPair([titanium, findTintModel('steel-304')!])).toThrow(ModelUnavailableError);
  });
});
