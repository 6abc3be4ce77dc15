/** sRGB hex colours, read and written by culori; we accept #rgb and #rrggbb only (no alpha). */
import { formatHex, parseHex } from 'culori/fn';
import { rgbToLab, type Rgb } from './convert';
import type { Lab } from './types';

const HEX = /^#?([0-9a-f]{3}|[0-9a-f]{6})$/i;

export function isHexColour(value: string): boolean {
  return HEX.test(value);
}

/** CIELAB (D65) of an sRGB hex colour (#rgb or #rrggbb, the # optional); undefined when malformed. */
export function hexToLab(hex: string): Lab | undefined {
  const trimmed = hex.trim();
  return isHexColour(trimmed) ? rgbToLab(parseHex(trimmed)!) : undefined;
}

/** #rrggbb of sRGB channels, each clamped into 0–1 (no gamut mapping: display.ts does that). */
export const rgbHex = (rgb: Rgb): string => formatHex(rgb);
