// The yardsticks the analysis tests measure with: CIELAB (D65), OKLab and the sRGB transfer function,
// as computed by culori, checked against their published definitions (CIEDE2000: delta-e.test.ts).
import { describe, expect, it } from 'vitest';
import { converter } from 'culori';
import { hexToLab, linearRgbToOklab, oklabToLab, SRGB8_TO_LINEAR, xyzToLab, XYZ_TO_LINEAR_RGB } from '~/lib/colour';
import { applyMatrix } from '~/lib/matrix';

const toLab65 = converter('lab65');
const toOklab = converter('oklab');

describe('CIELAB (D65)', () => {
  // Source: CIE 15:2004 §8.2.1, L* = 116 f(Y/Yn) − 16, a* = 500[f(X/Xn) − f(Y/Yn)], b* = 200[f(Y/Yn) − f(Z/Zn)],
  // f(t) = t^(1/3) above (6/29)³, else t/(3·(6/29)²) + 4/29; implemented here on its own, with the D65
  // white of CIE 15 Table T.3 (Xn 95.04, Yn 100, Zn 108.88; culori derives its white from x, y so
  // differs in the fourth digit, hence the 0.05 tolerance).
  const f = (t: number) => (t > (6 / 29) ** 3 ? Math.cbrt(t) : t / (3 * (6 / 29) ** 2) + 4 / 29);
  const cieLab = (x: number, y: number, z: number) => ({
    l: 116 * f(y / 1) - 16,
    a: 500 * (f(x / 0.9504) - f(y / 1)),
    b: 200 * (f(y / 1) - f(z / 1.0888)),
  });
  it.each([
    [0.2, 0.3, 0.1],
    [0.5, 0.4, 0.6],
    [0.004, 0.005, 0.003],
    [0.9, 0.95, 1.05],
  ])('XYZ %f %f %f', (x, y, z) => {
    const lab = toLab65({ mode: 'xyz65', x, y, z });
    const expected = cieLab(x, y, z);
    expect(lab.l).toBeCloseTo(expected.l, 1);
    expect(lab.a).toBeCloseTo(expected.a, 1);
    expect(lab.b).toBeCloseTo(expected.b, 1);
  });

  // From memory: the widely tabulated CIELAB (D65) of the sRGB primaries, e.g. B. Lindbloom's calculator.
  it.each([
    ['#ff0000', 53.24, 80.09, 67.2],
    ['#00ff00', 87.73, -86.18, 83.18],
    ['#0000ff', 32.3, 79.19, -107.86],
  ])('sRGB %s', (hex, l, a, b) => {
    const lab = toLab65(hex)!;
    expect(lab.l).toBeCloseTo(l, 1);
    expect(lab.a).toBeCloseTo(a, 1);
    expect(lab.b).toBeCloseTo(b, 1);
  });

  // The colour core's own conversions against the same formula: XYZ → CIELAB directly, and the way the
  // photo analysis goes, linear sRGB → OKLab → CIELAB.
  it.each([
    [0.3, 0.2, 0.25],
    [0.05, 0.06, 0.09],
    [0.7, 0.8, 0.6],
  ])('xyzToLab and oklabToLab, XYZ %f %f %f', (x, y, z) => {
    const expected = cieLab(x, y, z);
    const linear = applyMatrix(XYZ_TO_LINEAR_RGB, [x, y, z]);
    for (const lab of [xyzToLab({ x, y, z }), oklabToLab(linearRgbToOklab(...linear))]) {
      expect(lab.l).toBeCloseTo(expected.l, 1);
      expect(lab.a).toBeCloseTo(expected.a, 1);
      expect(lab.b).toBeCloseTo(expected.b, 1);
    }
  });

  // The same tabulated primaries (from memory, as above) through the colour core's hex reading: with or
  // without '#', in short form, in capitals, with spaces around.
  it.each([
    ['f00', 53.24, 80.09, 67.2],
    ['#00FF00', 87.73, -86.18, 83.18],
    [' #0000ff ', 32.3, 79.19, -107.86],
  ])('hexToLab %j', (hex, l, a, b) => {
    const lab = hexToLab(hex)!;
    expect(lab.l).toBeCloseTo(l, 1);
    expect(lab.a).toBeCloseTo(a, 1);
    expect(lab.b).toBeCloseTo(b, 1);
  });

  it.each(['#12345', '#ff000080', '#f008', 'red', ''])('hexToLab refuses %j', (text) => {
    expect(hexToLab(text)).toBeUndefined();
  });
});

describe('OKLab', () => {
  // Source: B. Ottosson, "A perceptual color space for image processing" (2020), table of XYZ (D65) →
  // OKLab test values, given there to three decimals (values from memory of that table).
  it.each([
    [
      [0.95, 1, 1.089],
      [1, 0, 0],
    ],
    [
      [1, 0, 0],
      [0.45, 1.236, -0.019],
    ],
    [
      [0, 1, 0],
      [0.922, -0.671, 0.263],
    ],
    [
      [0, 0, 1],
      [0.153, -1.415, -0.449],
    ],
  ])('XYZ %j', ([x, y, z], [l, a, b]) => {
    const oklab = toOklab({ mode: 'xyz65', x, y, z });
    expect(Math.abs(oklab.l - l)).toBeLessThan(0.002);
    expect(Math.abs(oklab.a - a)).toBeLessThan(0.002);
    expect(Math.abs(oklab.b - b)).toBeLessThan(0.002);
  });

  // Source: the same table (from memory); the colour core's per-pixel path, from linear sRGB.
  it.each([
    [
      [0.95, 1, 1.089],
      [1, 0, 0],
    ],
    [
      [0, 0, 1],
      [0.153, -1.415, -0.449],
    ],
  ])('linearRgbToOklab of XYZ %j', (xyz, [l, a, b]) => {
    const oklab = linearRgbToOklab(...applyMatrix(XYZ_TO_LINEAR_RGB, xyz));
    expect(Math.abs(oklab.l - l)).toBeLessThan(0.002);
    expect(Math.abs(oklab.a - a)).toBeLessThan(0.002);
    expect(Math.abs(oklab.b - b)).toBeLessThan(0.002);
  });
});

describe('sRGB transfer function', () => {
  // Source: IEC 61966-2-1:1999 — V ≤ 0.04045: V/12.92, else ((V + 0.055)/1.055)^2.4.
  it.each([
    [0, 0],
    [10, 10 / 255 / 12.92],
    [118, ((118 / 255 + 0.055) / 1.055) ** 2.4],
    [255, 1],
  ])('code %i', (code, linear) => {
    expect(SRGB8_TO_LINEAR[code]).toBeCloseTo(linear, 12);
  });

  // Source: same formula; 18 % reflectance grey encodes to code 118 (0.1811 linear), the grey card of the fixtures.
  it('an 18 % grey card is code 118', () => {
    expect(SRGB8_TO_LINEAR[118]).toBeCloseTo(0.18, 2);
  });
});
