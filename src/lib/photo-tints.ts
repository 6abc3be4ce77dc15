import { findTintModel, thicknessCandidates } from './tint';
import type { Lab } from './colour';
import type { NearestTint } from './photos';

/** Beyond this colour difference no band is named: the colour is not one the alloy's film shows. */
const MAX_NAMED_DELTA_E00 = 10;

/**
 * The tint band a measured colour is nearest to on the layer's alloy: the best match along the
 * alloy's tint ladder (every interference order searched, ranked by ΔE00), or null when the
 * alloy has no optical model or nothing on its ladder comes close.
 */
export function nearestTint(alloy: string, lab: Lab): NearestTint | null {
  const optics = findTintModel(alloy)?.optics;
  if (!optics) return null;
  const [best] = thicknessCandidates(optics, lab, { limit: 1, maxDeltaE00: MAX_NAMED_DELTA_E00 });
  if (!best || best.deltaE00 > MAX_NAMED_DELTA_E00) return null;
  return { name: best.name, thicknessNm: best.thicknessNm, deltaE00: Math.round(best.deltaE00 * 10) / 10 };
}
