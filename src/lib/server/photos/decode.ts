import sharp from 'sharp';
import exifr from 'exifr';
import {
  analyseImage,
  AnalysisOptionsSchema,
  clipRegion,
  scaleRegion,
  type AnalysisOptions,
  type PixelImage,
  type Region,
  type RegionAnalysis,
  type WhiteBalance,
} from '../../analysis';
import { decodeHeic, isHeic } from './heic-worker';

/** Photos above 100 megapixels are refused before decoding (a 50 MP camera is 8688×5792). */
export const MAX_INPUT_PIXELS = 100_000_000;
/** Long side of the copy colours are measured on; JPEGs are decoded straight at 1/2, 1/4 or 1/8 scale. */
export const ANALYSIS_LONG_SIDE = 1024;
export const DISPLAY_LONG_SIDE = 2048;
export const THUMBNAIL_LONG_SIDE = 400;

const ACCEPTED_FORMATS = new Set(['jpeg', 'png', 'webp', 'heif']);

export type ImageRejectedCode = 'not-an-image' | 'truncated' | 'empty' | 'too-many-pixels' | 'unsupported';

const REJECTION_MESSAGES: Record<ImageRejectedCode, string> = {
  empty: 'The file is empty.',
  'not-an-image': 'The file is not an image. Upload a JPEG, PNG, WebP or HEIC photo.',
  truncated: 'The image is cut short or damaged. Upload the original file again.',
  'too-many-pixels': `The image has more than ${MAX_INPUT_PIXELS / 1_000_000} megapixels. Upload a smaller copy.`,
  unsupported: 'This kind of image is not accepted. Upload a JPEG, PNG, WebP or HEIC photo.',
};

/** A photo that cannot be used; `message` is written for the person who uploaded it. */
export class ImageRejected extends Error {
  constructor(
    readonly code: ImageRejectedCode,
    message: string = REJECTION_MESSAGES[code],
  ) {
    super(message);
    this.name = 'ImageRejected';
  }
}

function rejectionFor(error: unknown): ImageRejected {
  if (error instanceof ImageRejected) return error;
  const message = error instanceof Error ? error.message : String(error);
  if (/unsupported image format/i.test(message)) return new ImageRejected('not-an-image');
  if (/pixel limit/i.test(message)) return new ImageRejected('too-many-pixels');
  if (/buffer is empty/i.test(message)) return new ImageRejected('empty');
  return new ImageRejected('truncated');
}

interface OpenedImage {
  format: 'jpeg' | 'png' | 'webp' | 'heif' | 'heic';
  /** Size of the upright (EXIF-rotated) full-size image. */
  width: number;
  height: number;
  /** A fresh sharp pipeline over the upright image. */
  pipeline(): sharp.Sharp;
}

async function openImage(buffer: Uint8Array): Promise<OpenedImage> {
  if (buffer.length === 0) throw new ImageRejected('empty');
  if (isHeic(buffer)) {
    const decoded = await decodeHeic(buffer, MAX_INPUT_PIXELS).catch((error: unknown) => {
      throw error instanceof RangeError ? new ImageRejected('too-many-pixels') : new ImageRejected('truncated');
    });
    const { width, height, data } = decoded;
    const raw = { width, height, channels: 4 as const };
    return { format: 'heic', width, height, pipeline: () => sharp(data, { raw, limitInputPixels: MAX_INPUT_PIXELS }).removeAlpha() };
  }
  const metadata = await sharp(buffer, { limitInputPixels: MAX_INPUT_PIXELS })
    .metadata()
    .catch((error: unknown) => {
      throw rejectionFor(error);
    });
  if (!metadata.format || !ACCEPTED_FORMATS.has(metadata.format) || metadata.compression === 'hevc') {
    throw new ImageRejected('unsupported');
  }
  const { width = 0, height = 0, orientation = 1 } = metadata;
  if (width * height > MAX_INPUT_PIXELS) throw new ImageRejected('too-many-pixels');
  const turned = orientation >= 5;
  return {
    format: metadata.format as OpenedImage['format'],
    width: turned ? height : width,
    height: turned ? width : height,
    pipeline: () => sharp(buffer, { limitInputPixels: MAX_INPUT_PIXELS }).rotate(),
  };
}

const fitInside = (longSide: number) => ({ width: longSide, height: longSide, fit: 'inside' as const, withoutEnlargement: true });

async function toPixels(pipeline: sharp.Sharp): Promise<PixelImage> {
  const { data, info } = await pipeline
    .toColourspace('srgb')
    .raw()
    .toBuffer({ resolveWithObject: true })
    .catch((error: unknown) => {
      throw rejectionFor(error);
    });
  if (info.channels !== 3 && info.channels !== 4) throw new ImageRejected('unsupported');
  return { data: new Uint8Array(data.buffer, data.byteOffset, data.length), width: info.width, height: info.height, channels: info.channels };
}

