import { SRGB8_TO_LINEAR } from '~/lib/colour';
import { PIXEL_LIMITS, type PixelImage } from './pixels';

/**
 * A shrink that keeps glints out of the colours. A plain resize averages every pixel of a cell,
 * so a speckle of specular highlights (or a thin streak) brightens the whole cell and no later
 * rejection can find it. Here each output pixel is the mean, in linear light, of the cell's
 * pixels that
 * - are not left out by PIXEL_LIMITS (clipped, near-white or near-black), and
 * - are within GLINT_BAND of the cell's median brightness (the brightest channel), so a blended
 *   glint or a shadow edge in the cell does not pull the rest.
 * A cell with no such pixel takes its median pixel as it is (a highlight then stays a highlight).
 * The band is a product choice (noise of σ 12 code values stays inside it), not a published value.
 */
export const GLINT_BAND = { relative: 0.25, absolute: 12 } as const;

const linearToSrgb8 = (value: number) => {
  const encoded = value <= 0.0031308 ? 12.92 * value : 1.055 * value ** (1 / 2.4) - 0.055;
  return Math.round(Math.min(1, Math.max(0, encoded)) * 255);
};

/** Shrinks `image` to `width` × `height` (each at most the image's own), leaving glints and shadows out of each cell's mean. */
export function shrinkRejectingGlare(image: PixelImage, width: number, height: number): PixelImage {
  if (width >= image.width && height >= image.height) return image;
  const { data, channels } = image;
  const out = new Uint8Array(width * height * channels);
  const scaleX = image.width / width;
  const scaleY = image.height / height;
  const maxCell = (Math.ceil(scaleX) + 1) * (Math.ceil(scaleY) + 1);
  const brightness = new Int16Array(maxCell);
  const offsets = new Int32Array(maxCell);
  const sorted = new Int16Array(maxCell);
  for (let oy = 0; oy < height; oy += 1) {
    const top = Math.floor(oy * scaleY);
    const bottom = Math.max(top + 1, Math.floor((oy + 1) * scaleY));
    for (let ox = 0; ox < width; ox += 1) {
      const left = Math.floor(ox * scaleX);
      const right = Math.max(left + 1, Math.floor((ox + 1) * scaleX));
      let n = 0;
      for (let y = top; y < bottom; y += 1) {
        let offset = (y * image.width + left) * channels;
        for (let x = left; x < right; x += 1, offset += channels) {
          if (channels === 4 && data[offset + 3] < 255) continue;
          const value = Math.max(data[offset], data[offset + 1], data[offset + 2]);
          // Insertion into a sorted copy: cells hold a few dozen pixels at most.
          let at = n;
          while (at > 0 && sorted[at - 1] > value) {
            sorted[at] = sorted[at - 1];
            at -= 1;
          }
          sorted[at] = value;
          brightness[n] = value;
          offsets[n] = offset;
          n += 1;
        }
      }
      const target = (oy * width + ox) * channels;
      if (n === 0) continue; // all transparent: stays transparent (alpha 0)
      const median = sorted[n >> 1];
      const band = GLINT_BAND.relative * median + GLINT_BAND.absolute;
      let r = 0;
      let g = 0;
      let b = 0;
      let kept = 0;
      for (let i = 0; i < n; i += 1) {
        const value = brightness[i];
        if (Math.abs(value - median) > band || value <= PIXEL_LIMITS.darkMax || value >= PIXEL_LIMITS.clippedMin) continue;
        const offset = offsets[i];
        if (Math.min(data[offset], data[offset + 1], data[offset + 2]) >= PIXEL_LIMITS.nearWhiteMin) continue;
        r += SRGB8_TO_LINEAR[data[offset]];
        g += SRGB8_TO_LINEAR[data[offset + 1]];
        b += SRGB8_TO_LINEAR[data[offset + 2]];
        kept += 1;
      }
      if (kept === 0) {
        let pick = 0;
        while (brightness[pick] !== median) pick += 1;
        out.set(data.subarray(offsets[pick], offsets[pick] + 3), target);
      } else {
        out[target] = linearToSrgb8(r / kept);
        out[target + 1] = linearToSrgb8(g / kept);
        out[target + 2] = linearToSrgb8(b / kept);
      }
      if (channels === 4) out[target + 3] = 255;
    }
  }
  return { data: out, width, height, channels };
}
