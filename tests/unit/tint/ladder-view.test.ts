import { describe, expect, it } from 'vitest';
import { ladderAlloyOptions, plannerAlloyOptions } from '~/lib/tint/alloy-options';
import { ladderView } from '~/lib/tint/ladder-view';
import { findTintModel } from '~/lib/tint/models';

const ti64 = findTintModel('ti-grade-5')!;
const view = ladderView(ti64, 'D65');

/** True when `wanted` appears in `sequence` in the same order (other names may come between). */
function inOrder(sequence: readonly string[], wanted: readonly string[]): boolean {
  let i = 0;
  for (const name of sequence) if (name === wanted[i]) i += 1;
  return i === wanted.length;
}

describe('the tint ladder page view', () => {
  it('names titanium’s bands in the order practice reports', () => {
    // Source: REFERENCES.md, colour sequence of films on titanium with thickness, typical practice
    // [from memory]: straw → bronze → purple → blue → light blue → gold → rose → green.
    const names = view.bands.map((band) => band.name);
    expect(inOrder(names, ['straw', 'bronze', 'purple', 'blue', 'light blue', 'second-order gold', 'second-order rose', 'third-order green'])).toBe(true);
  });

  it('covers 0–600 nm with bands that meet end to end', () => {
    expect(view.bands[0].fromNm).toBe(0);
    expect(view.bands.at(-1)!.toNm).toBe(600);
    for (let i = 1; i < view.bands.length; i += 1) expect(view.bands[i].fromNm).toBe(view.bands[i - 1].toNm + 1);
    const width = view.bands.reduce((sum, band) => sum + band.widthPercent, 0);
    expect(width).toBeCloseTo(100, 1);
  });

  it('puts names on the strip only where they do not overlap', () => {
    const centres = view.bands.filter((band) => band.labelled).map((band) => band.leftPercent + band.widthPercent / 2);
    for (let i = 1; i < centres.length; i += 1) expect(centres[i] - centres[i - 1]).toBeGreaterThanOrEqual(2.2);
    // The 0–200 nm detail view has room for every first-order name.
    const detail = ladderView(ti64, 'D65', { toNm: 200, drawStepNm: 1 });
    const labelled = detail.bands.filter((band) => band.labelled).map((band) => band.name);
    expect(inOrder(labelled, ['straw', 'gold', 'bronze', 'purple', 'blue', 'light blue'])).toBe(true);
  });

  it('draws a stop every 2 nm, a tick every 50 nm and a table row every 10 nm', () => {
    expect(view.gradient.match(/#[0-9a-f]{6} [\d.]+%/g)).toHaveLength(301);
    expect(view.ticks.map((tick) => tick.thicknessNm)).toEqual([0, 50, 100, 150, 200, 250, 300, 350, 400, 450, 500, 550, 600]);
    expect(view.steps).toHaveLength(61);
    // Source: Int. J. Biomaterials 2015, 395657, Table 1 — 50 nm on Ti-6Al-4V is blue.
    expect(view.steps.find((step) => step.thicknessNm === 50)?.name).toBe('blue');
  });

  it('colours the same film differently under warm light, but keeps its name', () => {
    const warm = ladderView(ti64, 'A');
    expect(warm.steps[5].hex).not.toBe(view.steps[5].hex);
    expect(warm.steps.map((step) => step.name)).toEqual(view.steps.map((step) => step.name));
  });
});

describe('the alloys the pages offer', () => {
  it('offer a ladder only where there is an optical model, and plan only where there is growth too', () => {
    const ladder = ladderAlloyOptions().flatMap((group) => group.alloys.map((alloy) => alloy.slug));
    const planner = plannerAlloyOptions().flatMap((group) => group.alloys);
    expect(ladder).toContain('zirconium-702');
    expect(ladder).not.toContain('steel-304');
    expect(planner.map((alloy) => alloy.slug)).not.toContain('zirconium-702');
    expect(planner.find((alloy) => alloy.slug === 'niobium')).toMatchObject({ heat: false, anodize: true });
  });
});
