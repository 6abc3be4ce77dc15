// Film colours computed here, independently of src/lib/tint: the reflectance of one absorbing
// film on a metal at normal incidence (Airy summation; Born & Wolf, Principles of Optics, §13.4;
// Heavens, Optical Properties of Thin Solid Films, ch. 4) and the CIE 1931 tristimulus sums
// (CIE 15:2004 §7). Only the published tables are shared with the app: the optical constants and
// the CIE tables in src/lib/tint/data (checked against the published files in tests/unit/tint).
import { converter } from 'culori';
import { CMF_FIRST_NM, CMF_STEP_NM, xBar, yBar, zBar } from '~/lib/tint/data/cie-1931-2deg';
import { d65 } from '~/lib/tint/data/illuminant-d65';
import { opticalConstants } from '~/lib/tint/data/optical-constants';

type Complex = [number, number];
const add = (a: Complex, b: Complex): Complex => [a[0] + b[0], a[1] + b[1]];
const sub = (a: Complex, b: Complex): Complex => [a[0] - b[0], a[1] - b[1]];
const mul = (a: Complex, b: Complex): Complex => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const div = (a: Complex, b: Complex): Complex => {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
};
const exp = (a: Complex): Complex => [Math.exp(a[0]) * Math.cos(a[1]), Math.exp(a[0]) * Math.sin(a[1])];

/** Reflectance of ambient | film N1 (thickness d) | substrate N2 at wavelength λ, N = n + ik. */
function airyReflectance(lambdaNm: number, d: number, film: Complex, substrate: Complex): number {
  const ambient: Complex = [1, 0];
  const r01 = div(sub(ambient, film), add(ambient, film));
  const r12 = div(sub(film, substrate), add(film, substrate));
  // e^{2iδ}, δ = 2π N1 d / λ
  const delta = mul([0, (4 * Math.PI * d) / lambdaNm], film);
  const phase = exp(delta);
  const r = div(add(r01, mul(r12, phase)), add([1, 0], mul(mul(r01, r12), phase)));
  return r[0] * r[0] + r[1] * r[1];
}

export const wavelengths = xBar.map((_, i) => CMF_FIRST_NM + i * CMF_STEP_NM);

/** Reflectance spectrum (on the CIE table's 5 nm grid) of a titanium-dioxide film on titanium. */
export function titaniumFilmSpectrum(thicknessNm: number): number[] {
  const { anatase, titanium } = opticalConstants;
  return wavelengths.map((nm, i) => airyReflectance(nm, thicknessNm, [anatase.n[i], anatase.k[i]], [titanium.n[i], titanium.k[i]]));
}

/**
 * CIE XYZ (Y of the perfect white = 1) of a reflectance spectrum under a light's relative spectral
 * power on the same grid: X = Σ R S x̄ / Σ S ȳ, and likewise Y, Z (CIE 15:2004 eq. 7.1–7.3).
 */
export function tristimulus(reflectance: readonly number[], light: readonly number[] = d65): { x: number; y: number; z: number } {
  let x = 0;
  let y = 0;
  let z = 0;
  let norm = 0;
  for (let i = 0; i < wavelengths.length; i += 1) {
    x += reflectance[i] * light[i] * xBar[i];
    y += reflectance[i] * light[i] * yBar[i];
    z += reflectance[i] * light[i] * zBar[i];
    norm += light[i] * yBar[i];
  }
  return { x: x / norm, y: y / norm, z: z / norm };
}

/**
 * CIE illuminant A on the same grid, from its defining formula: Planck's law with c2 = 1.435 × 10⁻² m·K
 * at 2848 K (the same spectrum as 2856 K with today's c2 = 1.4388 × 10⁻² m·K), 100 at 560 nm
 * (CIE 15:2004 eq. 3.1; ISO/CIE 11664-2; the formula's constants from memory, checked in the tests
 * against A's published chromaticity).
 */
export const illuminantA: number[] = wavelengths.map((nm) => {
  const c2 = 1.435e7; // nm·K
  const planck = (l: number) => l ** -5 / (Math.exp(c2 / (l * 2848)) - 1);
  return (100 * planck(nm)) / planck(560);
});

const toLinearRgb = converter('lrgb');
const toRgb = converter('rgb');
const toLab = converter('lab65');

/** Linear sRGB (IEC 61966-2-1, by culori) of XYZ with Y of white = 1. */
export const xyzToLinearRgb = (xyz: { x: number; y: number; z: number }) => {
  const { r, g, b } = toLinearRgb({ mode: 'xyz65', ...xyz });
  return [r, g, b] as [number, number, number];
};

/** CIELAB (D65, CIE 15) of XYZ with Y of white = 1. */
export const xyzToLab = (xyz: { x: number; y: number; z: number }) => {
  const { l, a, b } = toLab({ mode: 'xyz65', ...xyz });
  return { l, a, b };
};

/** The 8-bit sRGB hex of linear sRGB, each channel clipped to 0–1 as a camera would; also says whether any channel clipped. */
export function linearToHex(linear: readonly number[]): { hex: string; clipped: boolean } {
  const clipped = linear.some((value) => value < 0 || value > 1);
  const { r, g, b } = toRgb({
    mode: 'lrgb',
    r: Math.min(1, Math.max(0, linear[0])),
    g: Math.min(1, Math.max(0, linear[1])),
    b: Math.min(1, Math.max(0, linear[2])),
  });
  const byte = (value: number) =>
    Math.round(value * 255)
      .toString(16)
      .padStart(2, '0');
  return { hex: `#${byte(r)}${byte(g)}${byte(b)}`, clipped };
}
