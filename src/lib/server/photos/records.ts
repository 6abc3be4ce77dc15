import { eq } from 'drizzle-orm';
import { couponLayers, coupons, photos, regions, swatches } from '../../../../db/schema';
import type { Database } from '../../../../db/client';
import type { Swatch } from '~/lib/analysis';
import type { RegionInput } from '~/lib/photos';
import { db } from '~/lib/server/db';
import type { CouponAccess } from '~/lib/server/visibility';
import type { PhotoAnalysis } from './measure';
import { exifColumns, type PhotoExif } from './metadata';
import type { PhotoFiles } from './store';
import { bumpLibraryVersions, refreshCouponLightness } from '~/lib/server/library-versions';

/**
 * A photo's rows: the photo, its regions and swatches — found, locked and written (the upload's
 * last step). Writers take the database or a transaction (the seed passes its own).
 */

type Writer = Pick<Database, 'insert' | 'delete' | 'select' | 'update'>;
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
export type PhotoRecord = typeof photos.$inferSelect;

/** A photo with what its access check needs: the owner and visibility of its coupon. */
export interface PhotoWithCoupon {
  photo: PhotoRecord;
  coupon: { id: number } & CouponAccess;
}

export async function findPhoto(id: number): Promise<PhotoWithCoupon | undefined> {
  const [row] = await db()
    .select({ photo: photos, coupon: { id: coupons.id, ownerId: coupons.ownerId, visibility: coupons.visibility } })
    .from(photos)
    .innerJoin(coupons, eq(coupons.id, photos.couponId))
    .where(eq(photos.id, id));
  return row;
}

export const photoExists = async (id: number) => (await db().select({ id: photos.id }).from(photos).where(eq(photos.id, id))).length > 0;

const DEADLOCK = 1213;
const errnoOf = (error: unknown) => {
  const failure = error as { errno?: number; cause?: { errno?: number } } | undefined;
  return failure?.errno ?? failure?.cause?.errno;
};

/**
 * A transaction for photo writes: READ COMMITTED, so deleting a photo's rows takes no gap locks
 * that block another photo's inserts, and tried again (up to three times) if InnoDB still picks
 * it as a deadlock victim, as it may when several photos are saved at once.
 */
export async function photoTransaction<T>(database: Database, work: (tx: Transaction) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt += 1) {
    try {
      return await database.transaction(work, { isolationLevel: 'read committed' });
    } catch (error) {
      if (errnoOf(error) !== DEADLOCK || attempt >= 3) throw error;
      await new Promise((resolve) => setTimeout(resolve, 20 * attempt + Math.random() * 30));
    }
  }
}

/**
 * Within a transaction: locks a coupon's row, or finds it gone (false). Every write of a coupon's
 * photos and the coupon's deletion lock it first, so they take turns: a photo is attached before
 * the deletion reads the coupon's photos, or finds the coupon gone; and the locks are always taken
 * in one order (coupon, then photo), so these writes never deadlock each other.
 */
export async function lockCoupon(tx: Pick<Database, 'select'>, couponId: number): Promise<boolean> {
  const [row] = await tx.select({ id: coupons.id }).from(coupons).where(eq(coupons.id, couponId)).for('update');
  return Boolean(row);
}

/** Locks a photo's coupon, then the photo (the order every photo write takes), or finds one gone (false). */
export async function lockPhoto(tx: Transaction, photo: PhotoRecord): Promise<boolean> {
  if (!(await lockCoupon(tx, photo.couponId))) return false;
  const [locked] = await tx.select({ id: photos.id }).from(photos).where(eq(photos.id, photo.id)).for('update');
  return Boolean(locked);
}

/** What the decoder found that a photo's row keeps: its upright size and EXIF. */
export interface DecodedFacts {
  width: number;
  height: number;
  exif: PhotoExif;
}

async function insertPhoto(writer: Writer, photo: { couponId: number; ownerId: string } & DecodedFacts & PhotoFiles): Promise<number> {
  const { exif, ...rest } = photo;
  const [{ id }] = await writer
    .insert(photos)
    .values({ ...rest, ...exifColumns(exif) })
    .$returningId();
  return id;
}

