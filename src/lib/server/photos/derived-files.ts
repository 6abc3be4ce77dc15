import sharp from 'sharp';
import type { PixelImage } from '~/lib/analysis';
import { fitInside, toPixels, type AnalysisImage, type DecodedPhoto } from './decode';

/**
 * The files an upload derives from a decoded photo, none carrying any metadata: a display WebP, a
 * thumbnail, the analysis copy as a lossless PNG (a region edit measures it instead of decoding
 * the original again), and — when the original records where it was taken — a full-size copy
 * without that, to keep in its place.
 */

export const DISPLAY_LONG_SIDE = 2048;
export const THUMBNAIL_LONG_SIDE = 400;

export interface DerivedImage {
  data: Buffer;
  width: number;
  height: number;
  contentType: 'image/webp';
}

/** A full-size copy of an original that carried a GPS position, upright and without any metadata. */
export interface PositionFreeOriginal {
  data: Buffer;
  contentType: 'image/jpeg' | 'image/png' | 'image/webp';
}

export interface DerivedFiles {
  /** ≤ 2048 px long side, WebP, no metadata at all. */
  display: DerivedImage;
  /** ≤ 400 px long side, WebP, no metadata at all. */
  thumbnail: DerivedImage;
  /** The shrunk copy colours are measured on, as a lossless PNG. */
  analysisCopy: Buffer;
  /** Null when the original carries no GPS position and may be kept as it is; else the copy to keep instead. */
  positionFree: PositionFreeOriginal | null;
}

async function toWebp(pixels: PixelImage, longSide: number, quality: number): Promise<DerivedImage> {
  const { width, height, channels } = pixels;
  // sharp writes no EXIF, XMP or ICC unless asked (withMetadata/keepMetadata), so nothing carries over.
  const { data, info } = await sharp(pixels.data, { raw: { width, height, channels } })
    .resize(fitInside(longSide))
    .webp({ quality })
    .toBuffer({ resolveWithObject: true });
  return { data, width: info.width, height: info.height, contentType: 'image/webp' };
}

/**
 * The shrunk copy colours are measured on, as a lossless PNG: stored beside the photo, it gives
 * a region edit exactly the numbers a fresh decode of the original would, without the decode.
 */
async function encodeAnalysisCopy(image: AnalysisImage): Promise<Buffer> {
  const { data, width, height, channels } = image.pixels;
  return sharp(data, { raw: { width, height, channels } }).png({ compressionLevel: 6 }).toBuffer();
}

/** The full-size upright image re-encoded without metadata: JPEG (q 95) for JPEG and HEIC, else its own format. */
async function withoutMetadata(decoded: DecodedPhoto): Promise<PositionFreeOriginal> {
  const pipeline = decoded.pipeline();
  if (decoded.format === 'png') return { data: await pipeline.png().toBuffer(), contentType: 'image/png' };
  if (decoded.format === 'webp') return { data: await pipeline.webp({ quality: 95 }).toBuffer(), contentType: 'image/webp' };
  return { data: await pipeline.jpeg({ quality: 95, chromaSubsampling: '4:4:4' }).toBuffer(), contentType: 'image/jpeg' };
}

/** Derives the files of a decoded photo (see above). */
export async function deriveFiles(decoded: DecodedPhoto): Promise<DerivedFiles> {
  const upright = await toPixels(decoded.pipeline().resize(fitInside(DISPLAY_LONG_SIDE)));
  const [display, thumbnail, analysisCopy, positionFree] = await Promise.all([
    toWebp(upright, DISPLAY_LONG_SIDE, 82),
    toWebp(upright, THUMBNAIL_LONG_SIDE, 75),
    encodeAnalysisCopy(decoded.analysisImage),
    decoded.carriesPosition ? withoutMetadata(decoded) : null,
  ]);
  return { display, thumbnail, analysisCopy, positionFree };
}
