import { deltaE2000, type Lab } from '~/lib/colour';
import type { FilmSystemId } from './film-systems';
import { referenceLadder, type ReferenceLadder } from './ladder';
import type { TintName } from './tint-names';

export interface ThicknessCandidate {
  thicknessNm: number;
  deltaE00: number;
  hex: string;
  name: TintName;
}

export interface InverseOptions {
  /** Thinnest film searched (nm). */
  minThicknessNm?: number;
  /** Thickest film searched (nm); colours above ~400 nm are too washed out to tell apart. */
  maxThicknessNm?: number;
  /** Refine only this many of the closest coarse matches with ΔE00 (all of them by default). */
  refineBest?: number;
  /** Half-width of the ΔE00 refinement around each coarse match (nm). */
  refineWindowNm?: number;
  /** Candidates worse than this ΔE00 are dropped (the best one is always kept). */
  maxDeltaE00?: number;
  limit?: number;
}

/** Coarse pass: 1 nm steps with ΔE*ab (cheap), then ΔE00 within ±refineWindowNm of each local minimum. */
const COARSE_NM = 1;
const DEFAULTS = { minThicknessNm: 0, maxThicknessNm: 400, maxDeltaE00: 10, limit: 6, refineBest: Infinity, refineWindowNm: 2 };
/** ΔE*ab runs up to about three times ΔE00 on saturated colours; wider than that cannot pass. */
const COARSE_FACTOR = 3;

interface LabArrays {
  l: Float64Array;
  a: Float64Array;
  b: Float64Array;
}

const labArrays = new Map<FilmSystemId, LabArrays>();

function ladderLabs(system: FilmSystemId, ladder: ReferenceLadder): LabArrays {
  let arrays = labArrays.get(system);
  if (!arrays) {
    const n = ladder.colours.length;
    arrays = { l: new Float64Array(n), a: new Float64Array(n), b: new Float64Array(n) };
    ladder.colours.forEach((colour, i) => {
      arrays!.l[i] = colour.lab.l;
      arrays!.a[i] = colour.lab.a;
      arrays!.b[i] = colour.lab.b;
    });
    labArrays.set(system, arrays);
  }
  return arrays;
}

/**
 * The film thicknesses whose colour matches a measured CIELAB (D65) colour, one per interference
 * order that fits (each local minimum of the colour difference along the ladder), best first.
 */
export function thicknessCandidates(system: FilmSystemId, lab: Lab, options: InverseOptions = {}): ThicknessCandidate[] {
  const { minThicknessNm, maxThicknessNm, maxDeltaE00, limit, refineBest, refineWindowNm } = { ...DEFAULTS, ...options };
  const ladder = referenceLadder(system);
  const labs = ladderLabs(system, ladder);
  const stride = Math.round(COARSE_NM / ladder.stepNm);
  const first = Math.max(0, Math.round(minThicknessNm / ladder.stepNm));
  const last = Math.min(ladder.colours.length - 1, Math.round(maxThicknessNm / ladder.stepNm));
  const coarseLimit = maxDeltaE00 * COARSE_FACTOR;

  const distance = (i: number) => {
    const dl = labs.l[i] - lab.l;
    const da = labs.a[i] - lab.a;
    const db = labs.b[i] - lab.b;
    return dl * dl + da * da + db * db;
  };

  let minima: number[] = [];
  let bestIndex = first;
  let bestDistance = Infinity;
  let before = Infinity;
  let here = distance(first);
  for (let i = first; i <= last; i += stride) {
    const after = i + stride <= last ? distance(i + stride) : Infinity;
    if (here <= before && here < after && here <= coarseLimit * coarseLimit) minima.push(i);
    if (here < bestDistance) {
      bestDistance = here;
      bestIndex = i;
    }
    before = here;
    here = after;
  }
  if (!minima.includes(bestIndex)) minima.push(bestIndex);
  if (minima.length > refineBest) minima = minima.sort((x, y) => distance(x) - distance(y)).slice(0, refineBest);

  const window = Math.round(refineWindowNm / ladder.stepNm);
  const candidates = minima.map((centre) => {
    let index = centre;
    let best = Infinity;
    for (let i = Math.max(first, centre - window); i <= Math.min(last, centre + window); i += 1) {
      const difference = deltaE2000(ladder.colours[i].lab, lab);
      if (difference < best) {
        best = difference;
        index = i;
      }
    }
    return { index, deltaE00: best };
  });

  candidates.sort((x, y) => x.deltaE00 - y.deltaE00);
  const kept: typeof candidates = [];
  for (const candidate of candidates) {
    if (kept.length > 0 && candidate.deltaE00 > maxDeltaE00) break;
    if (kept.some((other) => Math.abs(other.index - candidate.index) * ladder.stepNm < 2 * Math.max(refineWindowNm, COARSE_NM))) continue;
    kept.push(candidate);
    if (kept.length === limit) break;
  }
  return kept.map(({ index, deltaE00 }) => ({
    thicknessNm: index * ladder.stepNm,
    deltaE00,
    hex: ladder.colours[index].hex,
    name: ladder.names[index],
  }));
}

/**
 * Of the candidates, the one a growth prior makes most likely: the smallest sum of squared,
 * scaled misfits in colour (ΔE00 / colourScale) and in ln(thickness) from the prior's expectation.
 */
export function mostLikelyCandidate<C extends { thicknessNm: number; deltaE00: number }>(
  candidates: readonly C[],
  expectedNm: number,
  lnSpread: number,
  colourScale = 3,
): C | undefined {
  let best: C | undefined;
  let bestScore = Infinity;
  for (const candidate of candidates) {
    const lnMisfit = (Math.log(Math.max(candidate.thicknessNm, 0.5)) - Math.log(expectedNm)) / lnSpread;
    const score = (candidate.deltaE00 / colourScale) ** 2 + lnMisfit ** 2;
    if (score < bestScore) {
      bestScore = score;
      best = candidate;
    }
  }
  return best;
}
