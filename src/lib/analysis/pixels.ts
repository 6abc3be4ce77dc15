import { SRGB8_TO_LINEAR } from '~/lib/colour';
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

/**
 * Linear sRGB → OKLab, written into `out` at `at` (l, a, b): Ottosson's matrices ("A perceptual color space
 * for image processing", 2020) with the same constants and order of operations as culori's
 * convertLrgbToOklab, so the numbers are the same to the last bit; inlined here because a photo has
 * hundreds of thousands of pixels and an object for each is most of the cost of measuring them.
 */
export function writeOklab(r: number, g: number, b: number, out: Float64Array, at: number): void {
  const lms0 = Math.cbrt(0.412221469470763 * r + 0.5363325372617348 * g + 0.0514459932675022 * b);
  const lms1 = Math.cbrt(0.2119034958178252 * r + 0.6806995506452344 * g + 0.1073969535369406 * b);
  const lms2 = Math.cbrt(0.0883024591900564 * r + 0.2817188391361215 * g + 0.6299787016738222 * b);
  out[at] = 0.210454268309314 * lms0 + 0.7936177747023054 * lms1 - 0.0040720430116193 * lms2;
  out[at + 1] = 1.9779985324311684 * lms0 - 2.4285922420485799 * lms1 + 0.450593709617411 * lms2;
  out[at + 2] = 0.0259040424655478 * lms0 + 0.7827717124575296 * lms1 - 0.8086757549230774 * lms2;
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
      writeOklab(r, g, b, oklab, counts.used * 3);
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
