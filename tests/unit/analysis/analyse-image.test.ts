// The colour analysis on raw pixels (no decoding): synthetic coupons of known sRGB colour.
import { describe, expect, it } from 'vitest';
import { converter, differenceCiede2000 } from 'culori';
import { analyseImage, AnalysisInputError, PIXEL_LIMITS, type Swatch } from '~/lib/analysis';
import { couponScene, GREY_CARD, illuminantACast, renderScene, TINTS, type Scene } from '../../fixtures/synthetic-photos';

// ΔE00 per Sharma, Wu & Dalal (2005) on CIELAB D65 per CIE 15 — both checked in tests/unit/colour/ (delta-e.test.ts, conversions.test.ts).
const ciede2000 = differenceCiede2000();
const toLab65 = converter('lab65');
const deltaE = (swatch: Swatch, hex: string) => ciede2000(toLab65(hex)!, { mode: 'lab65', ...swatch.lab });

const WIDTH = 400;
const HEIGHT = 300;
const tints = Object.entries(TINTS);

function flat(colour: string, extra: Partial<Scene> = {}): Scene {
  return { width: WIDTH, height: HEIGHT, background: colour, patches: [], ...extra };
}

describe('flat patches of known sRGB colour', () => {
  // Source: the colour written into the pixels; its CIELAB (D65) per CIE 15 via culori.
  it.each([...tints, ['grey card', GREY_CARD], ['dark bronze', '#241a10'], ['pale straw', '#e8dcb0']])('%s %s', (_name, hex) => {
    const [region] = analyseImage(renderScene(flat(hex))).regions;
    expect(region.swatches).toHaveLength(1);
    expect(region.swatches[0].hex).toBe(hex);
    expect(region.swatches[0].share).toBe(1);
    expect(deltaE(region.swatches[0], hex)).toBeLessThan(0.1);
    expect(region.mean!.hex).toBe(hex);
    expect(region.pixels).toMatchObject({ total: WIDTH * HEIGHT, used: WIDTH * HEIGHT });
  });

  // Source: CIE 15 CIELAB of sRGB #b8954a computed by culori (63.54, 4.5, 43.5 here rounded); the swatch carries both spaces.
  it('reports the swatch in CIELAB and OKLab', () => {
    const swatch = analyseImage(renderScene(flat(TINTS.straw))).regions[0].swatches[0];
    const lab = toLab65(TINTS.straw)!;
    const oklab = converter('oklab')(TINTS.straw)!;
    expect(swatch.lab.l).toBeCloseTo(lab.l, 1);
    expect(swatch.lab.a).toBeCloseTo(lab.a, 1);
    expect(swatch.lab.b).toBeCloseTo(lab.b, 1);
    expect(swatch.oklab.l).toBeCloseTo(oklab.l, 3);
    expect(swatch.oklab.a).toBeCloseTo(oklab.a, 3);
    expect(swatch.oklab.b).toBeCloseTo(oklab.b, 3);
    expect(swatch.spread).toBe(0);
  });
});

describe('two-layer stripes', () => {
  // Source: construction — 6 px bands alternating, 3 of every 5 bands straw, so shares 0.6 / 0.4.
  function stripes(first: string, second: string, sigma = 0): Scene {
    const bands = Array.from({ length: HEIGHT / 6 }, (_, band) => band).filter((band) => band % 5 >= 3);
    return flat(first, {
      patches: bands.map((band) => ({ region: { x: 0, y: band * 6, width: WIDTH, height: 6 }, colour: second })),
      noise: sigma ? { sigma, seed: 11 } : undefined,
    });
  }

  it.each([
    ['straw / blue', TINTS.straw, TINTS.blue],
    ['bronze / purple', TINTS.bronze, TINTS.purple],
    ['purple / light blue', TINTS.purple, TINTS.lightBlue],
  ])('%s, clean and with noise', (_name, first, second) => {
    for (const sigma of [0, 6]) {
      const [region] = analyseImage(renderScene(stripes(first, second, sigma))).regions;
      expect(region.swatches).toHaveLength(2);
      expect(region.swatches[0].share).toBeCloseTo(0.6, 2);
      expect(region.swatches[1].share).toBeCloseTo(0.4, 2);
      expect(deltaE(region.swatches[0], first)).toBeLessThan(2);
      expect(deltaE(region.swatches[1], second)).toBeLessThan(2);
    }
  });
});

describe('gaussian sensor noise (seeded)', () => {
  // Source: the known colour; noise of σ 4–12 code values around it must stay one swatch near it.
  it.each([4, 8, 12])('σ = %i stays one swatch within ΔE00 2', (sigma) => {
    for (const [, hex] of tints) {
      const [region] = analyseImage(renderScene(flat(hex, { noise: { sigma, seed: sigma } }))).regions;
      expect(region.swatches).toHaveLength(1);
      expect(deltaE(region.swatches[0], hex)).toBeLessThan(2);
      expect(deltaE(region.mean!, hex)).toBeLessThan(2);
      expect(region.swatches[0].spread).toBeGreaterThan(0);
    }
  });
});

