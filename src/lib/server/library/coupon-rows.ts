import { getTableColumns, inArray, type SQL } from 'drizzle-orm';
import { coupons, users } from '../../../../db/schema';
import { layersOf, withLayers, type CouponRecord } from '~/lib/server/coupons';
import { db } from '~/lib/server/db';

export type { CouponRecord };

/** A coupon record with the library's lightness (its first layer's dominant L*; sort key). */
export type LibraryRecord = CouponRecord & { dominantLabL: number | null };

/**
 * Coupon records (with owner name and layers) matching a condition, in an order: one query for
 * the coupons, then one for their owners' names and one for their layers. The owners are read
 * apart so the coupons' query has one table to plan: joined, MariaDB may start from the people
 * and sort every visible coupon instead of walking the sort column's index to the page's end.
 * Shapes rows exactly as findCoupon does.
 */
export async function listCouponRows(where: SQL | undefined, orderBy: SQL[], limit: number, offset = 0): Promise<LibraryRecord[]> {
  const rows = await db()
    .select(getTableColumns(coupons))
    .from(coupons)
    .where(where)
    .orderBy(...orderBy)
    .limit(limit)
    .offset(offset);
  if (rows.length === 0) return [];
  const [owners, layers] = await Promise.all([
    db()
      .select({ id: users.id, name: users.name })
      .from(users)
      .where(inArray(users.id, [...new Set(rows.map((row) => row.ownerId))])),
    layersOf(rows.map((row) => row.id)),
  ]);
  const nameOf = new Map(owners.map((owner) => [owner.id, owner.name]));
  return rows.map((row) => ({ ...withLayers({ ...row, ownerName: nameOf.get(row.ownerId) ?? null }, layers.get(row.id)), dominantLabL: row.dominantLabL }));
}
