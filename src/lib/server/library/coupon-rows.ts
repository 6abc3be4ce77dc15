import { eq, getTableColumns, type SQL } from 'drizzle-orm';
import { coupons, users } from '../../../../db/schema';
import { layersOf, withLayers, type CouponRecord } from '~/lib/server/coupons';
import { db } from '~/lib/server/db';

export type { CouponRecord };

/** A coupon record with the library's lightness (its first layer's dominant L*; sort key). */
export type LibraryRecord = CouponRecord & { dominantLabL: number | null };

/**
 * Coupon records (with owner name and layers) matching a condition, in an order, one query for
 * the coupons and one for their layers. Shapes rows exactly as findCoupon does.
 */
export async function listCouponRows(where: SQL | undefined, orderBy: SQL[], limit: number, offset = 0): Promise<LibraryRecord[]> {
  const rows = await db()
    .select({ ...getTableColumns(coupons), ownerName: users.name })
    .from(coupons)
    .innerJoin(users, eq(users.id, coupons.ownerId))
    .where(where)
    .orderBy(...orderBy)
    .limit(limit)
    .offset(offset);
  const layers = await layersOf(rows.map((row) => row.id));
  return rows.map((row) => ({ ...withLayers(row, layers.get(row.id)), dominantLabL: row.dominantLabL }));
}
