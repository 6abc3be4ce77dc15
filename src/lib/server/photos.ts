import { asc, eq, inArray } from 'drizzle-orm';
import { alloys, couponLayers, coupons, photos, regions, swatches } from '../../../db/schema';
import { nearestTint } from '../photo-tints';
import type { PhotoView, RegionInput, SwatchGroup, SwatchView } from '../photos';
import { db } from './db';
import { decodeForAnalysis } from './image';
import { decodeAnalysisImage, analyseRegions } from './photo-analysis';
import { folderOf, viewUrl } from './photo-files';
import { isMissingParent, layerAlloys, photoTransaction, writeRegions } from './photo-records';
import { Refused } from './refusal';
import { deleteObjects, getObject, listKeys } from './storage';
import { dropEntry, forgetLater } from './uploads';

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

export async function photoView(photo: PhotoRecord): Promise<PhotoView> {
  return (await photoViews(photo.couponId)).find((view) => view.id === photo.id)!;
}

/** The copy colours are measured on: the stored analysis copy, or a fresh decode of the original when there is none. */
async function analysisImageOf(photo: PhotoRecord) {
  const size = { width: photo.width, height: photo.height };
  const copy = photo.analysisKey ? await getObject(photo.analysisKey) : undefined;
  if (copy) return decodeAnalysisImage(copy, size);
  const original = await getObject(photo.originalKey);
  if (!original) throw new Refused(409, 'The original of this photo is missing from storage; delete the photo and upload it again.');
  return decodeForAnalysis(original);
}

/** Measures the photo again with these regions and replaces its regions and swatches. */
export async function reanalysePhoto(photo: PhotoRecord, drawn: RegionInput[]): Promise<void> {
  const analysis = analyseRegions(await analysisImageOf(photo), drawn);
  try {
    await photoTransaction(db(), async (tx) => {
      // Locks the photo row, so two saves of the same photo take turns instead of mixing.
      const [locked] = await tx.select({ id: photos.id }).from(photos).where(eq(photos.id, photo.id)).for('update');
      if (!locked) throw new Refused(404, 'That photo was not found.');
      await writeRegions(tx, photo, drawn, analysis, await layerAlloys(tx, photo.couponId), { replacing: true });
    });
  } catch (error) {
    if (isMissingParent(error)) throw new Refused(400, 'A layer of those regions is no longer part of the coupon.', 'regions');
    throw error;
  }
}

/**
 * Deletes a photo: the row (regions and swatches cascade) goes together with a stale ledger
 * entry for its folder, then the files; if deleting the files fails, the sweep finishes the job.
 */
export async function deletePhoto(photo: PhotoRecord): Promise<void> {
  await photoTransaction(db(), async (tx) => {
    // The photo was attached after its upload URL was issued: the entry stays until that URL can no longer be used.
    await forgetLater(tx, { key: photo.originalKey, ownerId: photo.ownerId, contentType: photo.contentType, byteSize: photo.byteSize }, photo.createdAt);
    await tx.delete(photos).where(eq(photos.id, photo.id));
  });
  const own = [photo.originalKey, photo.displayKey, photo.thumbKey, photo.analysisKey].filter((key): key is string => Boolean(key));
  await deleteObjects([...new Set([...own, ...(await listKeys(folderOf(photo.originalKey)))])]);
  await dropEntry(photo.originalKey);
}

/** Every stored file of a coupon's photos (for deleting the coupon). */
export async function couponPhotoFiles(couponId: number): Promise<string[]> {
  const rows = await db().select().from(photos).where(eq(photos.couponId, couponId));
  return rows.flatMap((row) => [row.originalKey, row.displayKey, row.thumbKey, row.analysisKey].filter((key): key is string => Boolean(key)));
}
