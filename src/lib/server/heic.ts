import { createRequire } from 'node:module';

/**
 * HEIC photos (HEVC-coded HEIF, what many phones save): sharp's prebuilt binaries read their
 * header but cannot decode HEVC, so these are decoded with heic-decode (libheif in WebAssembly).
 */

/** ISO-BMFF brands that mean HEVC-coded HEIF (per the HEIF standard, ISO/IEC 23008-12). */
const HEVC_BRANDS = new Set(['heic', 'heix', 'heim', 'heis', 'hevc', 'hevx', 'hevm', 'hevs']);

/** True when the buffer starts with an ISO-BMFF `ftyp` box naming an HEVC brand (AVIF and others are left to sharp). */
export function isHeic(buffer: Uint8Array): boolean {
  if (buffer.length < 16) return false;
  const text = (start: number) => String.fromCharCode(...buffer.subarray(start, start + 4));
  if (text(4) !== 'ftyp') return false;
  const boxSize = Math.min(buffer.length, new DataView(buffer.buffer, buffer.byteOffset).getUint32(0));
  const brands = [text(8)];
  for (let offset = 16; offset + 4 <= boxSize; offset += 4) brands.push(text(offset));
  return brands.some((brand) => HEVC_BRANDS.has(brand));
}

export interface DecodedHeic {
  width: number;
  height: number;
  /** RGBA, 8 bits per channel, already turned upright by the file's own rotation/mirror properties. */
  data: Uint8ClampedArray;
}

interface HeicImage {
  width: number;
  height: number;
  decode(): Promise<DecodedHeic>;
}
type DecodeAll = (input: { buffer: Uint8Array }) => Promise<HeicImage[] & { dispose(): void }>;

const require = createRequire(import.meta.url);
let decodeAll: DecodeAll | undefined;

/**
 * Decodes the primary image, refusing it before decoding when it has more than `maxPixels`.
 * Throws RangeError for too many pixels, and the decoder's own error for damaged files.
 */
export async function decodeHeic(buffer: Uint8Array, maxPixels: number): Promise<DecodedHeic> {
  decodeAll ??= (require('heic-decode') as { all: DecodeAll }).all;
  const images = await decodeAll({ buffer });
  try {
    const primary = images[0];
    if (primary.width * primary.height > maxPixels) throw new RangeError('too many pixels');
    return await primary.decode();
  } finally {
    images.dispose();
  }
}
