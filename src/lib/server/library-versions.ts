import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import { couponLayers, coupons, libraryVersions, swatches } from '../../../db/schema';
import type { Database } from '../../../db/client';

/**
 * What every write that can change the library's swatches does inside its transaction, after its
 * own rows: bump the version of each alloy it touched (the library fit's cache key, tint-fit.ts),
 * and keep the coupon's lightness (its first layer's dominant L*, the library's lightness sort)
 * up to date. Version rows are locked last and in alloy order, so these writes never deadlock.
 */

type Writer = Pick<Database, 'insert' | 'update' | 'select'>;

/** The alloys of the coupons' layers. */
export async function alloysOfCoupons(reader: Pick<Database, 'selectDistinct'>, couponIds: number[]): Promise<number[]> {
  if (couponIds.length === 0) return [];
  const rows = await reader.selectDistinct({ alloyId: couponLayers.alloyId }).from(couponLayers).where(inArray(couponLayers.couponId, couponIds));
  return rows.map((row) => row.alloyId);
}

/** The alloys of the coupons of one owner (an account's deletion takes them all). */
export async function alloysOfOwner(reader: Pick<Database, 'selectDistinct'>, ownerId: string): Promise<number[]> {
  const rows = await reader
    .selectDistinct({ alloyId: couponLayers.alloyId })
    .from(couponLayers)
    .innerJoin(coupons, eq(coupons.id, couponLayers.couponId))
    .where(eq(coupons.ownerId, ownerId));
  return rows.map((row) => row.alloyId);
}

/** Adds one to each alloy's library version (a missing row starts at 1). */
export async function bumpLibraryVersions(writer: Writer, alloyIds: Iterable<number>): Promise<void> {
  const ids = [...new Set(alloyIds)].sort((a, b) => a - b);
  if (ids.length === 0) return;
  await writer
    .insert(libraryVersions)
    .values(ids.map((alloyId) => ({ alloyId, version: 1 })))
    .onDuplicateKeyUpdate({ set: { version: sql`${libraryVersions.version} + 1` } });
}

/**
 * The first layer's dominant swatch's L*: its measured cluster with the largest share over all the
 * coupon's photos (means left out; ties to the oldest), as dominantSwatches in library/list.ts picks.
 */
export async function refreshCouponLightness(writer: Writer, couponId: number): Promise<void> {
  const [dominant] = await writer
    .select({ l: swatches.labL })
    .from(swatches)
    .innerJoin(couponLayers, eq(couponLayers.id, swatches.layerId))
    .where(and(eq(couponLayers.couponId, couponId), eq(couponLayers.position, 0), eq(swatches.isMean, false)))
    .orderBy(desc(swatches.share), asc(swatches.id))
    .limit(1);
  await writer
    .update(coupons)
    // Keeps updated_at: a photo is no edit of the coupon's record.
    .set({ dominantLabL: dominant?.l ?? null, updatedAt: sql`${coupons.updatedAt}` })
    .where(eq(coupons.id, couponId));
}
