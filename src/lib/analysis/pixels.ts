import { linearRgbToOklab, SRGB8_TO_LINEAR } from '~/lib/colour';
import { IDENTITY, type Matrix3 } from '~/lib/matrix';
import type { PixelCounts, Region } from './schemas';

/** Raw 8-bit sRGB pixels, row-major, `channels` bytes per pixel (RGB or RGBA). */
export interface PixelImage {
  data: Uint8Array | Uint8ClampedArray;
  width: number;
  height: number;
  channels: 3 | 4;
}

/**
 * Which pixels are left out, judged on the 8-bit values as photographed (before white balance),
 * because their colour is not a measurement of the surface. Common practice, no published source:
 * - dark: every channel ≤ 20 (shadows, gaps, the bench; noise dominates their hue);
 * - highlight: any channel ≥ 250 (clipped, so its hue is wrong) or every channel ≥ 230
 *   (a near-white glint of the light source off the metal);
 * - transparent: alpha below 255.
 */
export const PIXEL_LIMITS = { darkMax: 20, clippedMin: 250, nearWhiteMin: 230 } as const;

export interface CollectedPixels {
  /** OKLab of each used pixel, l a b interleaved. */
  oklab: Float64Array;
  /** Mean linear sRGB of the used pixels (after the matrix). */
  linearMean: [number, number, number];
  counts: PixelCounts;
}

/** Classifies a region's pixels and converts the usable ones to OKLab, through `matrix` in linear sRGB. */
export function collectPixels(image: PixelImage, region: Region, matrix: Matrix3 = IDENTITY): CollectedPixels {
  const { data, width, channels } = image;
  const total = region.width * region.height;
  const oklab = new Float64Array(total * 3);
  const counts: PixelCounts = { total, used: 0, dark: 0, highlight: 0, transparent: 0 };
  const sum = [0, 0, 0];
  const identity = matrix === IDENTITY;
  const [m0, m1, m2] = matrix;
  for (let y = region.y; y < region.y + region.height; y += 1) {
    let offset = (y * width + region.x) * channels;
    for (let x = 0; x < region.width; x += 1, offset += channels) {
      if (channels === 4 && data[offset + 3] < 255) {
        counts.transparent += 1;
        continue;
      }
      const red = data[offset];
      const green = data[offset + 1];
      const blue = data[offset + 2];
      const brightest = Math.max(red, green, blue);
      if (brightest <= PIXEL_LIMITS.darkMax) {
        counts.dark += 1;
        continue;
      }
      if (brightest >= PIXEL_LIMITS.clippedMin || Math.min(red, green, blue) >= PIXEL_LIMITS.nearWhiteMin) {
        counts.highlight += 1;
        continue;
      }
      let r = SRGB8_TO_LINEAR[red];
      let g = SRGB8_TO_LINEAR[green];
      let b = SRGB8_TO_LINEAR[blue];
      if (!identity) {
        const mr = m0[0] * r + m0[1] * g + m0[2] * b;
        const mg = m1[0] * r + m1[1] * g + m1[2] * b;
        b = m2[0] * r + m2[1] * g + m2[2] * b;
        r = mr;
        g = mg;
      }
      sum[0] += r;
      sum[1] += g;
      sum[2] += b;
      const colour = linearRgbToOklab(r, g, b);
      const at = counts.used * 3;
      oklab[at] = colour.l;
      oklab[at + 1] = colour.a;
      oklab[at + 2] = colour.b;
      counts.used += 1;
    }
  }
  const used = Math.max(counts.used, 1);
  return {
    oklab: oklab.subarray(0, counts.used * 3),
    linearMean: [sum[0] / used, sum[1] / used, sum[2] / used],
    counts,
  };
}
