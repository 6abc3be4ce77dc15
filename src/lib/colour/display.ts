/**
 * Colours as a screen shows them: the sRGB hex of a colour, gamut-mapped by chroma reduction when
 * sRGB cannot show it, beside its true CIELAB and OKLab.
 */
import { convertOklabToLrgb } from 'culori/fn';
import { labToRgb, oklabToRgb, rgbToOklab, xyzToLab, xyzToRgb, type Rgb } from './convert';
import { rgbHex } from './hex';
import type { DisplayColour, Lab, Oklab, Xyz } from './types';

const GAMUT_SLACK = 1e-4;
const CHROMA_SEARCH_STEPS = 16;

const inUnitRange = (r: number, g: number, b: number) =>
  r >= -GAMUT_SLACK && r <= 1 + GAMUT_SLACK && g >= -GAMUT_SLACK && g <= 1 + GAMUT_SLACK && b >= -GAMUT_SLACK && b <= 1 + GAMUT_SLACK;

/** A colour is inside sRGB exactly when its linear channels are in [0, 1]. */
function oklabIsInSrgb(l: number, a: number, b: number): boolean {
  const linear = convertOklabToLrgb({ l, a, b });
  return inUnitRange(linear.r, linear.g, linear.b);
}

/**
 * Gamut mapping by chroma reduction at constant OKLab lightness and hue (the approach of CSS Color 4):
 * a binary search for the largest chroma sRGB can show.
 * Hand-written, not culori's clampChroma: that one stops at a coarser chroma step and changes 42 of
 * the 749 out-of-gamut colours on the tint ladders (0–1000 nm at 0.5 nm), measured.
 */
function mapIntoSrgb(oklab: Oklab): Rgb {
  if (oklab.l >= 1) return { mode: 'rgb', r: 1, g: 1, b: 1 };
  if (oklab.l <= 0) return { mode: 'rgb', r: 0, g: 0, b: 0 };
  let inside = 0;
  let outside = 1;
  for (let i = 0; i < CHROMA_SEARCH_STEPS; i += 1) {
    const scale = (inside + outside) / 2;
    if (oklabIsInSrgb(oklab.l, oklab.a * scale, oklab.b * scale)) inside = scale;
    else outside = scale;
  }
  const mapped = oklabToRgb({ l: oklab.l, a: oklab.a * inside, b: oklab.b * inside });
  const clamp = (value: number) => Math.min(1, Math.max(0, value));
  return { mode: 'rgb', r: clamp(mapped.r), g: clamp(mapped.g), b: clamp(mapped.b) };
}

function displayed(rgb: Rgb, lab: Lab): DisplayColour {
  const oklab = rgbToOklab(rgb);
  const outOfGamut = !inUnitRange(rgb.r, rgb.g, rgb.b);
  return { hex: rgbHex(outOfGamut ? mapIntoSrgb(oklab) : rgb), outOfGamut, lab, oklab };
}

/** The display colour of CIE XYZ with the D65 white at Y = 1. */
export function colourFromXyz65(xyz: Xyz): DisplayColour {
  return displayed(xyzToRgb(xyz), xyzToLab(xyz));
}

/** A measured CIELAB (D65) colour as display colour. */
export function colourFromLab(lab: Lab): DisplayColour {
  return displayed(labToRgb(lab), { ...lab });
}
