import { differenceCiede2000 } from 'culori';
import { describe, expect, it } from 'vitest';
import { boxCells, deltaE00Box, insideBox, LAB_CELL, MAX_BOXED_DELTA_E } from '~/lib/library/colour-box';
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

  it('holds where its hue and chroma bounds bite: centres all round the hue circle, low to high chroma', () => {
    // Sample inside a cube as wide as the cross term's worst case allows (the box with RT = √3,
    // from the derivation's first bound), so colours the tighter box leaves out are tested too.
    const random = seededRandom(99);
    let inside = 0;
    for (let trial = 0; trial < 400; trial += 1) {
      const t = [1, 3, 6, 10][trial % 4];
      const hue = random() * 2 * Math.PI;
      const chroma = [0.3, 5, 20, 45, 80][trial % 5] * (0.8 + 0.4 * random());
      const centre = { l: 20 + random() * 70, a: chroma * Math.cos(hue), b: chroma * Math.sin(hue) };
      const box = deltaE00Box(centre, t)!;
      const k = 1 + Math.sqrt(3);
      const worst = (k * t * (1 + 0.045 * Math.hypot(1.5 * centre.a, centre.b))) / (1 - 0.0225 * k * t);
      const dL = box.l[1] - centre.l;
      for (let sample = 0; sample < 400; sample += 1) {
        const other = {
          l: centre.l + (random() - 0.5) * 2 * dL * 1.2,
          a: centre.a + (random() - 0.5) * 2 * Math.min(worst, 3 * t + 40),
          b: centre.b + (random() - 0.5) * 2 * Math.min(worst, 3 * t + 40),
        };
        const difference = dE(centre, other);
        if (difference <= t) {
          inside += 1;
          expect(insideBox(box, other), `${JSON.stringify(centre)} → ${JSON.stringify(other)}: ΔE00 ${difference} ≤ ${t}`).toBe(true);
        }
      }
    }
    expect(inside).toBeGreaterThan(2_000);
  });

  it('is tighter than the worst case of the cross term away from blue and near grey', () => {
    const k = 1 + Math.sqrt(3);
    const worstCase = (centre: { a: number; b: number }, t: number) => (k * t * (1 + 0.045 * Math.hypot(1.5 * centre.a, centre.b))) / (1 - 0.0225 * k * t);
    // Straw (h ≈ 85°): the mean hue stays within 90° of it, where Δθ = 30°·exp(−(100/25)²) ≈ 0, so the
    // bound is the one with no cross term: t·(1 + 0.045·C1')/(1 − 0.0225·t), to a hair.
    const straw = { l: 68, a: 5, b: 60 };
    const noCrossTerm = (5 * (1 + 0.045 * Math.hypot(7.5, 60))) / (1 - 0.0225 * 5);
    expect(deltaE00Box(straw, 5)!.a[1] - straw.a).toBeCloseTo(noCrossTerm, 3);
    expect(noCrossTerm).toBeLessThan(worstCase(straw, 5) / 3);
    // Grey: RC is small while the mean chroma stays low.
    const grey = { l: 57, a: 0, b: 0 };
    expect(deltaE00Box(grey, 10)!.a[1]).toBeLessThan(worstCase(grey, 10) / 4);
    // Saturated blue near 275°: the cross term can be at its worst, and the box stays as wide.
    const blue = { l: 40, a: 5, b: -45 };
    expect(deltaE00Box(blue, 2)!.a[1] - blue.a).toBeGreaterThan(0.9 * worstCase(blue, 2));
  });
});

describe('boxCells', () => {
  it('names the cell of every colour inside the box, as the database computes floor(L*/2) and floor(a*/4)', () => {
    const random = seededRandom(5);
    for (let trial = 0; trial < 100; trial += 1) {
      const box = deltaE00Box({ l: random() * 100, a: (random() - 0.5) * 200, b: (random() - 0.5) * 200 }, 0.2 + random() * 9)!;
      const cells = boxCells(box);
      expect(cells.l).toEqual([...cells.l].sort((x, y) => x - y));
      for (let sample = 0; sample < 20; sample += 1) {
        const l = box.l[0] + random() * (box.l[1] - box.l[0]);
        const a = box.a[0] + random() * (box.a[1] - box.a[0]);
        expect(cells.l).toContain(Math.floor(l / LAB_CELL.l));
        expect(cells.a).toContain(Math.floor(a / LAB_CELL.a));
      }
      // The edges themselves, and no cell beyond them.
      expect(cells.l[0]).toBe(Math.floor(box.l[0] / 2));
      expect(cells.l.at(-1)).toBe(Math.floor(box.l[1] / 2));
      expect(cells.a[0]).toBe(Math.floor(box.a[0] / 4));
      expect(cells.a.at(-1)).toBe(Math.floor(box.a[1] / 4));
    }
  });
});
