// Specular highlights on a coupon: up to a tenth of a region in glints (isolated bright pixels) or
// streaks must not move the dominant swatch by more than ΔE00 2. Measured the way an upload is:
// JPEG, decoded and shrunk by src/lib/server/photos/decode.ts, then analysed.
import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { differenceCiede2000 } from 'culori';
import { analyseImage, scaleRegion, type Region } from '~/lib/analysis';
import { decodeForAnalysis, fitInside, ANALYSIS_LONG_SIDE } from '~/lib/server/photos/decode';
import { analyseDecoded } from '~/lib/server/photos/measure';
import { addSpeckle, addStreaks, couponScene, encodeJpeg, renderScene, TINTS } from '../../fixtures/synthetic-photos';

const ciede2000 = differenceCiede2000();
const distance = (first: { l: number; a: number; b: number }, second: { l: number; a: number; b: number }) =>
  ciede2000({ mode: 'lab65', ...first }, { mode: 'lab65', ...second });

// Glints: a clipped white, and a soft glint that is bright but under every per-pixel limit (PIXEL_LIMITS).
const GLINTS = [
  ['clipped white', '#ffffff'],
  ['soft glint', '#e6dfd6'],
] as const;

function photo(width: number, height: number, tint: string) {
  const { scene, layers, grey } = couponScene(width, height, [tint, TINTS.straw], { noise: { sigma: 4, seed: 9 } });
  return { image: renderScene(scene), region: layers[0].region, grey };
}

async function dominant(image: ReturnType<typeof renderScene>, region: Region) {
  const decoded = await decodeForAnalysis(await encodeJpeg(image));
  return analyseDecoded(decoded, { regions: [region] }).regions[0].swatches[0];
}

/** The dominant swatch as a plain resize (sharp's default) would give it: glints averaged in before any rejection. */
async function dominantAfterPlainResize(image: ReturnType<typeof renderScene>, region: Region) {
  const { data, info } = await sharp(await encodeJpeg(image))
    .resize(fitInside(ANALYSIS_LONG_SIDE))
    .raw()
    .toBuffer({ resolveWithObject: true });
  const shrunk = { data: new Uint8Array(data), width: info.width, height: info.height, channels: info.channels as 3 };
  return analyseImage(shrunk, { regions: [scaleRegion(region, image, shrunk)] }).regions[0].swatches[0];
}

describe('glints and streaks on a 2400 × 1600 photo', () => {
  const tints = [
    ['purple', TINTS.purple],
    ['straw', TINTS.straw],
  ] as const;

  describe.each(tints)('%s film', (_name, tint) => {
    const clean = photo(2400, 1600, tint);
    let reference: Awaited<ReturnType<typeof dominant>>;

    it.each(GLINTS)('%s speckle at 5 % and 10 % moves the dominant swatch by under ΔE00 2', async (_glint, colour) => {
      reference ??= await dominant(clean.image, clean.region);
      for (const fraction of [0.05, 0.1]) {
        const { image, region } = photo(2400, 1600, tint);
        // Source: construction — the share of the region's pixels set to the glint.
        expect(addSpeckle(image, region, fraction, colour, 7)).toBeCloseTo(fraction, 2);
        const measured = await dominant(image, region);
        // Source: the brief's limit, ΔE00 2 (Sharma, Wu & Dalal 2005), against the same photo without glints.
        expect(distance(measured.lab, reference.lab)).toBeLessThan(2);
      }
    });

    it.each(GLINTS)('%s streaks at 5 % and 10 % move the dominant swatch by under ΔE00 2', async (_glint, colour) => {
      reference ??= await dominant(clean.image, clean.region);
      for (const fraction of [0.05, 0.1]) {
        const { image, region } = photo(2400, 1600, tint);
        expect(addStreaks(image, region, fraction, colour, 3)).toBeCloseTo(fraction, 2);
        const measured = await dominant(image, region);
        expect(distance(measured.lab, reference.lab)).toBeLessThan(2);
      }
    });
  });

  it('is the shrink that matters: a plain resize lets 10 % soft speckle move the colour by more than ΔE00 2', async () => {
    const clean = photo(2400, 1600, TINTS.blue);
    const speckled = photo(2400, 1600, TINTS.blue);
    addSpeckle(speckled.image, speckled.region, 0.1, '#e6dfd6', 7);
    const before = await dominantAfterPlainResize(clean.image, clean.region);
    const after = await dominantAfterPlainResize(speckled.image, speckled.region);
    expect(distance(before.lab, after.lab)).toBeGreaterThan(2);
  });
});

describe('glints and streaks on a 24 MP photo (6000 × 4000), decoded at half scale before the shrink', () => {
  // A 24 MP JPEG is decoded by libjpeg at 1/2 scale (decode.ts), which averages each glint pixel
  // with its neighbours before the glint-rejecting shrink sees it: one film, 10 % of its region.
  const clean = photo(6000, 4000, TINTS.purple);
  let reference: Awaited<ReturnType<typeof dominant>>;

  it.each(GLINTS)(
    '%s speckle and streaks at 10 % move the dominant swatch by under ΔE00 2',
    async (_glint, colour) => {
      reference ??= await dominant(clean.image, clean.region);
      for (const add of [addSpeckle, addStreaks]) {
        const { image, region } = photo(6000, 4000, TINTS.purple);
        // Source: construction — the share of the region's pixels set to the glint.
        expect(add(image, region, 0.1, colour, add === addSpeckle ? 7 : 3)).toBeCloseTo(0.1, 2);
        const measured = await dominant(image, region);
        // Source: the brief's limit, ΔE00 2 (Sharma, Wu & Dalal 2005), against the same photo without glints.
        expect(distance(measured.lab, reference.lab), add.name).toBeLessThan(2);
      }
    },
    60_000,
  );
});
