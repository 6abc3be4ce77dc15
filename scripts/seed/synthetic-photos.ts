/**
 * Synthetic photos of coupons with known colours, for the demo and the tests: flat patches on a
 * background, an optional colour cast applied to the linear sRGB channels, specular streaks, and
 * seeded gaussian sensor noise.
 */
import sharp from 'sharp';
import { convertLrgbToRgb, convertRgbToLrgb, parse } from 'culori';
import { seededRandom } from '~/lib/random';
import type { PixelImage } from '~/lib/analysis/pixels';
import type { Region } from '~/lib/analysis/schemas';

export interface Patch {
  region: Region;
  /** The surface colour under D65, as sRGB hex. */
  colour: string;
}

/** Gaussian sensor noise, from a seed or drawn from a generator already in use. */
export type SensorNoise = {
  /** Standard deviation of the noise added to each 8-bit channel. */
  sigma: number;
  /**
   * How each value takes its noise from the table: a random entry of its own ('value'), or the
   * entry after its neighbour's, from a random start per row ('row': one draw a row, for large photos).
   */
  sampling?: 'value' | 'row';
} & ({ seed: number } | { random: () => number });

export interface Scene {
  width: number;
  height: number;
  background: string;
  patches: Patch[];
  noise?: SensorNoise;
  /** Multipliers for the linear sRGB channels (the light's colour as the camera recorded it). */
  cast?: readonly [number, number, number];
  /** Thin diagonal lines of light-source glare across the picture. */
  streaks?: { count: number; thickness: number; colour: string };
}

/** An 18 % reflectance grey card: linear sRGB 0.18 encodes to 118 (IEC 61966-2-1 transfer function). */
export const GREY_CARD = '#767676';

const toLinear = (hex: string) => convertRgbToLrgb(parse(hex) as { r: number; g: number; b: number });

/** The 8-bit sRGB a camera records for `colour` under the cast (before noise). */
export function photographedColour(colour: string, cast: readonly [number, number, number] = [1, 1, 1]): [number, number, number] {
  const linear = toLinear(colour);
  const encoded = convertLrgbToRgb({ r: linear.r * cast[0], g: linear.g * cast[1], b: linear.b * cast[2] });
  return [encoded.r, encoded.g, encoded.b].map((value) => Math.round(Math.min(1, Math.max(0, value)) * 255)) as [number, number, number];
}

export function renderScene(scene: Scene): PixelImage {
  const { width, height } = scene;
  const data = new Uint8Array(width * height * 3);
  const fill = (region: Region, rgb: readonly number[]) => {
    for (let y = region.y; y < Math.min(height, region.y + region.height); y += 1) {
      for (let x = region.x; x < Math.min(width, region.x + region.width); x += 1) data.set(rgb, (y * width + x) * 3);
    }
  };
  fill({ x: 0, y: 0, width, height }, photographedColour(scene.background, scene.cast));
  for (const patch of scene.patches) fill(patch.region, photographedColour(patch.colour, scene.cast));
  if (scene.streaks) drawStreaks(data, width, height, scene.streaks);
  if (scene.noise) addNoise(data, width * 3, scene.noise);
  return { data, width, height, channels: 3 };
}

function drawStreaks(data: Uint8Array, width: number, height: number, streaks: NonNullable<Scene['streaks']>) {
  const rgb = photographedColour(streaks.colour);
  const spacing = (width + height) / (streaks.count + 1);
  for (let y = 0; y < height; y += 1) {
    for (let x = 0; x < width; x += 1) {
      const along = (x + y) % spacing;
      if (along < streaks.thickness) data.set(rgb, (y * width + x) * 3);
    }
  }
}

const NOISE_TABLE_SIZE = 65536;

/** Adds seeded gaussian noise (Box–Muller, drawn from a table of 65 536 values for speed). */
function addNoise(data: Uint8Array, rowLength: number, noise: SensorNoise) {
  const random = 'random' in noise ? noise.random : seededRandom(noise.seed);
  const table = new Float32Array(NOISE_TABLE_SIZE);
  for (let i = 0; i < table.length; i += 2) {
    const radius = Math.sqrt(-2 * Math.log(1 - random()));
    const angle = 2 * Math.PI * random();
    table[i] = radius * Math.cos(angle) * noise.sigma;
    table[i + 1] = radius * Math.sin(angle) * noise.sigma;
  }
  const add = (i: number, entry: number) => {
    const value = data[i] + table[entry];
    data[i] = value < 0 ? 0 : value > 255 ? 255 : Math.round(value);
  };
  if (noise.sampling === 'row') {
    for (let row = 0; row < data.length; row += rowLength) {
      let entry = Math.floor(random() * NOISE_TABLE_SIZE);
      for (let i = row; i < row + rowLength; i += 1) {
        entry = (entry + 1) & (NOISE_TABLE_SIZE - 1);
        add(i, entry);
      }
    }
  } else {
    for (let i = 0; i < data.length; i += 1) add(i, (random() * NOISE_TABLE_SIZE) | 0);
  }
}

export function encodeJpeg(image: PixelImage, quality = 92): Promise<Buffer> {
  return sharp(image.data, { raw: { width: image.width, height: image.height, channels: image.channels } })
    .jpeg({ quality })
    .toBuffer();
}

export function encodePng(image: PixelImage): Promise<Buffer> {
  return sharp(image.data, { raw: { width: image.width, height: image.height, channels: image.channels } })
    .png()
    .toBuffer();
}
