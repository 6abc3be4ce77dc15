import { asc, eq, getTableColumns, inArray, type SQL } from 'drizzle-orm';
import { alloys, couponLayers, coupons, users } from '../../../../db/schema';
import type { CouponLayer, CouponRecord } from '../coupons';
import { db } from '../db';

export type { CouponRecord };

/**
 * Coupon records (with owner name and layers) matching a condition, in an order, one query for
 * the coupons and one for their layers. Shapes rows exactly as findCoupon does.
 */
export async function listCouponRows(where: SQL | undefined, orderBy: SQL[], limit: number, offset = 0): Promise<CouponRecord[]> {
  const rows = await db()
    .select({ ...getTableColumns(coupons), ownerName: users.name })
    .from(coupons)
    .innerJoin(users, eq(users.id, coupons.ownerId))
    .where(where)
    .orderBy(...orderBy)
    .limit(limit)
    .offset(offset);
  const layers = await layersOf(rows.map((row) => row.id));
  return rows.map((row) => {
    const details = layers.get(row.id) ?? [];
    return { ...row, layers: details.map((layer) => layer.alloy), layerDetails: details };
  });
}

async function layersOf(couponIds: number[]): Promise<Map<number, CouponLayer[]>> {
  const byCoupon = new Map<number, CouponLayer[]>();
  if (couponIds.length === 0) return byCoupon;
  const rows = await db()
    .select({ couponId: couponLayers.couponId, id: couponLayers.id, position: couponLayers.position, alloy: alloys.slug, alloyName: alloys.name })
    .from(couponLayers)
    .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
    .where(inArray(couponLayers.couponId, couponIds))
    .orderBy(asc(couponLayers.couponId), asc(couponLayers.position));
  for (const { couponId, ...layer } of rows) byCoupon.set(couponId, [...(byCoupon.get(couponId) ?? []), layer]);
  return byCoupon;
}
