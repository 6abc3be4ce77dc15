import type { PhotoContentType } from '../../photos';
import { processPhoto, type ProcessedPhoto } from './decode';
import { encodeAnalysisImage } from './measure';
import { derivedKeys } from './keys';
import type { PhotoFiles } from './records';
import { deleteObjects, putObject } from '../storage';

/** At most this many photos are decoded at once per process: a 100 MP photo takes a few hundred MB while it is. */
const DECODE_SLOTS = 2;
let busy = 0;
const waiting: (() => void)[] = [];

async function inSlot<T>(work: () => Promise<T>): Promise<T> {
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

/** processPhoto, a few at a time (the HEIC decoder runs in its own thread; sharp in libuv's pool). */
export const processPhotoInTurn = (original: Uint8Array) => inSlot(() => processPhoto(original));

const CONTENT_TYPES: Record<ProcessedPhoto['format'], PhotoContentType> = {
  jpeg: 'image/jpeg',
  png: 'image/png',
  webp: 'image/webp',
  heif: 'image/heif',
  heic: 'image/heic',
};

/** The content type of what the decoder found (never what the browser claimed). */
export const decodedContentType = (processed: Pick<ProcessedPhoto, 'format'>): PhotoContentType => CONTENT_TYPES[processed.format];

/**
 * Writes the display WebP, the thumbnail and the analysis copy beside the original (and, when
 * the original carries a GPS position, a copy without it that then stands as the original).
 * All or nothing: if one write fails, the others are deleted again.
 */
export async function writeDerivedFiles(originalKey: string, originalBytes: number, processed: ProcessedPhoto): Promise<PhotoFiles & { written: string[] }> {
  const keys = derivedKeys(originalKey);
  const replacement = processed.positionFree;
  const files: PhotoFiles = {
    originalKey: replacement ? keys.positionFree(replacement.contentType) : originalKey,
    displayKey: keys.display,
    thumbKey: keys.thumb,
    analysisKey: keys.analysis,
    contentType: replacement ? replacement.contentType : decodedContentType(processed),
    byteSize: replacement ? replacement.data.length : originalBytes,
  };
  const writes: [string, Uint8Array, string][] = [
    [files.displayKey, processed.display.data, 'image/webp'],
    [files.thumbKey, processed.thumbnail.data, 'image/webp'],
    [files.analysisKey, await encodeAnalysisImage(processed.analysisImage), 'image/png'],
  ];
  if (replacement) writes.push([files.originalKey, replacement.data, replacement.contentType]);
  const written = writes.map(([key]) => key);
  const results = await Promise.allSettled(writes.map(([key, body, type]) => putObject(key, body, type)));
  const failed = results.find((result) => result.status === 'rejected');
  if (failed) {
    await deleteObjects(written).catch(() => undefined);
    throw failed.reason;
  }
  return { ...files, written };
}
