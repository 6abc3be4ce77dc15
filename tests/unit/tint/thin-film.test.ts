import { describe, expect, it } from 'vitest';
import { opticalConstants } from '~/lib/tint/data/optical-constants';
import { filmReflectance, prepareStack, reflectanceSpectrum, weightedReflectanceSeries } from '~/lib/tint/thin-film';
import { WAVELENGTH_COUNT, wavelengthsNm } from '~/lib/tint/spectral-grid';

const air = { n: 1, k: 0 };
/** Source: Fresnel, normal incidence: R = ((n − 1)² + k²)/((n + 1)² + k²) (Born & Wolf, Principles of Optics, §14.2; Hecht, Optics, §4.6). */
const bareMetal = (n: number, k: number) => ((n - 1) ** 2 + k ** 2) / ((n + 1) ** 2 + k ** 2);

describe('a film of zero thickness gives the bare metal', () => {
  it.each([
    // Source: Johnson & Christy, Phys. Rev. B 9:5056 (1974), table rows as published (λ µm, n, k).
    ['titanium at 549 nm', 549, 2.54, 3.43],
    ['titanium at 451 nm', 451, 2.27, 3.04],
    ['iron at 549 nm', 549, 2.95, 2.93],
    ['iron at 704 nm', 704, 2.86, 3.19],
  ])('%s', (_label, nm, n, k) => {
    const anyFilm = { n: 2.4, k: 0.1 };
    expect(filmReflectance(nm, 0, anyFilm, { n, k }, air)).toBeCloseTo(bareMetal(n, k), 12);
  });

  it.each(['titanium', 'iron', 'niobium', 'zirconium'] as const)('%s over the whole grid', (metal) => {
    const constants = opticalConstants[metal];
    const spectrum = reflectanceSpectrum(prepareStack(opticalConstants.anatase, constants), 0);
    for (let i = 0; i < WAVELENGTH_COUNT; i += 1) {
      expect(spectrum[i]).toBeCloseTo(bareMetal(constants.n[i], constants.k[i]), 12);
    }
  });
});

describe('quarter-wave extrema of a transparent film on a transparent substrate', () => {
  // Source: Born & Wolf, Principles of Optics, §7.6.1; Hecht, Optics, §9.7.1: extrema where
  // n₁·d = m·λ/4; at odd m R = ((n₀n₂ − n₁²)/(n₀n₂ + n₁²))², at even m R is the bare substrate's.
  const cases = [
    { label: 'high-index film (n = 2.0 on glass n = 1.5)', film: 2.0, substrate: 1.5 },
    { label: 'low-index coating (MgF2 n = 1.38 on glass n = 1.52)', film: 1.38, substrate: 1.52 },
  ];
  const wavelength = 550;

  describe.each(cases)('$label', ({ film, substrate }) => {
    const reflectance = (d: number) => filmReflectance(wavelength, d, { n: film, k: 0 }, { n: substrate, k: 0 }, air);
    const quarter = wavelength / (4 * film);
    const extrema: number[] = [];
    for (let d = 0.01; d < 4.5 * quarter; d += 0.01) {
      const [before, here, after] = [reflectance(d - 0.01), reflectance(d), reflectance(d + 0.01)];
      if ((here > before && here > after) || (here < before && here < after)) extrema.push(d);
    }

    it('puts the extrema at multiples of λ/(4n)', () => {
      expect(extrema).toHaveLength(4);
      extrema.forEach((d, i) => expect(Math.abs(d - (i + 1) * quarter)).toBeLessThan(0.02));
    });

    it('gives the quarter-wave and half-wave reflectances', () => {
      const quarterWave = ((substrate - film ** 2) / (substrate + film ** 2)) ** 2;
      const bare = ((1 - substrate) / (1 + substrate)) ** 2;
      expect(reflectance(quarter)).toBeCloseTo(quarterWave, 10);
      expect(reflectance(2 * quarter)).toBeCloseTo(bare, 10);
    });
  });

  it('the MgF2 coating brings glass down to about 1.3 %', () => {
    // Source: Hecht, Optics, §9.7.1 (single-layer MgF2 antireflection coating on glass ≈ 1.3 %), from memory.
    const d = 550 / (4 * 1.38);
    expect(filmReflectance(550, d, { n: 1.38, k: 0 }, { n: 1.52, k: 0 }, air)).toBeCloseTo(0.0126, 3);
  });
});

describe('absorbing films on metal', () => {
  it('never reflect more than all the light', () => {
    // Physics: a passive stack cannot reflect more than it receives (common practice, no published source).
    const stack = prepareStack(opticalConstants.hematite, opticalConstants.iron);
    for (let d = 0; d <= 400; d += 2.5) {
      for (const value of reflectanceSpectrum(stack, d)) {
        expect(value).toBeGreaterThanOrEqual(0);
        expect(value).toBeLessThanOrEqual(1);
      }
    }
  });

  it('the stepped ladder sums equal the direct per-thickness computation', () => {
    // Internal consistency of the fast path (no published source needed).
    const stack = prepareStack(opticalConstants.anatase, opticalConstants.titanium);
    const ones = new Float64Array(WAVELENGTH_COUNT).fill(1);
    const sums = weightedReflectanceSeries(stack, [ones], 3, 7.5, 40);
    for (let t = 0; t < 40; t += 1) {
      const direct = reflectanceSpectrum(stack, 3 + t * 7.5).reduce((sum, value) => sum + value, 0);
      expect(sums[t]).toBeCloseTo(direct, 9);
    }
  });

  it('covers 380–780 nm at 5 nm', () => {
    // Source: CIE 15:2004 §7.1 (5 nm intervals over 380–780 nm are acceptable for colorimetry).
    expect(wavelengthsNm[0]).toBe(380);
    expect(wavelengthsNm[WAVELENGTH_COUNT - 1]).toBe(780);
    expect(WAVELENGTH_COUNT).toBe(81);
  });
});
