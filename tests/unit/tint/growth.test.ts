import { describe, expect, it } from 'vitest';
import { GAS_CONSTANT, celsiusToKelvin, heatThicknessNm, parabolicActivationEnergy, rateConstant } from '~/lib/tint/growth';
import { findTintModel } from '~/lib/tint/models';

const titanium = findTintModel('ti-grade-5')!.heat!.law;
const steel = findTintModel('steel-1095')!.heat!.law;

describe('parabolic growth (titanium)', () => {
  it.each([450, 500, 550, 650])('doubling the hold at %i °C multiplies thickness by √2', (temperatureC) => {
    // Source: REFERENCES.md, "Parabolic growth: doubling time multiplies thickness by √2" (d² = k·t).
    const ratio = heatThicknessNm(titanium, temperatureC, 120) / heatThicknessNm(titanium, temperatureC, 60);
    expect(ratio).toBeCloseTo(Math.SQRT2, 12);
  });

  it('d grows as √t', () => {
    for (const hours of [0.25, 1, 4, 16]) {
      expect(heatThicknessNm(titanium, 550, hours * 60) / heatThicknessNm(titanium, 550, 60)).toBeCloseTo(Math.sqrt(hours), 12);
    }
  });

  it('the apparent activation energy from the two Ti-6Al-4V anchors is near 90 kJ/mol', () => {
    // Source: Int. J. Biomaterials 2015, 395657, Table 1 (23 nm at 500 °C, 50 nm at 600 °C, 1 h);
    // REFERENCES.md: "the two Ti-6Al-4V points give an apparent Q near 90 kJ/mol".
    const q = parabolicActivationEnergy({ temperatureC: 500, thicknessNm: 23 }, { temperatureC: 600, thicknessNm: 50 });
    // Independent computation: Q = R·ln((50/23)²)/(1/773.15 − 1/873.15) = 8.314 × 1.5531 / 1.4814e-4 ≈ 87.2 kJ/mol.
    expect(q / 1000).toBeCloseTo(87.2, 0);
  });

  it('the thin-film law grows with a far lower Q than thick scale does', () => {
    // Source: Mohamed, Abd Elmomen & El-Hadad, Chem. Papers 76:1627 (2022): thick-scale Q = 191.7 kJ/mol for
    // Ti-6Al-4V; El-Cezerî J. Sci. Eng. 7(2) (2020): ≈ 201 (Ti-6Al-4V) and ≈ 269 kJ/mol (CP-Ti). REFERENCES.md:
    // thin tint films behave differently, so the law must sit well below all three.
    expect(titanium.activationEnergyJPerMol / 1000).toBeLessThan(191.7 / 1.5);
  });
});

describe('Arrhenius rate', () => {
  it.each([
    ['titanium (n = 2)', titanium],
    ['carbon steel (n = 5)', steel],
  ])('%s: ln k is linear in 1/T with slope −Q/R', (_label, law) => {
    // Source: REFERENCES.md, "Arrhenius: ln k linear in 1/T" (k = k₀·exp(−Q/RT)).
    const temperatures = [200, 300, 400, 500, 600, 700];
    const points = temperatures.map((t) => ({ x: 1 / celsiusToKelvin(t), y: Math.log(rateConstant(law, t)) }));
    const slope = (points[5].y - points[0].y) / (points[5].x - points[0].x);
    expect(slope).toBeCloseTo(-law.activationEnergyJPerMol / GAS_CONSTANT, 6);
    for (const point of points) {
      const onLine = points[0].y + slope * (point.x - points[0].x);
      expect(point.y).toBeCloseTo(onLine, 9);
    }
  });
});

describe('steep thin-film growth (steel)', () => {
  it('t ∝ dⁿ: doubling the hold multiplies thickness by 2^(1/n)', () => {
    // Source: McAdam & Geil, J. Res. NBS (1941), time ∝ thicknessⁿ for temper films (via REFERENCES.md).
    const ratio = heatThicknessNm(steel, 260, 10) / heatThicknessNm(steel, 260, 5);
    expect(ratio).toBeCloseTo(2 ** (1 / steel.exponent), 12);
    expect(steel.exponent).toBeGreaterThan(2);
  });
});
