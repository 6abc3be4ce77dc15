import { checkRegions, TOO_BIG } from '../photo-requests';
import { MAX_UPLOAD_BYTES, type RegionInput } from '../photos';
import { db } from './db';
import { ImageRejected } from './image';
import { analyseRegions } from './photo-analysis';
import { isUsersKey } from './photo-keys';
import { insertPhoto, isMissingParent, layerAlloys, photoTransaction, writeRegions } from './photo-records';
import { processPhotoInTurn, writeDerivedFiles } from './photo-store';
import { Refused } from './refusal';
import { deleteObjects, getObject, objectSize } from './storage';
import { claimUpload, dropEntry, forgetLater, settleUpload } from './uploads';

export interface AttachInput {
  ownerId: string;
  couponId: number;
  layerIds: number[];
  key: string;
  regions: RegionInput[];
}

/**
 * Turns an upload into a stored photo of a coupon (callers have checked the coupon is the
 * owner's): checks the key, claims the upload, reads and decodes the file, writes the derived
 * files, then the photo row, its regions and swatches in one transaction. Refused with a 4xx for
 * every fault of the request or the file; an unusable file is deleted. Nothing half-done stays:
 * derived files are deleted when the transaction fails, and the upload's ledger entry (see
 * uploads.ts) lets the sweep remove whatever a crash leaves.
 */
export async function attachPhoto(input: AttachInput): Promise<number> {
  const { ownerId, couponId, key, regions } = input;
  if (!isUsersKey(ownerId, key)) throw new Refused(403, 'That upload belongs to someone else.', 'key');
  const layerFault = checkRegions(regions, input.layerIds, { width: Infinity, height: Infinity });
  if (layerFault) throw new Refused(400, layerFault.message, layerFault.field);

  const claim = await claimUpload(ownerId, key);
  if (claim === 'unknown') throw new Refused(404, 'There is no upload with that key. Ask for an upload URL first, or the photo was attached already.', 'key');
  if (claim === 'expired') throw new Refused(410, 'That upload has expired. Upload the photo again.', 'key');

  const size = await objectSize(key);
  if (size === undefined) throw new Refused(409, 'The photo has not arrived in storage. Upload it to the URL you were given, then attach it.', 'key');
  if (size > MAX_UPLOAD_BYTES) {
    await deleteObjects([key]);
    throw new Refused(413, TOO_BIG, 'key');
  }
  const bytes = await getObject(key);
  if (!bytes) throw new Refused(409, 'The photo has not arrived in storage. Upload it to the URL you were given, then attach it.', 'key');

  const processed = await processPhotoInTurn(bytes).catch(async (error: unknown) => {
    if (!(error instanceof ImageRejected)) throw error;
    await deleteObjects([key]);
    throw new Refused(422, error.message, 'key');
  });
  const outside = checkRegions(regions, input.layerIds, processed);
  if (outside) throw new Refused(400, outside.message, outside.field);
  const analysis = analyseRegions(processed.analysisImage, regions);

  const files = await writeDerivedFiles(key, bytes.length, processed);
  let photoId: number;
  try {
    photoId = await photoTransaction(db(), async (tx) => {
      if (!(await settleUpload(tx, key))) throw new Refused(409, 'That upload was attached already.', 'key');
      // The uploaded file still carries its GPS position: its entry stays, stale, until it is deleted below.
      if (files.originalKey !== key) await forgetLater(tx, { key, ownerId, contentType: files.contentType, byteSize: bytes.length });
      const id = await insertPhoto(tx, { couponId, ownerId, width: processed.width, height: processed.height, exif: processed.exif, ...files });
      await writeRegions(tx, { id, couponId }, regions, analysis, await layerAlloys(tx, couponId), { replacing: false });
      return id;
    });
  } catch (error) {
    await deleteObjects(files.written).catch(() => undefined);
    if (isMissingParent(error)) throw new Refused(404, 'That coupon was not found.');
    throw error;
  }
  if (files.originalKey !== key) {
    await deleteObjects([key]).then(() => dropEntry(key), () => undefined);
  }
  return photoId;
}
