import sharp from 'sharp';
import { AnalysisInputError, scaleRegion, shrinkRejectingGlare, sourceOfCells, type PixelImage, type Region, type Size } from '~/lib/analysis';
import { kindMismatchMessage, sameImageKind, type PhotoContentType } from '~/lib/photos';
import { decodeHeic, isHeic } from './heic-worker';
import { carriesPosition, readExif, type PhotoExif } from './metadata';

/**
 * The first step of an upload: decoding the file. What kind of image it really is, its upright
 * size, the shrunk copy colours are measured on and what its metadata says — or why it cannot be
 * used (ImageRejected, with a message for the person who uploaded it). Also decodes the stored
 * analysis copy for a region edit.
 */

/** Photos above 100 megapixels are refused before decoding (a 50 MP camera is 8688×5792). */
export const MAX_INPUT_PIXELS = 100_000_000;
/** Long side of the copy colours are measured on (see shrinkForAnalysis). */
export const ANALYSIS_LONG_SIDE = 1024;

const ACCEPTED_FORMATS = new Set(['jpeg', 'png', 'webp', 'heif']);

export type ImageRejectedCode = 'not-an-image' | 'truncated' | 'empty' | 'too-many-pixels' | 'unsupported' | 'not-as-declared';

const REJECTION_MESSAGES: Record<ImageRejectedCode, string> = {
  empty: 'The file is empty.',
  'not-an-image': 'The file is not an image. Upload a JPEG, PNG, WebP or HEIC photo.',
  truncated: 'The image is cut short or damaged. Upload the original file again.',
  'too-many-pixels': `The image has more than ${MAX_INPUT_PIXELS / 1_000_000} megapixels. Upload a smaller copy.`,
  unsupported: 'This kind of image is not accepted. Upload a JPEG, PNG, WebP or HEIC photo.',
  'not-as-declared': 'The file is another kind of image than the one declared. Upload the photo again.',
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

export type ImageFormat = 'jpeg' | 'png' | 'webp' | 'heif' | 'heic';

const CONTENT_TYPES: Record<ImageFormat, PhotoContentType> = {
  jpeg: 'image/jpeg',
  png: 'image/png',
  webp: 'image/webp',
  heif: 'image/heif',
  heic: 'image/heic',
};

interface OpenedImage {
  format: ImageFormat;
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
    format: metadata.format as ImageFormat,
    width: turned ? height : width,
    height: turned ? width : height,
    pipeline: () => sharp(buffer, { limitInputPixels: MAX_INPUT_PIXELS }).rotate(),
  };
}

/** Resize options: at most `longSide` pixels on the long side, never enlarged. */
export const fitInside = (longSide: number) => ({ width: longSide, height: longSide, fit: 'inside' as const, withoutEnlargement: true });