/** The alloy of each layer of a coupon, for copying onto swatches. */
export async function layerAlloys(reader: Pick<Database, 'select'>, couponId: number): Promise<Map<number, number>> {
  const rows = await reader.select({ id: couponLayers.id, alloyId: couponLayers.alloyId }).from(couponLayers).where(eq(couponLayers.couponId, couponId));
  return new Map(rows.map((row) => [row.id, row.alloyId]));
}

/** The ids of a coupon's layers (none when the coupon is gone). */
export async function layerIdsOf(couponId: number): Promise<number[]> {
  return [...(await layerAlloys(db(), couponId)).keys()];
}

const swatchColumns = (swatch: Swatch) => ({
  share: swatch.share,
  spread: swatch.spread,
  hex: swatch.hex,
  labL: swatch.lab.l,
  labA: swatch.lab.a,
  labB: swatch.lab.b,
  oklabL: swatch.oklab.l,
  oklabA: swatch.oklab.a,
  oklabB: swatch.oklab.b,
});

/**
 * Writes a photo's regions and swatches (replacing what it had when `replacing`).
 * `analysis.regions` follows the layer regions in the order given (see analyseRegions), or is
 * the whole photo when there are none: those swatches get no region and no layer. Each group
 * stores its mean (rank 0, isMean) and its swatches ranked 1… by share. Then the coupon's
 * lightness is worked out again and its alloys' library versions go up.
 */
export async function writeRegions(
  writer: Writer,
  photo: { id: number; couponId: number },
  drawn: RegionInput[],
  analysis: PhotoAnalysis,
  alloyByLayer: Map<number, number>,
  { replacing }: { replacing: boolean },
): Promise<void> {
  if (replacing) {
    await writer.delete(swatches).where(eq(swatches.photoId, photo.id));
    await writer.delete(regions).where(eq(regions.photoId, photo.id));
  }
  const layerRegions = drawn.filter((region) => region.kind === 'layer');
  const groups: { regionId: number | null; layerId: number | null }[] = [];
  for (const region of drawn) {
    const layerId = region.kind === 'layer' ? region.layerId : null;
    const reflectance = region.kind === 'grey' ? (region.reflectance ?? null) : null;
    const { x, y, width, height } = region;
    const [{ id }] = await writer.insert(regions).values({ photoId: photo.id, kind: region.kind, layerId, x, y, width, height, reflectance }).$returningId();
    if (region.kind === 'layer') groups.push({ regionId: id, layerId });
  }
  if (layerRegions.length === 0) groups.push({ regionId: null, layerId: null });
  const rows = analysis.regions.flatMap((result, index) => {
    const { regionId, layerId } = groups[index];
    const common = { regionId, layerId, photoId: photo.id, couponId: photo.couponId, alloyId: layerId === null ? null : (alloyByLayer.get(layerId) ?? null) };
    return [
      ...(result.mean ? [{ ...common, rank: 0, isMean: true, ...swatchColumns(result.mean) }] : []),
      ...result.swatches.map((swatch, rank) => ({ ...common, rank: rank + 1, isMean: false, ...swatchColumns(swatch) })),
    ];
  });
  if (rows.length) await writer.insert(swatches).values(rows);
  await refreshCouponLightness(writer, photo.couponId);
  await bumpLibraryVersions(writer, alloyByLayer.values());
}

/** MariaDB's "a foreign key constraint fails" when the coupon went while the photo was processed. */
export const isMissingParent = (error: unknown) => errnoOf(error) === 1452;

export interface NewPhoto {
  couponId: number;
  ownerId: string;
  decoded: DecodedFacts;
  files: PhotoFiles;
  regions: RegionInput[];
  analysis: PhotoAnalysis;
}

/** Within a transaction: writes a new photo's row, its regions and swatches. Returns its id. */
export async function recordPhoto(tx: Writer, photo: NewPhoto): Promise<number> {
  const { couponId, ownerId, decoded, files } = photo;
  const id = await insertPhoto(tx, { couponId, ownerId, width: decoded.width, height: decoded.height, exif: decoded.exif, ...files });
  await writeRegions(tx, { id, couponId }, photo.regions, photo.analysis, await layerAlloys(tx, couponId), { replacing: false });
  return id;
}
