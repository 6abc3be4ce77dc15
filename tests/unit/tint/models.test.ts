import { describe, expect, it } from 'vitest';
import { alloyCatalogue } from '~/lib/alloys';
import { modelledSlugs } from '~/lib/tint/alloys';
import { findTintModel, tintModels } from '~/lib/tint/models';

describe('the model registry', () => {
  it('covers exactly the alloy catalogue', () => {
    expect([...modelledSlugs].sort()).toEqual(alloyCatalogue.map((alloy) => alloy.slug).sort());
    expect(tintModels.map((model) => model.alloy.slug).sort()).toEqual([...modelledSlugs].sort());
  });

  it.each([
    ['titanium', true, true, true],
    ['carbon-steel', true, true, false],
    ['stainless-steel', false, false, false],
    ['copper', false, false, false],
    ['bronze', false, false, false],
    ['brass', false, false, false],
    ['zirconium', true, false, false],
    ['niobium', true, false, true],
  ] as const)('%s: optics %s, heat %s, anodizing %s', (family, optics, heat, anodize) => {
    for (const model of tintModels.filter((m) => m.alloy.family === family)) {
      expect(model.optics !== null).toBe(optics);
      expect(model.heat !== null).toBe(heat);
      expect(model.anodize !== null).toBe(anodize);
    }
  });

  it('returns undefined for a slug outside the catalogue', () => {
    expect(findTintModel('unobtainium')).toBeUndefined();
  });

  it('names a source for every prior', () => {
    for (const model of tintModels) {
      if (model.heat) expect(model.heat.source.length).toBeGreaterThan(20);
      if (model.anodize) expect(model.anodize.source.length).toBeGreaterThan(20);
    }
  });
});
