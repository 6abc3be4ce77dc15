import { SRGB8_TO_LINEAR } from '~/lib/colour';
import { PIXEL_LIMITS, type PixelImage } from './pixels';
import type { Size } from './regions';
import type { Region } from './schemas';

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

/** Linear light (0–1) → 8-bit sRGB (IEC 61966-2-1), by a table of ENCODE_STEPS steps (finer than one code value everywhere). */
const ENCODE_STEPS = 16384;
const ENCODE = Uint8Array.from({ length: ENCODE_STEPS + 1 }, (_, i) => {
  const value = i / ENCODE_STEPS;
  const encoded = value <= 0.0031308 ? 12.92 * value : 1.055 * value ** (1 / 2.4) - 0.055;
  return Math.round(encoded * 255);
});
const encode = (value: number) => ENCODE[Math.round(value * ENCODE_STEPS)];

/** A part of the shrunk image: `cells` (pixels of the shrunk image) and the full size of the image they are shrunk from. */
export interface ShrinkPart {
  cells: Region;
  from: Size;
}

/** The pixels of the full image (`from`) that the cells of `part` are made from, so only they need decoding. */
export function sourceOfCells(part: ShrinkPart, width: number, height: number): Region {
  const { cells, from } = part;
  const scaleX = from.width / width;
  const scaleY = from.height / height;
  const left = Math.min(from.width - 1, Math.floor(cells.x * scaleX));
  const top = Math.min(from.height - 1, Math.floor(cells.y * scaleY));
  const lastLeft = Math.min(from.width, Math.floor((cells.x + cells.width - 1) * scaleX));
  const right = Math.min(from.width, Math.max(lastLeft + 1, Math.floor((cells.x + cells.width) * scaleX)));
  const lastTop = Math.floor((cells.y + cells.height - 1) * scaleY);
  const bottom = Math.min(from.height, Math.max(lastTop + 1, Math.floor((cells.y + cells.height) * scaleY)));
  return { x: left, y: top, width: right - left, height: bottom - top };
}

/**
 * Shrinks `image` to `width` × `height` (each at most the image's own), leaving glints and shadows
 * out of each cell's mean. With `part`, `image` holds only the pixels sourceOfCells(part) names and
 * only part.cells are made; every other pixel of the result stays 0 (black, or transparent with alpha).
 */
