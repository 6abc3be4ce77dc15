/** Colour difference: CIEDE2000 by culori, on CIELAB with the D65 white. */
import { differenceCiede2000 } from 'culori/fn';
import type { Lab } from './types';

const ciede2000 = differenceCiede2000();

/**
 * ΔE00 (kL = kC = kH = 1) of two CIELAB (D65) colours. culori matches Sharma, Wu & Dalal (2005)
 * only when told the colours are 'lab65'; the literal objects keep its call fast (a colour
 * without a mode is copied by culori, measured over ten times slower).
 */
export function deltaE2000(first: Lab, second: Lab): number {
  return ciede2000({ mode: 'lab65', l: first.l, a: first.a, b: first.b }, { mode: 'lab65', l: second.l, a: second.a, b: second.b });
}
