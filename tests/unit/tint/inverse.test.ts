import { describe, expect, it } from 'vitest';
import { colourAt } from '~/lib/tint/ladder';
import { mostLikelyCandidate, thicknessCandidates } from '~/lib/tint/inverse';
import { hexToLab } from '~/lib/colour';

// Round trips through the model itself: no published source is needed to check that the inverse
// finds the thickness a colour came from.
describe.each(['tio2-on-titanium', 'iron-oxide-on-iron'] as const)('inverse on %s', (system) => {
  it.each([15, 25, 33, 45, 60, 110, 135, 150, 185])('finds %i nm among the candidates', (thickness) => {
    const { lab } = colourAt(system, thickness);
    const candidates = thicknessCandidates(system, lab);
    const match = candidates.find((candidate) => Math.abs(candidate.thicknessNm - thickness) <= 1.5);
    expect(match).toBeDefined();
    expect(match!.deltaE00).toBeLessThan(1);
  });
});

describe('every interference order that fits', () => {
  it('a first-order blue also matches the second-order blue, ranked by ΔE00', () => {
    const candidates = thicknessCandidates('tio2-on-titanium', colourAt('tio2-on-titanium', 50).lab);
    expect(candidates[0].thicknessNm).toBeCloseTo(50, 0);
    expect(candidates[0].name).toBe('blue');
    expect(candidates.some((candidate) => candidate.thicknessNm > 140 && candidate.name === 'second-order blue')).toBe(true);
    for (let i = 1; i < candidates.length; i += 1) expect(candidates[i].deltaE00).toBeGreaterThanOrEqual(candidates[i - 1].deltaE00);
  });

  it('a colour far from every film still returns its nearest thickness', () => {
    const candidates = thicknessCandidates('tio2-on-titanium', hexToLab('#ff0000')!);
    expect(candidates).toHaveLength(1);
    expect(candidates[0].deltaE00).toBeGreaterThan(10);
  });
});

describe('choosing the order a prior makes most likely', () => {
  it('prefers the candidate nearer the expected thickness when colours fit about equally', () => {
    const candidates = [
      { thicknessNm: 50, deltaE00: 1.2 },
      { thicknessNm: 158, deltaE00: 0.9 },
    ];
    expect(mostLikelyCandidate(candidates, 55, 0.5)?.thicknessNm).toBe(50);
    expect(mostLikelyCandidate(candidates, 150, 0.5)?.thicknessNm).toBe(158);
  });
});
