import { describe, expect, it } from 'vitest';
import { xBar, yBar, zBar } from '~/lib/tint/data/cie-1931-2deg';
import { d65 } from '~/lib/tint/data/illuminant-d65';
import { colourFromXyz, whitePoint } from '~/lib/tint/colorimetry';
import { illuminantA } from '~/lib/tint/illuminants';
import { gridIndex } from '~/lib/tint/spectral-grid';

const at = (table: readonly number[], nm: number) => table[gridIndex(nm)];

describe('CIE 1931 2° colour matching functions', () => {
  it.each([
    // Source: CIE (2019) CIE 1931 2° CMF table, DOI 10.25039/CIE.DS.xvudnb9b; values quoted in REFERENCES.md.
    ['ȳ(555 nm)', yBar, 555, 1.0],
    ['x̄(600 nm)', xBar, 600, 1.0622],
    ['z̄(450 nm)', zBar, 450, 1.77211],
  ])('%s', (_label, table, nm, expected) => {
    expect(at(table, nm)).toBeCloseTo(expected, 6);
  });
});

describe('CIE standard illuminants', () => {
  it('D65 is 100 at 560 nm', () => {
    // Source: CIE (2019) CIE standard illuminant D65, DOI 10.25039/CIE.DS.hjfjmt59 (normalised to 100 at 560 nm).
    expect(at(d65, 560)).toBe(100);
  });

  it('A, computed from its defining formula, is 100 at 560 nm and rises into the red', () => {
    // Source: CIE 15:2004 §3.1, the formula for illuminant A (normalised to 100 at 560 nm).
    expect(illuminantA(560)).toBeCloseTo(100, 10);
    // Source: CIE 15:2004 Table T.1 values for A, from memory: 9.80 at 380 nm, 241.68 at 780 nm (±0.05 for rounding).
    expect(illuminantA(380)).toBeCloseTo(9.8, 1);
    expect(illuminantA(780)).toBeCloseTo(241.68, 1);
  });

  it('D65 white point from the 5 nm tables over 380–780 nm', () => {
    // Source: REFERENCES.md, computed from the CIE tables at 5 nm over 380–780 nm: (95.043, 100, 108.880).
    const white = whitePoint('D65');
    expect(white.x).toBeCloseTo(95.043, 2);
    expect(white.y).toBeCloseTo(100, 10);
    expect(white.z).toBeCloseTo(108.88, 2);
    // Source: IEC 61966-2-1 (sRGB) / CIE 015 standard D65 white (95.047, 100, 108.883); the
    // 5 nm, 380–780 nm truncation costs at most 0.01.
    expect(Math.abs(white.x - 95.047)).toBeLessThan(0.01);
    expect(Math.abs(white.z - 108.883)).toBeLessThan(0.01);
  });

  it('A white point chromaticity', () => {
    // Source: CIE 15:2004 Table T.3, illuminant A, 2° observer: x = 0.44757, y = 0.40745 (from memory);
    // 5 nm sampling over 380–780 nm, so ±0.0005.
    const white = whitePoint('A');
    const sum = white.x + white.y + white.z;
    expect(Math.abs(white.x / sum - 0.44757)).toBeLessThan(5e-4);
    expect(Math.abs(white.y / sum - 0.40745)).toBeLessThan(5e-4);
  });

  it.each(['D65', 'A'] as const)('a perfect reflector under %s is Y = 100, L* = 100, white', (illuminant) => {
    // Source: CIE 15:2004 §7 (perfect reflecting diffuser has Y = 100 and L* = 100, a* = b* = 0).
    const colour = colourFromXyz(whitePoint(illuminant), illuminant);
    expect(whitePoint(illuminant).y).toBeCloseTo(100, 10);
    expect(colour.lab.l).toBeCloseTo(100, 6);
    expect(Math.abs(colour.lab.a)).toBeLessThan(1e-6);
    expect(Math.abs(colour.lab.b)).toBeLessThan(1e-6);
    expect(colour.hex).toBe('#ffffff');
  });
});