/** Runs a pipeline to sRGB pixels; a file that fails to decode is an ImageRejected. */
export async function toPixels(pipeline: sharp.Sharp): Promise<PixelImage> {
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

/** Cells of at least this many decoded pixels a side make one analysed pixel, so a glint in a cell can be told from the film around it. */
const MIN_CELL = 2;

/** Size of the analysis copy of an image: at most ANALYSIS_LONG_SIDE on the long side, never enlarged. */
export function analysisSize(width: number, height: number): { width: number; height: number } {
  const scale = Math.min(1, ANALYSIS_LONG_SIDE / Math.max(width, height));
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}

/**
 * The size decoded before the glint-rejecting shrink: the smallest whole-number reduction (1/8,
 * 1/4, 1/2 or none) that still leaves cells of MIN_CELL pixels a side, so libjpeg can decode a
 * JPEG straight at that scale; its block averaging over 2–8 pixels is mild beside a resize to 1024.
 */
function decodeSize(width: number, height: number): { width: number; height: number } {
  const target = ANALYSIS_LONG_SIDE * MIN_CELL;
  const long = Math.max(width, height);
  const reduction = [8, 4, 2].find((factor) => long / factor >= target) ?? 1;
  return { width: Math.ceil(width / reduction), height: Math.ceil(height / reduction) };
}

/**
 * The shrunk copy. With `regions` (pixels of the upright full-size photo), only the cells of the
 * copy that cover them are made, from only the decoded pixels under them: the rest of the copy
 * stays black, so nothing else may be measured on it.
 */
async function shrinkForAnalysis(opened: OpenedImage, regions?: Region[]): Promise<AnalysisImage> {
  const { width, height } = opened;
  const target = analysisSize(width, height);
  if (target.width === width && target.height === height) return { width, height, pixels: await toPixels(opened.pipeline()) };
  // Resizing in the same pipeline as the decode lets libjpeg decode at 1/2, 1/4 or 1/8 scale;
  // 'nearest' then only picks pixels (no blending) if a step is left.
  const decoded = decodeSize(width, height);
  const pipeline = opened.pipeline();
  if (decoded.width !== width || decoded.height !== height) pipeline.resize({ ...decoded, fit: 'fill', kernel: 'nearest' });
  const cells = regions && cellsCovering(regions, { width, height }, target);
  if (!cells) return { width, height, pixels: shrinkRejectingGlare(await toPixels(pipeline), target.width, target.height) };
  const part = { cells, from: decoded };
  const source = sourceOfCells(part, target.width, target.height);
  pipeline.extract({ left: source.x, top: source.y, width: source.width, height: source.height });
  return { width, height, pixels: shrinkRejectingGlare(await toPixels(pipeline), target.width, target.height, part) };
}

/** The smallest rectangle of the copy's pixels that holds every region as scaleRegion maps it; undefined when a region lies outside the photo. */
function cellsCovering(regions: Region[], full: Size, copy: Size): Region | undefined {
  if (regions.length === 0) return undefined;
  let mapped: Region[];
  try {
    mapped = regions.map((region) => scaleRegion(region, full, copy));
  } catch (error) {
    if (error instanceof AnalysisInputError) return undefined; // measured in full, to refuse the region as before
    throw error;
  }
  const x = Math.min(...mapped.map((region) => region.x));
  const y = Math.min(...mapped.map((region) => region.y));
  const right = Math.max(...mapped.map((region) => region.x + region.width));
  const bottom = Math.max(...mapped.map((region) => region.y + region.height));
  return { x, y, width: right - x, height: bottom - y };
}

/**
 * Decodes a photo for analysis only (the quick path used when a region is drawn or edited). With
 * `regions`, only the part of the copy under them is made: measure nothing else on it.
 */
export async function decodeForAnalysis(buffer: Uint8Array, regions?: Region[]): Promise<AnalysisImage> {
  return shrinkForAnalysis(await openImage(buffer), regions);
}

/** The stored analysis copy (a lossless PNG, see derived-files.ts) back as pixels, standing for the photo's full size. */
export async function decodeAnalysisCopy(png: Uint8Array, fullSize: { width: number; height: number }): Promise<AnalysisImage> {
  const { data, info } = await sharp(png).raw().toBuffer({ resolveWithObject: true });
  const pixels: PixelImage = {
    data: new Uint8Array(data.buffer, data.byteOffset, data.length),
    width: info.width,
    height: info.height,
    channels: info.channels as 3 | 4,
  };
  return { ...fullSize, pixels };
}

export interface DecodedPhoto extends OpenedImage {
  /** The content type of what the decoder found (never what the browser claimed). */
  contentType: PhotoContentType;
  exif: PhotoExif;
  /** True when the file records where it was taken; its original is then replaced by a copy without. */
  carriesPosition: boolean;
  /** Measure with analyseDecoded() or analyseRegions(); gives the same numbers as analysePhoto(). */
  analysisImage: AnalysisImage;
}

/**
 * Decodes a photo: checked under the pixel limit, turned upright, shrunk for analysis, its EXIF
 * read (never GPS) and whether it records a position. With `declared`, a file that is another
 * kind of image than the one declared is refused too. Throws ImageRejected for anything that is
 * not a usable photo.
 */
export async function decodePhoto(buffer: Uint8Array, declared?: PhotoContentType): Promise<DecodedPhoto> {
  const opened = await openImage(buffer);
  const [analysisImage, exif, position] = await Promise.all([shrinkForAnalysis(opened), readExif(buffer), carriesPosition(buffer)]);
  const contentType = CONTENT_TYPES[opened.format];
  if (declared && !sameImageKind(contentType, declared)) throw new ImageRejected('not-as-declared', kindMismatchMessage(contentType, declared));
  return { ...opened, contentType, exif, carriesPosition: position, analysisImage };
}

/** At most this many photos are decoded at once per process: a 100 MP photo takes a few hundred MB while it is. */
const DECODE_SLOTS = 2;
let busy = 0;
const waiting: (() => void)[] = [];

/** Runs work that decodes a photo (and derives its files) a few at a time (the HEIC decoder runs in its own thread; sharp in libuv's pool). */
export async function inDecodeTurn<T>(work: () => Promise<T>): Promise<T> {
  if (busy >= DECODE_SLOTS) await new Promise<void>((resolve) => waiting.push(resolve));
  else busy += 1;
  try {
    return await work();
  } finally {
    const next = waiting.shift();
    if (next) next();
    else busy -= 1;
  }
}
