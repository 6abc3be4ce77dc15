import { deltaE2000, oklabToLab } from '~/lib/colour';
import { assignPoints, fitKMeans, type Assignment } from './kmeans';

/**
 * How many swatches a region gets: k-means is fitted for k = 1 … 5 and the largest k is kept
 * whose clusters are all told apart, pair by pair, by both of:
 * - bimodal separation along the line joining the two centres, D = √2·|μ1 − μ2| / √(σ1² + σ2²)
 *   (Ashman, Bird & Zepf, Astron. J. 108:2348, 1994) of at least `minSeparation`. Their D > 2
 *   is for fitted mixture components; the hard halves k-means makes of ONE gaussian blob give
 *   D ≈ 2.65 and of an even gradient D ≈ 3.46 (worked out for this rule), so 4 keeps sensor noise
 *   and smooth shading as one swatch;
 * - centres at least `minDeltaE00` apart (CIEDE2000), so near-identical colours are one swatch.
 * Both limits are product choices tuned on synthetic coupons, not published values.
 */
export const CLUSTER_RULE = { minSeparation: 4, minDeltaE00: 3 } as const;

/** Points used to fit and judge the clusters; all pixels are then assigned to the chosen centres. */
export const FIT_SAMPLE_SIZE = 5_000;

/** Picks up to `size` points spread evenly over the list, one at random from each equal stretch. */
export function samplePoints(points: Float64Array, size: number, random: () => number): Float64Array {
  const n = points.length / 3;
  if (n <= size) return points;
  const sample = new Float64Array(size * 3);
  for (let j = 0; j < size; j += 1) {
    const index = Math.min(n - 1, Math.floor(((j + random()) * n) / size));
    sample.set(points.subarray(index * 3, index * 3 + 3), j * 3);
  }
  return sample;
}

/** Cluster `c`'s centre as CIELAB (D65), for ΔE00. */
const centreLab = (centres: Float64Array, c: number) => oklabToLab({ l: centres[c * 3], a: centres[c * 3 + 1], b: centres[c * 3 + 2] });

/** Ashman's D for clusters `i` and `j`, their points projected on the line between their centres. */
export function bimodalSeparation(points: Float64Array, assignment: Assignment, i: number, j: number): number {
  const { means, labels } = assignment;
  const axis = [means[j * 3] - means[i * 3], means[j * 3 + 1] - means[i * 3 + 1], means[j * 3 + 2] - means[i * 3 + 2]];
  const distance = Math.hypot(axis[0], axis[1], axis[2]);
  if (distance === 0) return 0;
  const unit = axis.map((value) => value / distance);
  const sums = { [i]: [0, 0, 0], [j]: [0, 0, 0] } as Record<number, number[]>; // count, Σx, Σx²
  for (let p = 0; p < labels.length; p += 1) {
    const label = labels[p];
    if (label !== i && label !== j) continue;
    const x = points[p * 3] * unit[0] + points[p * 3 + 1] * unit[1] + points[p * 3 + 2] * unit[2];
    sums[label][0] += 1;
    sums[label][1] += x;
    sums[label][2] += x * x;
  }
  const variance = ([count, sum, squares]: number[]) => Math.max(0, squares / count - (sum / count) ** 2);
  const pooled = variance(sums[i]) + variance(sums[j]);
  return pooled === 0 ? Infinity : (Math.SQRT2 * distance) / Math.sqrt(pooled);
}

/** True when every pair of clusters passes both limits of CLUSTER_RULE. */
export function allClustersDistinct(points: Float64Array, centres: Float64Array): boolean {
  const assignment = assignPoints(points, centres);
  const k = centres.length / 3;
  for (let i = 0; i < k; i += 1) {
    if (assignment.counts[i] === 0) return false;
    for (let j = i + 1; j < k; j += 1) {
      if (deltaE2000(centreLab(assignment.means, i), centreLab(assignment.means, j)) < CLUSTER_RULE.minDeltaE00) return false;
      if (bimodalSeparation(points, assignment, i, j) < CLUSTER_RULE.minSeparation) return false;
    }
  }
  return true;
}

/** Centres for the largest k ≤ `maxK` whose clusters are all distinct (or exactly `fixedK`). */
export function chooseCentres(sample: Float64Array, maxK: number, random: () => number, fixedK?: number): Float64Array {
  if (fixedK) return fitKMeans(sample, fixedK, random).centres;
  let chosen = fitKMeans(sample, 1, random).centres;
  for (let k = 2; k <= maxK; k += 1) {
    const fit = fitKMeans(sample, k, random);
    if (fit.centres.length / 3 < k) break; // fewer distinct colours than k
    if (allClustersDistinct(sample, fit.centres)) chosen = fit.centres;
  }
  return chosen;
}
