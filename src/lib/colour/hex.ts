/** sRGB hex colours, read and written by culori; we accept #rgb and #rrggbb only (no alpha). */
import { formatHex, parseHex } from 'culori/fn';
import { rgbToLab, type Rgb } from './convert';
import type { Lab } from './types';

import { isHexColour } from './hex-pattern';

export { isHexColour };

/** CIELAB (D65) of an sRGB hex colour (#rgb or #rrggbb, the # optional); undefined when malformed. */
export function hexToLab(hex: string): Lab | undefined {
  const trimmed = hex.trim();
  return isHexColour(trimmed) ? rgbToLab(parseHex(trimmed)!) : undefined;
}

/** #rrggbb of sRGB channels, each clamped into 0–1 (no gamut mapping: display.ts does that). */
export const rgbHex = (rgb: Rgb): string => formatHex(rgb);