/** The shrunk copy of a photo that colours are measured on, with the full upright size it stands for. */
export interface AnalysisImage {
  width: number;
  height: number;
  pixels: PixelImage;
}

async function shrinkForAnalysis(opened: OpenedImage): Promise<AnalysisImage> {
  // Resizing in the same pipeline as the decode lets libjpeg decode at 1/2, 1/4 or 1/8 scale.
  const pixels = await toPixels(opened.pipeline().resize(fitInside(ANALYSIS_LONG_SIDE)));
  return { width: opened.width, height: opened.height, pixels };
}

/** Decodes a photo for analysis only (the quick path used when a region is drawn or edited). */
export async function decodeForAnalysis(buffer: Uint8Array): Promise<AnalysisImage> {
  return shrinkForAnalysis(await openImage(buffer));
}

/** The analysis of a photo; regions are in pixels of the upright full-size image. */
export interface PhotoAnalysis {
  width: number;
  height: number;
  /** Size of the shrunk copy the colours were measured on. */
  analysedWidth: number;
  analysedHeight: number;
  whiteBalance: WhiteBalance | null;
  regions: RegionAnalysis[];
}

/**
 * Analyses an already decoded photo. Regions (and the grey card) are given in pixels of the
 * upright full-size photo and mapped onto the shrunk copy; results name them as given (clipped
 * to the photo). Throws AnalysisInputError for a region outside the photo or an unusable grey card.
 */
export function analyseDecoded(image: AnalysisImage, options: AnalysisOptions = {}): PhotoAnalysis {
  const parsed = AnalysisOptionsSchema.parse(options);
  const full = { width: image.width, height: image.height };
  const toShrunk = (region: Region) => scaleRegion(region, full, image.pixels);
  const requested = parsed.regions.length > 0 ? parsed.regions.map((region) => clipRegion(region, full)) : [{ x: 0, y: 0, ...full }];
  const analysis = analyseImage(image.pixels, {
    ...parsed,
    regions: requested.map(toShrunk),
    grey: parsed.grey && toShrunk(parsed.grey),
  });
  return {
    width: image.width,
    height: image.height,
    analysedWidth: image.pixels.width,
    analysedHeight: image.pixels.height,
    whiteBalance: analysis.whiteBalance && { ...analysis.whiteBalance, grey: clipRegion(parsed.grey!, full) },
    regions: analysis.regions.map((result, index) => ({ ...result, region: requested[index] })),
  };
}

/** Decodes and analyses a photo: what the CLI and a region edit call. */
export async function analysePhoto(buffer: Uint8Array, options: AnalysisOptions = {}): Promise<PhotoAnalysis> {
  AnalysisOptionsSchema.parse(options);
  return analyseDecoded(await decodeForAnalysis(buffer), options);
}

/** What is kept of a photo's EXIF. GPS position is never read. */
export interface PhotoExif {
  /** Local time as written by the camera, ISO 8601, with its offset when the camera recorded one. */
  takenAt: string | null;
  cameraMake: string | null;
  cameraModel: string | null;
  lens: string | null;
  /** e.g. "1/125 s f/5.6 ISO 200". */
  exposure: string | null;
  whiteBalance: 'auto' | 'manual' | null;
}

const EXIF_OPTIONS = {
  ifd0: { pick: ['Make', 'Model'] },
  exif: { pick: ['DateTimeOriginal', 'OffsetTimeOriginal', 'ExposureTime', 'FNumber', 'ISO', 'LensModel', 'WhiteBalance'] },
  gps: false,
  ifd1: false,
  interop: false,
  xmp: false,
  icc: false,
  iptc: false,
  jfif: false,
  ihdr: false,
  makerNote: false,
  userComment: false,
  reviveValues: false,
  translateValues: false,
};

const text = (value: unknown) => (typeof value === 'string' && value.trim() ? value.trim() : null);
const firstNumber = (value: unknown) => {
  const number = Array.isArray(value) ? value[0] : value;
  return typeof number === 'number' && Number.isFinite(number) && number > 0 ? number : null;
};

/** EXIF "YYYY:MM:DD HH:MM:SS" (+ optional "±HH:MM" offset) → ISO 8601, per CIPA DC-008 (Exif 2.32) §4.6.5. */
export function formatTakenAt(dateTime: unknown, offset: unknown): string | null {
  const match = typeof dateTime === 'string' && /^(\d{4}):(\d{2}):(\d{2}) (\d{2}):(\d{2}):(\d{2})/.exec(dateTime);
  if (!match || match[1] === '0000') return null;
  const zone = typeof offset === 'string' && /^[+-]\d{2}:\d{2}$/.test(offset) ? offset : '';
  return `${match[1]}-${match[2]}-${match[3]}T${match[4]}:${match[5]}:${match[6]}${zone}`;
}

