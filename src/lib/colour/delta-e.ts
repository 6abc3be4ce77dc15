/** Colour difference: CIEDE2000 by culori, on CIELAB with the D65 white. */
import { differenceCiede2000 } from 'culori/fn';
import type { Lab } from './types';

const ciede2000 = differenceCiede2000();
/**
 * Lightness weighted down by half (kL = 2, kC = kH = 1): the parametric factors CIEDE2000 is used
 * with in the textile industry (so documented by the colour-science library after Melgosa 2013
 * and Sharma, Wu & Dalal 2005; the standards that set it, CIE 142-2001 and ISO 105-J03, from memory).
 */
const ciede2000LightnessHalved = differenceCiede2000(2, 1, 1);

/**
 * ΔE00 (kL = kC = kH = 1, or kL = 2 with `lightnessFactor: 2`) of two CIELAB (D65) colours. culori
 * matches Sharma, Wu & Dalal (2005) only when told the colours are 'lab65'; the literal objects
 * keep its call fast (a colour without a mode is copied by culori, measured over ten times slower).
 */
export function deltaE2000(first: Lab, second: Lab, lightnessFactor: 1 | 2 = 1): number {
  const difference = lightnessFactor === 2 ? ciede2000LightnessHalved : ciede2000;
  return difference({ mode: 'lab65', l: first.l, a: first.a, b: first.b }, { mode: 'lab65', l: second.l, a: second.a, b: second.b });
}
