import { checkRegions, TOO_BIG } from '~/lib/photo-requests';
import { MAX_UPLOAD_BYTES, type PhotoContentType, type RegionInput } from '~/lib/photos';
import { db } from '~/lib/server/db';
import { Refused } from '~/lib/server/refusal';
import { deleteObjects, getObject, headObject, listKeys } from '~/lib/server/storage';
import { decodePhoto, ImageRejected, inDecodeTurn } from './decode';
import { deriveFiles, type DerivedFiles } from './derived-files';
import { folderOf, isUsersKey } from './keys';
import { analyseRegions, type PhotoAnalysis } from './measure';
import { isMissingParent, lockCoupon, photoTransaction, recordPhoto, type DecodedFacts } from './records';
import { storeFiles } from './store';
import { claimUpload, dropEntry, forgetLater, settleUpload, type Declared } from './uploads-ledger';

/**
 * Attaching an uploaded photo to a coupon, the walk of an upload after its PUT to storage, one
 * way: the upload is claimed and its stored file checked against what was declared, then the
 * photo is decoded (decode.ts), measured (measure.ts), its files derived (derived-files.ts) and
 * stored (store.ts), and its rows written (records.ts).
 */

export interface AttachInput {
  ownerId: string;
  couponId: number;
  layerIds: number[];
  key: string;
  regions: RegionInput[];
}

const NOT_ARRIVED = 'The photo has not arrived in storage. Upload it to the URL you were given, then attach it.';
const sizeMismatch = (stored: number, declared: number) =>
  `The file in storage has ${stored} bytes, not the ${declared} bytes declared. Upload the photo again.`;

/** The issue time recorded for files no URL was issued for: long past (and inside MariaDB's TIMESTAMP range, which starts in 1970). */
const NO_URL_ISSUED = new Date(Date.UTC(2000, 0, 1));

/** Storage's content type without parameters, in lower case. */
const bareType = (type: string | undefined) => (type ?? '').split(';')[0].trim().toLowerCase();

/**
 * Ends an upload that will not be attached: its file is deleted and its entry made stale, so it
 * no longer counts as open and the sweep removes anything sent to its URL again.
 */
async function retireUpload(ownerId: string, key: string, declared: Declared): Promise<void> {
  await deleteObjects([key]);
  await forgetLater(db(), { key, ownerId, ...declared }, new Date());
}

/** A photo decoded, measured and with its files derived, ready to store: nothing of the decoder's pixels is kept. */
export interface DevelopedPhoto extends DecodedFacts {
  contentType: PhotoContentType;
  analysis: PhotoAnalysis;
  derived: DerivedFiles;
}

/**
 * Decodes a photo, checks its regions against it, measures them and derives its files, a few
 * photos at a time per process. With `declared`, a file of another kind is refused. Throws
 * ImageRejected for a file that cannot be used, Refused for regions that do not fit the photo.
 */
export function developPhoto(bytes: Uint8Array, request: { regions: RegionInput[]; layerIds: number[]; declared?: PhotoContentType }): Promise<DevelopedPhoto> {
  return inDecodeTurn(async () => {
    const decoded = await decodePhoto(bytes, request.declared);
    const outside = checkRegions(request.regions, request.layerIds, decoded);
    if (outside) throw new Refused(400, outside.message, outside.field);
    const analysis = analyseRegions(decoded.analysisImage, request.regions);
    const derived = await deriveFiles(decoded);
    const { width, height, exif, contentType } = decoded;
    return { width, height, exif, contentType, analysis, derived };
  });
}

/**
 * Turns an upload into a stored photo of a coupon (callers have checked the coupon is the
 * owner's): checks the key, claims the upload, checks the stored file against what was declared
 * (size, type, and the kind of image the decoder finds), writes the derived files, then the photo
 * row, its regions and swatches in one transaction that locks the coupon. Refused with a 4xx for
 * every fault of the request or the file; a file that does not match or cannot be used is
 * deleted. Nothing half-done stays: derived files are deleted when the transaction fails, and the
 * upload's ledger entry (see uploads-ledger.ts) lets the sweep remove whatever a crash leaves.
 */