export function shrinkRejectingGlare(image: PixelImage, width: number, height: number, part?: ShrinkPart): PixelImage {
  const full = part?.from ?? image;
  if (!part && width >= image.width && height >= image.height) return image;
  const cells = part?.cells ?? { x: 0, y: 0, width, height };
  const source = part ? sourceOfCells(part, width, height) : { x: 0, y: 0 };
  const { data, channels } = image;
  const rowLength = image.width * channels;
  const out = new Uint8Array(width * height * channels);
  const scaleX = full.width / width;
  const scaleY = full.height / height;
  const maxCell = (Math.ceil(scaleX) + 1) * (Math.ceil(scaleY) + 1);
  const brightness = new Int32Array(maxCell);
  const offsets = new Int32Array(maxCell);
  const sorted = new Int32Array(maxCell);
  const { darkMax, clippedMin, nearWhiteMin } = PIXEL_LIMITS;
  // 255 when there is no alpha channel to look at, so the test per pixel is one comparison of a constant.
  const opaque = channels === 4 ? 0 : 255;
  const lights = SRGB8_TO_LINEAR;
  // Cell edges in pixels of `image` (which starts at `source` in the full image).
  const lefts = Int32Array.from({ length: width + 1 }, (_, ox) => Math.min(full.width, Math.floor(ox * scaleX)) - source.x);
  for (let oy = cells.y; oy < cells.y + cells.height; oy += 1) {
    const fullTop = Math.floor(oy * scaleY);
    const top = fullTop - source.y;
    const bottom = Math.max(fullTop + 1, Math.floor((oy + 1) * scaleY)) - source.y;
    for (let ox = cells.x; ox < cells.x + cells.width; ox += 1) {
      const left = lefts[ox];
      const right = Math.max(left + 1, lefts[ox + 1]);
      // First pass: the cell's range of brightness (each pixel's brightest channel) and the linear
      // sums of the pixels PIXEL_LIMITS keeps. Nothing is stored per pixel: most cells have no outlier.
      let n = 0;
      let lowest = 255;
      let highest = 0;
      let r = 0;
      let g = 0;
      let b = 0;
      let kept = 0;
      for (let y = top; y < bottom; y += 1) {
        let offset = y * rowLength + left * channels;
        for (let x = left; x < right; x += 1, offset += channels) {
          if (opaque < 255 && data[offset + 3] < 255) continue;
          const red = data[offset];
          const green = data[offset + 1];
          const blue = data[offset + 2];
          const value = red > green ? (red > blue ? red : blue) : green > blue ? green : blue;
          n += 1;
          if (value < lowest) lowest = value;
          if (value > highest) highest = value;
          if (value <= darkMax || value >= clippedMin || (red >= nearWhiteMin && green >= nearWhiteMin && blue >= nearWhiteMin)) continue;
          r += lights[red];
          g += lights[green];
          b += lights[blue];
          kept += 1;
        }
      }
      const target = (oy * width + ox) * channels;
      if (n === 0) continue; // all transparent: stays transparent (alpha 0)
      let medianAt = -1;
      // A cell whose whole range fits in the band about its darkest pixel has no outlier: every
      // pixel is within the band of the median. Only the others are read again and sorted.
      if (highest - lowest > GLINT_BAND.relative * lowest + GLINT_BAND.absolute) {
        n = 0;
        for (let y = top; y < bottom; y += 1) {
          let offset = y * rowLength + left * channels;
          for (let x = left; x < right; x += 1, offset += channels) {
            if (opaque < 255 && data[offset + 3] < 255) continue;
            const red = data[offset];
            const green = data[offset + 1];
            const blue = data[offset + 2];
            brightness[n] = red > green ? (red > blue ? red : blue) : green > blue ? green : blue;
            offsets[n] = offset;
            n += 1;
          }
        }
        medianAt = offsets[0];
        for (let i = 0; i < n; i += 1) {
          const value = brightness[i];
          let at = i;
          while (at > 0 && sorted[at - 1] > value) {
            sorted[at] = sorted[at - 1];
            at -= 1;
          }
          sorted[at] = value;
        }
        const median = sorted[n >> 1];
        const band = GLINT_BAND.relative * median + GLINT_BAND.absolute;
        r = 0;
        g = 0;
        b = 0;
        kept = 0;
        for (let i = 0; i < n; i += 1) {
          const value = brightness[i];
          if (value === median) medianAt = offsets[i];
          if (value <= darkMax || value >= clippedMin || value - median > band || median - value > band) continue;
          const offset = offsets[i];
          const red = data[offset];
          const green = data[offset + 1];
          const blue = data[offset + 2];
          if (red >= nearWhiteMin && green >= nearWhiteMin && blue >= nearWhiteMin) continue;
          r += lights[red];
          g += lights[green];
          b += lights[blue];
          kept += 1;
        }
      }
      if (kept === 0) {
        if (medianAt < 0) medianAt = firstOpaque(data, channels, top, bottom, left, right, rowLength);
        out[target] = data[medianAt];
        out[target + 1] = data[medianAt + 1];
        out[target + 2] = data[medianAt + 2];
      } else {
        out[target] = encode(r / kept);
        out[target + 1] = encode(g / kept);
        out[target + 2] = encode(b / kept);
      }
      if (channels === 4) out[target + 3] = 255;
    }
  }
  return { data: out, width, height, channels };
}

/** Offset of the first opaque pixel of a cell (the pixel a cell with no outlier and no kept pixel stands for). */
function firstOpaque(data: PixelImage['data'], channels: number, top: number, bottom: number, left: number, right: number, rowLength: number): number {
  for (let y = top; y < bottom; y += 1) {
    for (let x = left, offset = y * rowLength + left * channels; x < right; x += 1, offset += channels) {
      if (channels === 3 || data[offset + 3] === 255) return offset;
    }
  }
  return top * rowLength + left * channels;
}
