// Measuring only the drawn regions: the glint-rejecting shrink made for a part of the copy, from
// only the decoded pixels under it, must give those cells exactly what the shrink of the whole
// photo gives them. Source: an independent computation — the whole-photo shrink, decoded and
// shrunk in full, with the part's cells compared one by one.
import { describe, expect, it } from 'vitest';
import { shrinkRejectingGlare, sourceOfCells, type PixelImage, type Region } from '~/lib/analysis';
import { seededRandom } from '~/lib/random';
import { decodeForAnalysis } from '~/lib/server/photos/decode';
import { analyseDecoded } from '~/lib/server/photos/measure';
import { addSpeckle, couponScene, encodeJpeg, renderScene, TINTS } from '../../fixtures/synthetic-photos';

/** A noisy image with bright speckle, so cells take both the sorted and the unsorted path. */
function noisyImage(width: number, height: number, channels: 3 | 4): PixelImage {
  const random = seededRandom(41);
  const data = new Uint8Array(width * height * channels);
  for (let i = 0; i < data.length; i += channels) {
    const glint = random() < 0.1;
    for (let c = 0; c < 3; c += 1) data[i + c] = glint ? 245 : 60 + c * 40 + Math.floor(random() * 30);
    if (channels === 4) data[i + 3] = 255;
  }
  return { data, width, height, channels };
}

/** The pixels of `region` copied out of `image`, as sharp's extract gives them. */
function cut(image: PixelImage, region: Region): PixelImage {
  const { channels } = image;
  const data = new Uint8Array(region.width * region.height * channels);
  for (let y = 0; y < region.height; y += 1) {
    const start = ((region.y + y) * image.width + region.x) * channels;
    data.set(image.data.subarray(start, start + region.width * channels), y * region.width * channels);
  }
  return { data, width: region.width, height: region.height, channels };
}

describe('the glint-rejecting shrink of a part of the copy', () => {
  it.each([
    ['RGB, 2.3 pixels a cell', 3, 97, 61, 42, 26, { x: 5, y: 3, width: 17, height: 11 }],
    ['RGBA, 3 pixels a cell', 4, 90, 60, 30, 20, { x: 0, y: 9, width: 30, height: 11 }],
    ['RGB, one cell at the far corner', 3, 50, 35, 20, 14, { x: 19, y: 13, width: 1, height: 1 }],
  ] as const)('%s: its cells match the whole shrink and the rest stays 0', (_case, channels, width, height, outWidth, outHeight, cells) => {
    const image = noisyImage(width, height, channels);
    const whole = shrinkRejectingGlare(image, outWidth, outHeight);
    const part = { cells, from: { width, height } };
    const source = sourceOfCells(part, outWidth, outHeight);
    const partial = shrinkRejectingGlare(cut(image, source), outWidth, outHeight, part);
    expect(partial).toMatchObject({ width: outWidth, height: outHeight, channels });
    for (let y = 0; y < outHeight; y += 1) {
      for (let x = 0; x < outWidth; x += 1) {
        const at = (y * outWidth + x) * channels;
        const inside = x >= cells.x && x < cells.x + cells.width && y >= cells.y && y < cells.y + cells.height;
        const expected = inside ? [...whole.data.subarray(at, at + channels)] : new Array<number>(channels).fill(0);
        expect([...partial.data.subarray(at, at + channels)]).toEqual(expected);
      }
    }
  });

  it('gives a photo over 4096 pixels long (decoded at half scale) the same measurements as decoding all of it', async () => {
    const { scene, layers, grey } = couponScene(4100, 1400, [TINTS.purple, TINTS.straw], { noise: { sigma: 6, seed: 17 } });
    const image = renderScene(scene);
    addSpeckle(image, layers[0].region, 0.1, '#e6dfd6', 5);
    const jpeg = await encodeJpeg(image);
    const options = { regions: layers.map((layer) => layer.region), grey };
    const whole = analyseDecoded(await decodeForAnalysis(jpeg), options);
    const part = analyseDecoded(await decodeForAnalysis(jpeg, [...options.regions, grey]), options);
    expect(part).toEqual(whole);
  }, 180_000);
});
