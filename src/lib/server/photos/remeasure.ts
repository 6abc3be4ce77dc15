import type { RegionInput } from '~/lib/photos';
import { db } from '~/lib/server/db';
import { Refused } from '~/lib/server/refusal';
import { getObject } from '~/lib/server/storage';
import { decodeAnalysisCopy, decodeForAnalysis } from './decode';
import { analyseRegions } from './measure';
import { isMissingParent, layerAlloys, lockPhoto, photoExists, photoTransaction, writeRegions, type PhotoRecord } from './records';

/**
 * A region edit: the photo measured again with the new regions, from its stored analysis copy (no
 * decode of the original), and its regions and swatches replaced.
 */

const GONE = 'That photo was not found.';

/** The copy colours are measured on: the stored analysis copy, or a fresh decode of the original when there is none. */
async function analysisImageOf(photo: PhotoRecord) {
  const size = { width: photo.width, height: photo.height };
  const copy = photo.analysisKey ? await getObject(photo.analysisKey) : undefined;
  if (copy) return decodeAnalysisCopy(copy, size);
  const original = await getObject(photo.originalKey);
  if (original) return decodeForAnalysis(original);
  // Its files go right after its row when a photo is deleted.
  if (!(await photoExists(photo.id))) throw new Refused(404, GONE);
  throw new Refused(409, 'The original of this photo is missing from storage; delete the photo and upload it again.');
}

/** Measures the photo again with these regions and replaces its regions and swatches. */
export async function reanalysePhoto(photo: PhotoRecord, drawn: RegionInput[]): Promise<void> {
  const analysis = analyseRegions(await analysisImageOf(photo), drawn);
  try {
    await photoTransaction(db(), async (tx) => {
      // Two saves of the same photo take turns instead of mixing; a deleted one is not written.
      if (!(await lockPhoto(tx, photo))) throw new Refused(404, GONE);
      await writeRegions(tx, photo, drawn, analysis, await layerAlloys(tx, photo.couponId), { replacing: true });
    });
  } catch (error) {
    if (isMissingParent(error)) throw new Refused(400, 'A layer of those regions is no longer part of the coupon.', 'regions');
    throw error;
  }
}
