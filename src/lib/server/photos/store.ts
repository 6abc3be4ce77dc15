import type { PhotoContentType } from '~/lib/photos';
import { deleteObjects, presignGet, putObject } from '~/lib/server/storage';
import type { DerivedFiles } from './derived-files';
import { derivedKeys } from './keys';

/**
 * A photo's files in storage: the derived files written beside the original, and short-lived URLs
 * to show them to someone who may see the photo.
 */

/** Where a photo's files are, and what its original is, as its row records them. */
export interface PhotoFiles {
  originalKey: string;
  displayKey: string;
  thumbKey: string;
  analysisKey: string;
  contentType: string;
  byteSize: number;
}

/** The uploaded original: its key, size, and the content type the decoder found. */
export interface StoredOriginal {
  key: string;
  byteSize: number;
  contentType: PhotoContentType;
}

/**
 * Writes the display WebP, the thumbnail and the analysis copy beside the original (and, when
 * the original carries a GPS position, a copy without it that then stands as the original).
 * All or nothing: if one write fails, the others are deleted again.
 */
export async function storeFiles(original: StoredOriginal, derived: DerivedFiles): Promise<PhotoFiles & { written: string[] }> {
  const keys = derivedKeys(original.key);
  const replacement = derived.positionFree;
  const files: PhotoFiles = {
    originalKey: replacement ? keys.positionFree(replacement.contentType) : original.key,
    displayKey: keys.display,
    thumbKey: keys.thumb,
    analysisKey: keys.analysis,
    contentType: replacement ? replacement.contentType : original.contentType,
    byteSize: replacement ? replacement.data.length : original.byteSize,
  };
  const writes: [string, Uint8Array, string][] = [
    [files.displayKey, derived.display.data, 'image/webp'],
    [files.thumbKey, derived.thumbnail.data, 'image/webp'],
    [files.analysisKey, derived.analysisCopy, 'image/png'],
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

/** How long a URL to show a photo stays valid, at least. */
const VIEW_WINDOW_SECONDS = 15 * 60;

/**
 * A presigned GET for showing a derived file to someone who may see it. Signed at the start of
 * the current 15-minute window and valid for two windows, so the URL stays the same for a while
 * (browsers cache the image) and is good for at least 15 minutes after it is handed out.
 */
export function viewUrl(key: string, now = Date.now()): Promise<string> {
  const windowStart = new Date(Math.floor(now / (VIEW_WINDOW_SECONDS * 1000)) * VIEW_WINDOW_SECONDS * 1000);
  return presignGet(key, 2 * VIEW_WINDOW_SECONDS, windowStart);
}
