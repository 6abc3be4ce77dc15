import { describe, expect, it } from 'vitest';
import { deltaE2000 } from '~/lib/colour';
import { heatThicknessNm } from '~/lib/tint/growth';
import { referenceColourAt } from '~/lib/tint/ladder';
import { findTintModel } from '~/lib/tint/models';
import { planPair } from '~/lib/tint/plan-pair';
import { fitGrowth } from '~/lib/tint/fit';
import { ModelUnavailableError } from '~/lib/tint/predict';

// The planner is a search over the model: its checks are against the model itself (no published source).
const titanium = findTintModel('ti-grade-5')!;
const steel = findTintModel('steel-1084')!;

describe('pair planner', () => {
  it('finds the heat that made a wanted pair of colours', () => {
    const temperatureC = 300;
    const holdMinutes = 30;
    const target = [
      referenceColourAt('tio2-on-titanium', heatThicknessNm(titanium.heat!.law, temperatureC, holdMinutes)).lab,
      referenceColourAt('iron-oxide-on-iron', heatThicknessNm(steel.heat!.law, temperatureC, holdMinutes)).lab,
    ] as const;
    const [best] = planPair([titanium, steel], { target, temperatureC: { min: 250, max: 350 }, holdMinutes: { min: 5, max: 120 } });
    // Temperature and time trade against each other, so the check is on the colours, not the heat.
    expect(best.score).toBeLessThan(2);
    expect(best.layers.map((layer) => layer.alloy)).toEqual(['ti-grade-5', 'steel-1084']);
    expect(best.layers[1].thicknessNm).toBeCloseTo(heatThicknessNm(steel.heat!.law, temperatureC, holdMinutes), -0.5);
  });

  it('without a target, ranks by contrast between the layers, best first, all different looks', () => {
    const suggestions = planPair([titanium, steel], { temperatureC: { min: 200, max: 340 } });
    expect(suggestions.length).toBe(5);
    for (let i = 1; i < suggestions.length; i += 1) expect(suggestions[i].score).toBeLessThanOrEqual(suggestions[i - 1].score);
    const best = suggestions[0];
    // Check the score is the ΔE00 between the two layer colours it reports.
    const labs = best.layers.map((layer, i) => referenceColourAt(i === 0 ? 'tio2-on-titanium' : 'iron-oxide-on-iron', layer.thicknessNm).lab);
    expect(deltaE2000(labs[0], labs[1])).toBeCloseTo(best.score, 1);
    expect(best.score).toBeGreaterThan(30);
  });

  it('two grades with the same reference law give no contrast until the library separates them', () => {
    const grade2 = findTintModel('ti-grade-2')!;
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
