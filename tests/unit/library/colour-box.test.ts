import { differenceCiede2000 } from 'culori';
import { describe, expect, it } from 'vitest';
import { deltaE00Box, insideBox, MAX_BOXED_DELTA_E } from '~/lib/library/colour-box';
import { seededRandom } from '~/lib/random';

// An independent CIEDE2000: culori's (kL = kC = kH = 1), itself checked against Sharma, Wu &
// Dalal (2005) Table 1 beside our own in tests/unit/colour/delta-e.test.ts.
const ciede2000 = differenceCiede2000();
const lab = (l: number, a: number, b: number) => ({ mode: 'lab65' as const, l, a, b });
const dE = (p: { l: number; a: number; b: number }, q: { l: number; a: number; b: number }) => ciede2000(lab(p.l, p.a, p.b), lab(q.l, q.a, q.b));

describe('deltaE00Box', () => {
  it('never leaves out a colour within the limit (brute force over many random pairs near the limit)', () => {
    const random = seededRandom(20260112);
    let checked = 0;
    let nearEdge = 0;
    for (let trial = 0; trial < 1500; trial += 1) {
      const t = [0.5, 1, 2, 3, 5, 8, 12][trial % 7];
      const centre = { l: random() * 100, a: (random() - 0.5) * 220, b: (random() - 0.5) * 220 };
      const box = deltaE00Box(centre, t)!;
      // Walk out along a random direction (lightness and chroma plane weighted differently)
      // in small steps, testing every point while ΔE00 stays within the limit.
      const direction = { l: random() - 0.5, a: random() - 0.5, b: random() - 0.5 };
      const norm = Math.hypot(direction.l, direction.a, direction.b);
      for (let step = 1; step < 200; step += 1) {
        const distance = step * 0.08 * t;
        const other = {
          l: centre.l + (direction.l / norm) * distance,
          a: centre.a + (direction.a / norm) * distance,
          b: centre.b + (direction.b / norm) * distance,
        };
        const difference = dE(centre, other);
        if (difference > t) break;
        checked += 1;
        if (difference > 0.9 * t) nearEdge += 1;
        expect(insideBox(box, other), `${JSON.stringify(centre)} → ${JSON.stringify(other)}: ΔE00 ${difference} ≤ ${t}`).toBe(true);
      }
    }
    expect(checked).toBeGreaterThan(5_000);
    expect(nearEdge).toBeGreaterThan(1_000);
  });

  it('holds for the worst cases of the cross term: blue hues near 275°, high chroma, and grey', () => {
    // Source: Sharma, Wu & Dalal (2005): RT peaks in the blue region (h̄' near 275°) and at high chroma.
    const random = seededRandom(7);
    for (const centre of [
      { l: 50, a: 2.6772, b: -79.7751 },
      { l: 30, a: 10, b: -110 },
      { l: 50, a: 0, b: 0 },
      { l: 2, a: 0.5, b: -0.5 },
      { l: 98, a: -60, b: 90 },
    ]) {
      for (const t of [1, 4, 10]) {
        const box = deltaE00Box(centre, t)!;
        for (let sample = 0; sample < 5_000; sample += 1) {
          // Uniform in a cube twice the box's size: points outside the box must be beyond t.
          const other = {
            l: centre.l + (random() - 0.5) * 2 * (box.l[1] - box.l[0]),
            a: centre.a + (random() - 0.5) * 2 * (box.a[1] - box.a[0]),
            b: centre.b + (random() - 0.5) * 2 * (box.b[1] - box.b[0]),
          };
          if (!insideBox(box, other)) expect(dE(centre, other)).toBeGreaterThan(t);
        }
      }
    }
  });

  it('is small enough to be worth an index: about ±t in L* at mid grey', () => {
    const box = deltaE00Box({ l: 50, a: 0, b: 0 }, 2)!;
    expect(box.l[1] - 50).toBeLessThan(2.1);
    // The derivation's own figure for the chroma plane: 2·(1 + √3)/(1 − 0.0225·(1 + √3)·2) ≈ 6.23.
    expect(box.a[1]).toBeLessThan(6.3);
  });

  it('gives no box for limits beyond its derivation, and none for nonsense', () => {
    expect(deltaE00Box({ l: 50, a: 0, b: 0 }, MAX_BOXED_DELTA_E + 1)).toBeNull();
    expect(deltaE00Box({ l: 50, a: 0, b: 0 }, Number.NaN)).toBeNull();
  });
});
