import { describe, expect, it } from 'vitest';
import { findTintModel, missingModelReason } from '~/lib/tint/models';
import { ModelUnavailableError, NoPredictionError, predictTint } from '~/lib/tint/predict';

const model = (slug: string) => findTintModel(slug)!;
const heat = (slug: string, temperatureC: number, atmosphere: 'air' | 'argon' | 'other' = 'air', holdMinutes = 30) =>
  predictTint(model(slug), { process: 'heat', temperatureC, holdMinutes, atmosphere });
const codes = (slug: string, temperatureC: number, atmosphere?: 'air' | 'argon' | 'other') =>
  heat(slug, temperatureC, atmosphere).warnings.map((warning) => warning.code);

describe('prediction for a planned heat', () => {
  it('gives a band low ≤ mid ≤ high with colours across it, on reference data alone', () => {
    const prediction = heat('ti-grade-5', 550, 'air', 60);
    expect(prediction.alloy).toBe('ti-grade-5');
    expect(prediction.basis).toBe('reference');
    expect(prediction.couponCount).toBe(0);
    expect(prediction.thicknessNm.low).toBeLessThan(prediction.thicknessNm.mid);
    expect(prediction.thicknessNm.mid).toBeLessThan(prediction.thicknessNm.high);
    expect(prediction.band.length).toBeGreaterThan(2);
    expect(prediction.band[0].thicknessNm).toBeCloseTo(prediction.thicknessNm.low, 0);
    expect(prediction.colour.hex).toMatch(/^#[0-9a-f]{6}$/);
  });

  it('a grade without its own anchors gets a wider band than Ti-6Al-4V', () => {
    // Design rule, no published source: Ti-6Al-4V has anchors of its own (Int. J. Biomaterials 2015); grade 2 borrows
    // them, so its band must be the less certain one.
    const width = (slug: string) => {
      const { low, high } = heat(slug, 550, 'air', 60).thicknessNm;
      return high / low;
    };
    expect(width('ti-grade-2')).toBeGreaterThan(width('ti-grade-5'));
  });

  it.each(['steel-304', 'copper-c11000', 'bronze-c51000', 'brass-c26000'])('%s answers "library data only"', (slug) => {
    expect(() => heat(slug, 300)).toThrow(ModelUnavailableError);
    expect(() => heat(slug, 300)).toThrow(/library data only/);
  });

  it('zirconium has optics but no heat kinetics: library data only for a heat', () => {
    expect(() => heat('zirconium-702', 500)).toThrow(/library data only/);
  });

  it('names the missing part of a model in a plain sentence', () => {
    const zirconium = model('zirconium-702');
    expect(missingModelReason({ ...zirconium, optics: null }, 'optics')).toBe(`${zirconium.alloy.name} has no optical film model yet: library data only.`);
    expect(missingModelReason(zirconium, 'heat')).toBe(`${zirconium.alloy.name} has no heat-growth kinetics yet: library data only.`);
    expect(missingModelReason(model('ti-grade-2'), 'heat')).toBeNull();
  });
});

describe('warnings for the planned heat', () => {
  it('every warning has a code, a message and a source', () => {
    for (const warning of heat('ti-grade-5', 1050).warnings) {
      expect(warning.code).toMatch(/^[a-z-]+$/);
      expect(warning.message.length).toBeGreaterThan(20);
      expect(warning.source.length).toBeGreaterThan(10);
    }
  });

  it.each([
    // Forge-welding range ≈ 925–1095 °C: common practice (no published source); warned from 900 °C.
    ['ti-grade-5', 1000, 'forge-welding-range', true],
    ['ti-grade-5', 880, 'forge-welding-range', false],
    // Fe–Ti eutectic ≈ 1085 °C: from memory of the Fe–Ti phase diagram; warned with the forge-welding range.
    ['ti-grade-2', 1050, 'fe-ti-eutectic', true],
    ['ti-grade-2', 700, 'fe-ti-eutectic', false],
    // Alpha case: common practice, warned from 600 °C in air.
    ['ti-grade-5', 650, 'alpha-case', true],
    ['ti-grade-5', 550, 'alpha-case', false],
    // Beta transus ≈ 995 °C Ti-6Al-4V, ≈ 910 °C grade 2 (from memory), warned 30 °C below.
    ['ti-grade-5', 970, 'beta-transus', true],
    ['ti-grade-5', 940, 'beta-transus', false],
    ['ti-grade-2', 890, 'beta-transus', true],
    ['ti-grade-2', 870, 'beta-transus', false],
    // Colouring a hardened blade tempers it: common practice, from 175 °C.
    ['steel-1095', 280, 'tempers-hardened-steel', true],
    ['steel-1095', 150, 'tempers-hardened-steel', false],
    ['steel-1095', 280, 'alpha-case', false],
  ] as const)('%s at %i °C: %s → %s', (slug, temperatureC, code, expected) => {
    expect(codes(slug, temperatureC).includes(code)).toBe(expected);
  });

  it('the eutectic warning says "at or above" once the heat reaches 1085 °C', () => {
    const warning = heat('ti-grade-5', 1100).warnings.find((w) => w.code === 'fe-ti-eutectic')!;
    expect(warning.message).toMatch(/at or above/);
  });

  it('argon: no alpha-case warning, but an inert-gas caution, even with no prediction to give', () => {
    // Source: BRIEF.md safety section (argon displaces oxygen in closed spaces): common practice.
    try {
      heat('ti-grade-5', 950, 'argon');
      expect.unreachable('argon without argon coupons has no prediction');
    } catch (error) {
      expect(error).toBeInstanceOf(NoPredictionError);
      const argon = (error as NoPredictionError).warnings.map((warning) => warning.code);
      expect(argon).not.toContain('alpha-case');
      expect(argon).toContain('inert-gas');
    }
  });

  it('outside the temperatures the reference data cover, says the band is extrapolated', () => {
    // Source: Int. J. Biomaterials 2015 Table 1 — titanium anchors at 500 and 600 °C only; 300 °C is far below.
    expect(codes('ti-grade-5', 300)).toContain('outside-reference-range');
    expect(codes('ti-grade-5', 550)).not.toContain('outside-reference-range');
    // Source: Colvin & Juthe (1922) and the Great Soviet Encyclopedia: temper colours from about 221 °C (430 °F); 190 °C is below.
    expect(codes('steel-1084', 190)).toContain('outside-reference-range');
  });

  it('steel past the temper range: no colour, says so', () => {
    // Source: Great Soviet Encyclopedia, "Temper color": light grey at 330–350 °C is the last temper colour;
    // Colvin & Juthe (1922) end at blue, 600 °F (316 °C). 420 °C for 30 min is past both.
    try {
      heat('steel-1084', 420);
      expect.unreachable('a heat past the temper range has no colour');
    } catch (error) {
      expect(error).toBeInstanceOf(NoPredictionError);
      expect((error as NoPredictionError).reason).toBe('past-film-range');
      expect((error as Error).message).toMatch(/past the temper range/);
      expect((error as NoPredictionError).warnings.map((w) => w.code)).toContain('tempers-hardened-steel');
    }
  });
});

describe('prediction for anodizing', () => {
  it('the band is offset + slope × voltage with ±10 % on the slope, from the published line', () => {
    // Independent computation: least squares through Int. J. Biomaterials 2015, Table 1 (20 V 48 nm, 40 V 92 nm,
    // 60 V 130 nm): slope = Σ(V−40)(d−90)/Σ(V−40)² = (840 + 800)/800 = 2.05 nm/V, offset = 90 − 2.05·40 = 8 nm.
    // Spread: Ohtsuka, Masuda & Sato (1985, from memory) find 2.4 nm/V in acid and 2.8 nm/V in phosphate (±8 %).
    const prediction = predictTint(model('ti-grade-2'), { process: 'anodize', volts: 30 });
    expect(prediction.thicknessNm.mid).toBeCloseTo(8 + 2.05 * 30, 1);
    expect(prediction.thicknessNm.low).toBeCloseTo(8 + 0.9 * 2.05 * 30, 1);
    expect(prediction.thicknessNm.high).toBeCloseTo(8 + 1.1 * 2.05 * 30, 1);
    expect(prediction.warnings.map((warning) => warning.code)).toEqual(['anodizing-bath']);
  });

  it('warns of shock above 60 V', () => {
    const prediction = predictTint(model('niobium'), { process: 'anodize', volts: 90 });
    expect(prediction.warnings.map((warning) => warning.code)).toContain('high-voltage');
  });

  it('steel has no anodizing model', () => {
    expect(() => predictTint(model('steel-1084'), { process: 'anodize', volts: 20 })).toThrow(/library data only/);
  });
});
