import { oklabToLab, oklabToRgb, rgbHex, type Oklab } from '~/lib/colour';
import type { Swatch } from './schemas';

const round = (value: number, places: number) => {
  const scale = 10 ** places;
  const rounded = Math.round(value * scale) / scale;
  return Object.is(rounded, -0) ? 0 : rounded;
};

/** A swatch for an OKLab colour; the hex is clamped into the sRGB gamut, the Lab values are not. */
export function toSwatch(colour: Oklab, share: number, spread: number): Swatch {
  const lab = oklabToLab(colour);
  return {
    hex: rgbHex(oklabToRgb(colour)),
    lab: { l: round(lab.l, 2), a: round(lab.a, 2), b: round(lab.b, 2) },
    oklab: { l: round(colour.l, 4), a: round(colour.a, 4), b: round(colour.b, 4) },
    share: round(share, 4),
    spread: round(spread, 4),
  };
}
