import { findTintModel, thicknessCandidates, type FilmSystemId } from './tint';
import { deltaE2000, type Lab } from './colour';
import { referenceLadder } from './tint/ladder';
import type { NearestTint } from './photos';

/** Beyond this colour difference no band is named: the colour is not one the alloy's film shows. */
const MAX_NAMED_DELTA_E00 = 10;

/**
 * How a measured colour's lightness counts in the match:
 * - `absolute`: the photo's exposure was set from a grey card of known reflectance, so its L* is
 *   an absolute reflectance like the model's, and CIEDE2000 is used as defined (kL = 1);
 * - `down-weighted`: no grey card, so the photo's brightness is whatever the camera chose and
 *   lightness counts half (kL = 2, the textile industry's setting; see src/lib/colour/delta-e.ts).
 */
export type LightnessWeight = 'absolute' | 'down-weighted';

/** What a person reads beside a match made without a grey card. */
export const DOWN_WEIGHTED_NOTE =
  'No grey card: the photo’s brightness is not known, so lightness counted half in this match (CIEDE2000 with kL = 2). Mark a grey card for a surer reading.';

export interface FilmCandidate {
  thicknessNm: number;
  name: string;
  deltaE00: number;
}

const SEARCH_MAX_NM = 400;
/** Two minima closer than this are one interference order. */
const SAME_ORDER_NM = 4;

/** Every interference order whose colour matches, best first; lightness down-weighted (kL = 2). */
function downWeightedCandidates(system: FilmSystemId, lab: Lab, maxDeltaE00: number, limit: number): FilmCandidate[] {
  const ladder = referenceLadder(system);
  const last = Math.min(ladder.colours.length - 1, Math.round(SEARCH_MAX_NM / ladder.stepNm));
  const differences = new Float64Array(last + 1);
  for (let i = 0; i <= last; i += 1) differences[i] = deltaE2000(ladder.colours[i].lab, lab, 2);
  const minima: number[] = [];
  for (let i = 0; i <= last; i += 1) {
    const before = i > 0 ? differences[i - 1] : Infinity;
    const after = i < last ? differences[i + 1] : Infinity;
    if (differences[i] <= before && differences[i] < after) minima.push(i);
  }
  minima.sort((x, y) => differences[x] - differences[y]);
  const kept: number[] = [];
  for (const index of minima) {
    if (kept.length > 0 && differences[index] > maxDeltaE00) break;
    if (kept.some((other) => Math.abs(other - index) * ladder.stepNm < SAME_ORDER_NM)) continue;
    kept.push(index);
    if (kept.length === limit) break;
  }
  return kept.map((index) => ({ thicknessNm: index * ladder.stepNm, name: ladder.names[index], deltaE00: differences[index] }));
}

/**
 * The oxide films whose colour matches a measured colour on an alloy, one per interference order
 * that fits, best first — the same search the coupon page names a band from. Empty when the alloy
 * has no optical model.
 */
export function filmCandidates(alloy: string, lab: Lab, lightness: LightnessWeight, { maxDeltaE00 = MAX_NAMED_DELTA_E00, limit = 6 } = {}): FilmCandidate[] {
  const optics = findTintModel(alloy)?.optics;
  if (!optics) return [];
  const found =
    lightness === 'absolute'
      ? thicknessCandidates(optics, lab, { maxDeltaE00, limit }).map(({ thicknessNm, name, deltaE00 }) => ({ thicknessNm, name, deltaE00 }))
      : downWeightedCandidates(optics, lab, maxDeltaE00, limit);
  return found.map((candidate) => ({ ...candidate, deltaE00: Math.round(candidate.deltaE00 * 10) / 10 }));
}

/**
 * The tint band a measured colour is nearest to on the layer's alloy: the best match along the
 * alloy's tint ladder (every interference order searched, ranked by ΔE00), or null when the
 * alloy has no optical model or nothing on its ladder comes close.
 */
export function nearestTint(alloy: string, lab: Lab, lightness: LightnessWeight = 'absolute'): NearestTint | null {
  const [best] = filmCandidates(alloy, lab, lightness, { limit: 1 });
  if (!best || best.deltaE00 > MAX_NAMED_DELTA_E00) return null;
  return { ...best, ...(lightness === 'down-weighted' ? { note: DOWN_WEIGHTED_NOTE } : {}) };
}
