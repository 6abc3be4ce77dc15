import { eq } from 'drizzle-orm';
import { photos } from '../../../../db/schema';
import { db } from '~/lib/server/db';
import { deleteObjects, listKeys } from '~/lib/server/storage';
import { folderOf } from './keys';
import { bumpLibraryVersions, refreshCouponLightness } from '~/lib/server/library-versions';
import { layerAlloys, lockPhoto, photoTransaction, type PhotoRecord, type Transaction } from './records';
import { dropEntry, forgetLater, type LedgerEntry } from './uploads-ledger';

/**
 * Deleting photos, alone or with their coupon: the rows go in a transaction that gives each
 * photo's folder a ledger entry, then the files, best effort (the sweep removes what is left).
 */

/** The ledger entry that stands for a photo's folder once its row is gone. */
const ledgerEntryOf = (photo: PhotoRecord): LedgerEntry => ({
  key: photo.originalKey,
  ownerId: photo.ownerId,
  contentType: photo.contentType,
  byteSize: photo.byteSize,
});

/**
 * Within a deletion, once the photo's row is locked: a ledger entry for its folder, so the sweep
 * removes what deleting its files leaves. The photo was attached after its upload URL was issued,
 * so the entry holds at least until that URL can no longer be used.
 */
const forgetPhoto = (tx: Transaction, photo: PhotoRecord) => forgetLater(tx, ledgerEntryOf(photo), photo.createdAt);

/**
 * Deletes a photo's files once its row is gone, best effort: what is left, the sweep removes
 * (the folder has its ledger entry).
 */
export async function removePhotoFiles(photo: PhotoRecord): Promise<void> {
  try {
    const own = [photo.originalKey, photo.displayKey, photo.thumbKey, photo.analysisKey].filter((key): key is string => Boolean(key));
    await deleteObjects([...new Set([...own, ...(await listKeys(folderOf(photo.originalKey)))])]);
    await dropEntry(photo.originalKey);
  } catch (error) {
    console.error(`[oxbloom] deleting the files of photo ${photo.id} failed; the sweep will: ${error instanceof Error ? error.message : error}`);
  }
}

/**
 * Deletes a photo: the row (regions and swatches cascade) goes together with a ledger entry for
 * its folder, the coupon's new lightness and its alloys' library versions, then the files. False
 * when it was gone already (deleted, or its coupon was).
 */
export async function deletePhoto(photo: PhotoRecord): Promise<boolean> {
  const deleted = await photoTransaction(db(), async (tx) => {
    if (!(await lockPhoto(tx, photo))) return false;
    await forgetPhoto(tx, photo);
    await tx.delete(photos).where(eq(photos.id, photo.id));
    await refreshCouponLightness(tx, photo.couponId);
    await bumpLibraryVersions(tx, (await layerAlloys(tx, photo.couponId)).values());
    return true;
  });
  if (deleted) await removePhotoFiles(photo);
  return deleted;
}

/**
 * Within a coupon's deletion, once the coupon's row is locked: locks its photos and gives each
 * one's folder a ledger entry. Returns the photos, whose files go after the transaction.
 */
export async function forgetCouponPhotos(tx: Transaction, couponId: number): Promise<PhotoRecord[]> {
  const rows = await tx.select().from(photos).where(eq(photos.couponId, couponId)).for('update');
  for (const row of rows) await forgetPhoto(tx, row);
  return rows;
}