/** "1/125 s f/5.6 ISO 200"; parts the camera did not record are left out. */
export function formatExposure(exposureTime: unknown, fNumber: unknown, iso: unknown): string | null {
  const parts: string[] = [];
  const seconds = firstNumber(exposureTime);
  if (seconds) parts.push(seconds >= 1 ? `${Number(seconds.toFixed(1))} s` : `1/${Math.round(1 / seconds)} s`);
  const aperture = firstNumber(fNumber);
  if (aperture) parts.push(`f/${Number(aperture.toFixed(1))}`);
  const speed = firstNumber(iso);
  if (speed) parts.push(`ISO ${Math.round(speed)}`);
  return parts.length ? parts.join(' ') : null;
}

export async function readExif(buffer: Uint8Array): Promise<PhotoExif> {
  const tags: Record<string, unknown> = (await exifr.parse(buffer, EXIF_OPTIONS).catch(() => undefined)) ?? {};
  const make = text(tags.Make);
  let model = text(tags.Model);
  if (make && model?.toLowerCase().startsWith(`${make.toLowerCase()} `)) model = model.slice(make.length + 1);
  return {
    takenAt: formatTakenAt(tags.DateTimeOriginal, tags.OffsetTimeOriginal),
    cameraMake: make,
    cameraModel: model,
    lens: text(tags.LensModel),
    exposure: formatExposure(tags.ExposureTime, tags.FNumber, tags.ISO),
    whiteBalance: tags.WhiteBalance === 0 ? 'auto' : tags.WhiteBalance === 1 ? 'manual' : null,
  };
}

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

export interface ProcessedPhoto {
  format: OpenedImage['format'];
  /** Upright full-size dimensions; regions are drawn in these pixels. */
  width: number;
  height: number;
  exif: PhotoExif;
  /** ≤ 2048 px long side, WebP, no metadata at all. */
  display: DerivedImage;
  /** ≤ 400 px long side, WebP, no metadata at all. */
  thumbnail: DerivedImage;
  /** Pass to analyseDecoded() with the regions; gives the same numbers as analysePhoto(). */
  analysisImage: AnalysisImage;
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
 * Everything the upload route needs from a photo: checked and decoded under the pixel limit,
 * turned upright, EXIF read (never GPS), a display WebP and a thumbnail without metadata, and
 * the shrunk copy for analysis. Throws ImageRejected for anything that is not a usable photo.
 */
export async function processPhoto(buffer: Uint8Array): Promise<ProcessedPhoto> {
  const opened = await openImage(buffer);
  const upright = await toPixels(opened.pipeline().resize(fitInside(DISPLAY_LONG_SIDE)));
  const [display, thumbnail, analysisImage, exif, positionFree] = await Promise.all([
    toWebp(upright, DISPLAY_LONG_SIDE, 82),
    toWebp(upright, THUMBNAIL_LONG_SIDE, 75),
    shrinkForAnalysis(opened),
    readExif(buffer),
    carriesPosition(buffer).then((carries) => (carries ? withoutMetadata(opened) : null)),
  ]);
  return { format: opened.format, width: opened.width, height: opened.height, exif, display, thumbnail, analysisImage, positionFree };
}

/** The EXIF block sharp found, as TIFF (sharp gives JPEG and WebP blocks with their "Exif\0\0" header). */
function tiffOf(exif: Buffer): Buffer {
  for (let offset = 0; offset + 4 <= Math.min(exif.length, 16); offset += 1) {
    const mark = exif.toString('latin1', offset, offset + 4);
    if (mark === 'II*\0' || mark === 'MM\0*') return exif.subarray(offset);
  }
  return exif;
}

/**
 * True when the file records where it was taken: a GPS position in its EXIF or XMP. Read through
 * sharp's metadata, which finds the EXIF of JPEG, PNG, WebP and HEIC alike.
 */
export async function carriesPosition(buffer: Uint8Array): Promise<boolean> {
  const metadata = await sharp(buffer).metadata().catch(() => undefined);
  if (!metadata) return false;
  if (metadata.xmp && /GPS(Latitude|Longitude)/.test(metadata.xmp.toString('latin1'))) return true;
  if (!metadata.exif) return false;
  try {
    const position = await exifr.gps(tiffOf(metadata.exif));
    return Boolean(position && (Number.isFinite(position.latitude) || Number.isFinite(position.longitude)));
  } catch {
    return true; // an EXIF block that cannot be read might still hold a position: play safe
  }
}

/** The full-size upright image re-encoded without metadata: JPEG (q 95) for JPEG and HEIC, else its own format. */
async function withoutMetadata(opened: OpenedImage): Promise<PositionFreeOriginal> {
  const pipeline = opened.pipeline();
  if (opened.format === 'png') return { data: await pipeline.png().toBuffer(), contentType: 'image/png' };
  if (opened.format === 'webp') return { data: await pipeline.webp({ quality: 95 }).toBuffer(), contentType: 'image/webp' };
  return { data: await pipeline.jpeg({ quality: 95, chromaSubsampling: '4:4:4' }).toBuffer(), contentType: 'image/jpeg' };
}

export { AnalysisInputError } from '../../analysis';