export async function attachPhoto(input: AttachInput): Promise<number> {
  const { ownerId, couponId, key, regions } = input;
  if (!isUsersKey(ownerId, key)) throw new Refused(403, 'That upload belongs to someone else.', 'key');
  const layerFault = checkRegions(regions, input.layerIds, { width: Infinity, height: Infinity });
  if (layerFault) throw new Refused(400, layerFault.message, layerFault.field);

  const claim = await claimUpload(ownerId, key);
  if (claim.status === 'unknown')
    throw new Refused(404, 'There is no upload with that key. Ask for an upload URL first, or the photo was attached already.', 'key');
  if (claim.status === 'expired') throw new Refused(410, 'That upload has expired. Upload the photo again.', 'key');
  const declared: Declared = { contentType: claim.contentType, byteSize: claim.byteSize };
  /** Refuses a file that does not match what was declared or is not a usable photo, and deletes it. */
  const refuse = async (status: number, message: string) => {
    await retireUpload(ownerId, key, declared);
    return new Refused(status, message, 'key');
  };

  // The URL binds type and size, but not every store checks (the local S3 fake does not): check again.
  const stored = await headObject(key);
  if (!stored) throw new Refused(409, NOT_ARRIVED, 'key');
  if (stored.size === 0) throw await refuse(422, new ImageRejected('empty').message);
  if (stored.size > MAX_UPLOAD_BYTES) throw await refuse(413, TOO_BIG);
  if (stored.size !== declared.byteSize) throw await refuse(422, sizeMismatch(stored.size, declared.byteSize));
  if (bareType(stored.contentType) !== declared.contentType) {
    throw await refuse(
      422,
      `The file was stored as ${bareType(stored.contentType).slice(0, 100) || 'no type'}, not as the ${declared.contentType} declared. Upload the photo again.`,
    );
  }
  const bytes = await getObject(key);
  if (!bytes) throw new Refused(409, NOT_ARRIVED, 'key');
  // Sent again between the two reads: what counts is what was read.
  if (bytes.length !== declared.byteSize) throw await refuse(422, sizeMismatch(bytes.length, declared.byteSize));

  const developed = await developPhoto(bytes, { regions, layerIds: input.layerIds, declared: declared.contentType }).catch(async (error: unknown) => {
    if (!(error instanceof ImageRejected)) throw error;
    throw await refuse(422, error.message);
  });

  const files = await storeFiles({ key, byteSize: bytes.length, contentType: developed.contentType }, developed.derived);
  // Files an earlier attempt at this upload stored before it died (its process killed between
  // storing and committing): once this attempt settles the entry, nothing else would name them.
  const strays = (await listKeys(folderOf(key))).filter((stray) => stray !== key && !files.written.includes(stray));
  const couponGone = new Refused(404, 'That coupon was not found.');
  let photoId: number;
  try {
    photoId = await photoTransaction(db(), async (tx) => {
      if (!(await lockCoupon(tx, couponId))) throw couponGone;
      if (!(await settleUpload(tx, key))) throw new Refused(409, 'That upload was attached already.', 'key');
      // The uploaded file still carries its GPS position: its entry stays until the file is deleted
      // below, and while its URL may still be used, so a file sent to it again is swept too.
      if (files.originalKey !== key) await forgetLater(tx, { key, ownerId, contentType: declared.contentType, byteSize: bytes.length }, new Date());
      // No URL was ever issued for them: an entry each, gone once they are deleted (below, or by the sweep).
      for (const stray of strays) await forgetLater(tx, { key: stray, ownerId, contentType: 'application/octet-stream', byteSize: 0 }, NO_URL_ISSUED);
      return recordPhoto(tx, { couponId, ownerId, decoded: developed, files, regions, analysis: developed.analysis });
    });
  } catch (error) {
    // Deleted here, or (when that fails) swept with the upload's folder: its entry is still there.
    await deleteObjects(files.written).catch(() => undefined);
    // Deleted while the photo was processed: the upload has nowhere to go.
    if (error === couponGone) await retireUpload(ownerId, key, declared).catch(() => undefined);
    // A layer removed by an edit of the coupon since the regions were checked.
    if (isMissingParent(error)) throw new Refused(400, 'A layer of those regions is no longer part of the coupon.', 'regions');
    throw error;
  }
  const leftovers = files.originalKey !== key ? [key, ...strays] : strays;
  if (leftovers.length) {
    await deleteObjects(leftovers).then(
      () => Promise.all(leftovers.map((leftover) => dropEntry(leftover))),
      () => undefined,
    );
  }
  return photoId;
}