describe('specular streaks', () => {
  // Source: the known colour; glare of the light source is left out by PIXEL_LIMITS (common practice, no source).
  it.each([
    ['clipped white', '#ffffff'],
    ['near-white', '#eeeae6'],
    ['clipped warm glint', '#fff0c8'],
  ])('%s streaks are left out', (_name, streak) => {
    const streaks = { count: 8, thickness: 5, colour: streak };
    const [clean] = analyseImage(renderScene(flat(TINTS.purple, { streaks }))).regions;
    expect(clean.pixels.highlight / clean.pixels.total).toBeGreaterThan(0.05);
    expect(clean.swatches).toHaveLength(1);
    expect(clean.swatches[0].hex).toBe(TINTS.purple);

    // With sensor noise some glare pixels fall just under the limits; the tint still dominates.
    const [noisy] = analyseImage(renderScene(flat(TINTS.purple, { streaks, noise: { sigma: 4, seed: 3 } }))).regions;
    expect(deltaE(noisy.swatches[0], TINTS.purple)).toBeLessThan(2);
    expect(noisy.swatches[0].share).toBeGreaterThan(0.95);
  });

  it('drops near-black pixels and says how many', () => {
    const scene = flat(TINTS.blue, { patches: [{ region: { x: 0, y: 0, width: WIDTH, height: 60 }, colour: '#0a0a0a' }] });
    const [region] = analyseImage(renderScene(scene)).regions;
    expect(PIXEL_LIMITS.darkMax).toBeGreaterThanOrEqual(10);
    expect(region.pixels.dark).toBe(WIDTH * 60);
    expect(region.swatches).toHaveLength(1);
    expect(region.swatches[0].hex).toBe(TINTS.blue);
  });

  it('gives no swatches for a region of glare only', () => {
    const [region] = analyseImage(renderScene(flat('#ffffff'))).regions;
    expect(region.swatches).toEqual([]);
    expect(region.mean).toBeNull();
  });
});

describe('grey card under a warm cast (CIE illuminant A)', () => {
  const cast = illuminantACast();

  // Source: the known colour. The cast scales linear sRGB by A's white point relative to D65
  // (CIE 15:2004 Table T.3); the grey card's mean undoes it to within ΔE00 2.
  it.each(tints)('%s comes back within ΔE00 2', (_name, hex) => {
    const { scene, layers, grey } = couponScene(WIDTH, HEIGHT, [hex, TINTS.bronze], { cast, noise: { sigma: 5, seed: 21 } });
    const image = renderScene(scene);
    const corrected = analyseImage(image, { regions: [layers[0].region], grey });
    expect(deltaE(corrected.regions[0].swatches[0], hex)).toBeLessThan(2);
    expect(corrected.whiteBalance?.greyMean.lab.b).toBeGreaterThan(20); // the card was photographed warm

    // Without the grey card the cast stays in the colour.
    const uncorrected = analyseImage(image, { regions: [layers[0].region] });
    expect(deltaE(uncorrected.regions[0].swatches[0], hex)).toBeGreaterThan(8);
  });

  it('makes the grey card itself neutral with Bradford too', () => {
    const { scene, grey } = couponScene(WIDTH, HEIGHT, [TINTS.straw, TINTS.blue], { cast });
    const [card] = analyseImage(renderScene(scene), { regions: [grey], grey, adaptation: 'bradford' }).regions;
    expect(Math.abs(card.swatches[0].lab.a)).toBeLessThan(0.5);
    expect(Math.abs(card.swatches[0].lab.b)).toBeLessThan(0.5);
  });

  it('refuses a grey card region with no usable pixels', () => {
    const scene = flat(TINTS.straw, { patches: [{ region: { x: 0, y: 0, width: 50, height: 50 }, colour: '#ffffff' }] });
    expect(() => analyseImage(renderScene(scene), { grey: { x: 0, y: 0, width: 50, height: 50 } })).toThrow(AnalysisInputError);
  });
});

describe('regions and k', () => {
  it('gives one result per region, in the order given, and the whole image without regions', () => {
    const { scene, layers } = couponScene(WIDTH, HEIGHT, [TINTS.straw, TINTS.blue]);
    const image = renderScene(scene);
    const result = analyseImage(image, { regions: [layers[1].region, layers[0].region] });
    expect(result.regions.map((region) => region.swatches[0].hex)).toEqual([TINTS.blue, TINTS.straw]);
    const whole = analyseImage(image).regions;
    expect(whole).toHaveLength(1);
    expect(whole[0].swatches.map((swatch) => swatch.hex).sort()).toEqual(['#3a3a3a', GREY_CARD, TINTS.blue, TINTS.straw].sort());
    const shares = whole[0].swatches.map((swatch) => swatch.share);
    expect(shares).toEqual([...shares].sort((a, b) => b - a));
  });

  it('returns exactly k swatches when k is given', () => {
    const image = renderScene(flat(TINTS.blue, { noise: { sigma: 8, seed: 2 } }));
    expect(analyseImage(image, { k: 3 }).regions[0].swatches).toHaveLength(3);
  });

  it('refuses a region outside the image', () => {
    expect(() => analyseImage(renderScene(flat(TINTS.blue)), { regions: [{ x: WIDTH, y: 0, width: 5, height: 5 }] })).toThrow(AnalysisInputError);
  });
});

describe('determinism', () => {
  it('gives identical output for the same input, and for a copy of it', () => {
    const { scene, layers, grey } = couponScene(WIDTH, HEIGHT, [TINTS.purple, TINTS.lightBlue], {
      cast: illuminantACast(),
      noise: { sigma: 10, seed: 5 },
      streaks: { count: 4, thickness: 3, colour: '#ffffff' },
    });
    const image = renderScene(scene);
    const options = { regions: [layers[0].region, layers[1].region, { x: 0, y: 0, width: WIDTH, height: HEIGHT }], grey };
    const first = analyseImage(image, options);
    expect(analyseImage(image, options)).toEqual(first);
    expect(JSON.stringify(analyseImage({ ...image, data: Uint8Array.from(image.data) }, options))).toBe(JSON.stringify(first));
  });
});
