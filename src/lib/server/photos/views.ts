import { asc, eq, inArray } from 'drizzle-orm';
import { alloys, couponLayers, coupons, photos, regions, swatches } from '../../../../db/schema';
import { nearestTint } from '../../photo-tints';
import type { PhotoView, RegionInput, SwatchGroup, SwatchView } from '../../photos';
import { db } from '../db';
import { decodeForAnalysis } from './decode';
import { decodeAnalysisImage, analyseRegions } from './measure';
import { folderOf, viewUrl } from './keys';
import { isMissingParent, layerAlloys, lockCoupon, photoTransaction, writeRegions, type Transaction } from './records';
import { Refused } from '../refusal';
import { deleteObjects, getObject, listKeys } from '../storage';
import { dropEntry, forgetLater, type LedgerEntry } from './uploads-ledger';

export type PhotoRecord = typeof photos.$inferSelect;

/** A photo with what its access check needs: the owner and visibility of its coupon. */
export interface PhotoWithCoupon {
  photo: PhotoRecord;
  coupon: { id: number; ownerId: string; visibility: 'private' | 'members' | 'public' };
}

export async function findPhoto(id: number): Promise<PhotoWithCoupon | undefined> {
  const [row] = await db()
    .select({ photo: photos, coupon: { id: coupons.id, ownerId: coupons.ownerId, visibility: coupons.visibility } })
    .from(photos)
    .innerJoin(coupons, eq(coupons.id, photos.couponId))
    .where(eq(photos.id, id));
  return row;
}

const swatchView = (row: typeof swatches.$inferSelect): SwatchView => ({
  hex: row.hex,
  lab: { l: row.labL, a: row.labA, b: row.labB },
  oklab: { l: row.oklabL, a: row.oklabA, b: row.oklabB },
  share: row.share,
  spread: row.spread,
});

/** A coupon's photos, oldest first, with regions, swatches per layer and short-lived URLs to show them. */
export async function photoViews(couponId: number): Promise<PhotoView[]> {
  const rows = await db().select().from(photos).where(eq(photos.couponId, couponId)).orderBy(asc(photos.createdAt), asc(photos.id));
  if (rows.length === 0) return [];
  const ids = rows.map((row) => row.id);
  const regionRows = await db().select().from(regions).where(inArray(regions.photoId, ids)).orderBy(asc(regions.id));
  const swatchRows = await db().select().from(swatches).where(inArray(swatches.photoId, ids)).orderBy(asc(swatches.id));
  const layerRows = await db().select({ id: couponLayers.id, alloy: alloys.slug }).from(couponLayers).innerJoin(alloys, eq(alloys.id, couponLayers.alloyId)).where(eq(couponLayers.couponId, couponId));
  const alloyOf = new Map(layerRows.map((layer) => [layer.id, layer.alloy]));
  return Promise.all(rows.map(async (row) => {
    const own = regionRows.filter((region) => region.photoId === row.id);
    const groups = new Map<string, SwatchGroup>();
    for (const swatch of swatchRows.filter((candidate) => candidate.photoId === row.id)) {
      const groupKey = String(swatch.regionId);
      const group: SwatchGroup = groups.get(groupKey) ?? { regionId: swatch.regionId, layerId: swatch.layerId, mean: null, swatches: [], tint: null };
      if (swatch.isMean) group.mean = swatchView(swatch);
      else group.swatches[swatch.rank - 1] = swatchView(swatch);
      groups.set(groupKey, group);
    }
    return {
      id: row.id,
      couponId: row.couponId,
      width: row.width,
      height: row.height,
      contentType: row.contentType,
      byteSize: row.byteSize,
      takenAt: row.takenAt?.toISOString() ?? null,
      camera: row.camera,
      lens: row.lens,
      exposure: row.exposure,
      whiteBalance: row.whiteBalance,
      createdAt: row.createdAt.toISOString(),
      displayUrl: await viewUrl(row.displayKey),
      thumbUrl: await viewUrl(row.thumbKey),
      regions: own.map(({ id, kind, layerId, x, y, width, height }) => ({ id, kind, layerId, x, y, width, height })),
      whiteBalanced: own.some((region) => region.kind === 'grey'),
      groups: [...groups.values()].map((group) => {
        const alloy = group.layerId === null ? undefined : alloyOf.get(group.layerId);
        const tint = alloy && group.mean ? nearestTint(alloy, group.mean.lab) : null;
        return { ...group, swatches: group.swatches.filter(Boolean), tint };
      }),
    };
  }));
}

/** One photo as the API answers it; undefined when it (or its coupon) was deleted meanwhile. */
export async function photoView(photo: PhotoRecord): Promise<PhotoView | undefined> {
  return (await photoViews(photo.couponId)).find((view) => view.id === photo.id);
}

const GONE = 'That photo was not found.';

/** Locks a photo's coupon, then the photo (the order every photo write takes), or finds one gone. */
async function lockPhoto(tx: Transaction, photo: PhotoRecord): Promise<boolean> {
  if (!(await lockCoupon(tx, photo.couponId))) return false;
  const [locked] = await tx.select({ id: photos.id }).from(photos).where(eq(photos.id, photo.id)).for('update');
  return Boolean(locked);
}

const photoExists = async (id: number) => (await db().select({ id: photos.id }).from(photos).where(eq(photos.id, id))).length > 0;

/** The copy colours are measured on: the stored analysis copy, or a fresh decode of the original when there is none. */
async function analysisImageOf(photo: PhotoRecord) {
  const size = { width: photo.width, height: photo.height };
  const copy = photo.analysisKey ? await getObject(photo.analysisKey) : undefined;
  if (copy) return decodeAnalysisImage(copy, size);
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

/** The ledger entry that stands for a photo's folder once its row is gone. */
const ledgerEntryOf = (photo: PhotoRecord): LedgerEntry => ({ key: photo.originalKey, ownerId: photo.ownerId, contentType: photo.contentType, byteSize: photo.byteSize });

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
 * its folder, then the files. False when it was gone already (deleted, or its coupon was).
 */
export async function deletePhoto(photo: PhotoRecord): Promise<boolean> {
  const deleted = await photoTransaction(db(), async (tx) => {
    if (!(await lockPhoto(tx, photo))) return false;
    await forgetPhoto(tx, photo);
    await tx.delete(photos).where(eq(photos.id, photo.id));
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
