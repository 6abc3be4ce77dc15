import { converter, convertLrgbToOklab, convertRgbToLrgb, differenceCiede2000, formatHex } from 'culori';
import type { Swatch } from './schemas';

export interface OklabPoint {
  l: number;
  a: number;
  b: number;
}

export type LinearRgb = readonly [number, number, number];

const toLab65 = converter('lab65');
const toRgb = converter('rgb');
const toXyz65 = converter('xyz65');
const ciede2000 = differenceCiede2000();

/** 8-bit sRGB code value → linear light, the sRGB transfer function of IEC 61966-2-1 (via culori). */
export const SRGB8_TO_LINEAR: Float64Array = Float64Array.from({ length: 256 }, (_, code) => convertRgbToLrgb({ r: code / 255, g: 0, b: 0 }).r);

export function linearRgbToOklab(r: number, g: number, b: number): OklabPoint {
  const { l, a, b: bb } = convertLrgbToOklab({ r, g, b });
  return { l, a, b: bb };
}

/** CIE XYZ (D65, Y = 1 for white) of a linear sRGB colour. */
export function linearRgbToXyz(rgb: LinearRgb): [number, number, number] {
  const { x, y, z } = toXyz65({ mode: 'lrgb', r: rgb[0], g: rgb[1], b: rgb[2] });
  return [x, y, z];
}

/** ΔE00 (CIEDE2000) between two OKLab colours, compared in D65 CIELAB. */
export function deltaE2000(first: OklabPoint, second: OklabPoint): number {
  return ciede2000(toLab65({ mode: 'oklab', ...first }), toLab65({ mode: 'oklab', ...second }));
}

const round = (value: number, places: number) => {
  const scale = 10 ** places;
  const rounded = Math.round(value * scale) / scale;
  return Object.is(rounded, -0) ? 0 : rounded;
};

/** A swatch for an OKLab colour; the hex is clamped into the sRGB gamut, the Lab values are not. */
export function toSwatch(colour: OklabPoint, share: number, spread: number): Swatch {
  const oklab = { mode: 'oklab' as const, ...colour };
  const lab = toLab65(oklab);
  return {
    hex: formatHex(toRgb(oklab)),
    lab: { l: round(lab.l, 2), a: round(lab.a, 2), b: round(lab.b, 2) },
    oklab: { l: round(colour.l, 4), a: round(colour.a, 4), b: round(colour.b, 4) },
    share: round(share, 4),
    spread: round(spread, 4),
  };
}
