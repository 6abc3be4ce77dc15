import { describe, expect, it } from 'vitest';
import { allClustersDistinct, bimodalSeparation, chooseCentres, CLUSTER_RULE } from '~/lib/analysis/choose-clusters';
import { assignPoints, fitKMeans } from '~/lib/analysis/kmeans';
import { seededRandom } from '~/lib/random';

/** Points along the OKLab L axis only (a = b = 0), from a list of L values. */
function alongL(values: number[]): Float64Array {
  const points = new Float64Array(values.length * 3);
  values.forEach((value, index) => (points[index * 3] = value));
  return points;
}

function gaussian(count: number, mean: number, sigma: number, seed: number): number[] {
  const random = seededRandom(seed);
  return Array.from({ length: count }, () => mean + sigma * Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random()));
}

describe('seeded random numbers', () => {
  it('repeat for the same seed and differ for another', () => {
    const first = seededRandom(7);
    const again = seededRandom(7);
    const other = seededRandom(8);
    const a = Array.from({ length: 5 }, first);
    expect(Array.from({ length: 5 }, again)).toEqual(a);
    expect(Array.from({ length: 5 }, other)).not.toEqual(a);
    a.forEach((value) => expect(value >= 0 && value < 1).toBe(true));
  });
});

describe('k-means++', () => {
  // Worked example: three tight groups at L = 0.2, 0.5, 0.8; k = 3 must find their means.
  it('finds three separated groups', () => {
    const values = [...gaussian(300, 0.2, 0.005, 1), ...gaussian(300, 0.5, 0.005, 2), ...gaussian(300, 0.8, 0.005, 3)];
    const fit = fitKMeans(alongL(values), 3, seededRandom(1));
    const centres = [fit.centres[0], fit.centres[3], fit.centres[6]].sort();
    expect(centres[0]).toBeCloseTo(0.2, 2);
    expect(centres[1]).toBeCloseTo(0.5, 2);
    expect(centres[2]).toBeCloseTo(0.8, 2);
  });

  it('is deterministic for the same seed', () => {
    const points = alongL(gaussian(500, 0.5, 0.1, 4));
    expect(fitKMeans(points, 4, seededRandom(9))).toEqual(fitKMeans(points, 4, seededRandom(9)));
  });

  it('stops early when there are fewer distinct colours than k', () => {
    const fit = fitKMeans(alongL([0.3, 0.3, 0.6, 0.6]), 4, seededRandom(1));
    expect(fit.centres.length / 3).toBe(2);
  });
});

describe('bimodal separation (the k rule)', () => {
  // Worked example (derived for the rule): k-means halves of one gaussian have means ±σ√(2/π) and
  // variance σ²(1 − 2/π), so Ashman's D = 2√(2/π)/√(1 − 2/π) ≈ 2.647, below the limit of 4.
  it('one gaussian blob split in two gives D ≈ 2.65', () => {
    const points = alongL(gaussian(20_000, 0.5, 0.02, 5));
    const centres = new Float64Array([0.48, 0, 0, 0.52, 0, 0]);
    const assignment = assignPoints(points, centres);
    expect(bimodalSeparation(points, assignment, 0, 1)).toBeCloseTo(2.647, 1);
  });

  // Worked example: halves of an even stretch have means ¼ and ¾ of its length apart and standard
  // deviation (½)/√12 each, so D = 0.5/(0.5/√12) = √12 ≈ 3.464.
  it('an even gradient split in two gives D ≈ 3.46', () => {
    const points = alongL(Array.from({ length: 10_001 }, (_, i) => 0.4 + (0.2 * i) / 10_000));
    const assignment = assignPoints(points, new Float64Array([0.45, 0, 0, 0.55, 0, 0]));
    expect(bimodalSeparation(points, assignment, 0, 1)).toBeCloseTo(Math.sqrt(12), 2);
  });

  // Source: Ashman, Bird & Zepf (1994): two gaussians of equal σ, means d apart, have D = d/σ.
  it('two gaussians 8σ apart give D ≈ 8', () => {
    const points = alongL([...gaussian(5000, 0.4, 0.01, 6), ...gaussian(5000, 0.48, 0.01, 7)]);
    const assignment = assignPoints(points, new Float64Array([0.4, 0, 0, 0.48, 0, 0]));
    expect(bimodalSeparation(points, assignment, 0, 1)).toBeCloseTo(8, 0);
  });

  it('keeps noise as one colour and two distinct colours as two', () => {
    const noise = alongL(gaussian(4000, 0.5, 0.02, 8));
    expect(chooseCentres(noise, 5, seededRandom(1)).length / 3).toBe(1);
    const twoColours = alongL([...gaussian(2000, 0.4, 0.01, 9), ...gaussian(2000, 0.6, 0.01, 10)]);
    expect(chooseCentres(twoColours, 5, seededRandom(1)).length / 3).toBe(2);
  });

  it('joins colours closer than the ΔE00 limit even without noise', () => {
    // L 0.600 and 0.605 in OKLab are about 0.5 ΔE00 apart: below CLUSTER_RULE.minDeltaE00.
    expect(CLUSTER_RULE.minDeltaE00).toBeGreaterThan(0.5);
    const points = alongL([...Array(100).fill(0.6), ...Array(100).fill(0.605)]);
    expect(allClustersDistinct(points, new Float64Array([0.6, 0, 0, 0.605, 0, 0]))).toBe(false);
    expect(chooseCentres(points, 5, seededRandom(1)).length / 3).toBe(1);
  });
});
