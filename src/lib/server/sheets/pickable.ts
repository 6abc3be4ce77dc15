import { and, desc, eq, inArray } from 'drizzle-orm';
import { classCoupons, coupons, swatches } from '../../../../db/schema';
import { db } from '../db';
import type { Viewer } from '../visibility';

/** A swatch the sheet builder offers: each photo's leading measured swatch. */
export interface PickableSwatch {
  swatchId: number;
  hex: string;
  couponId: number;
  couponTitle: string;
  temperatureC: number | null;
  holdSeconds: number | null;
}

const columns = {
  swatchId: swatches.id,
  hex: swatches.hex,
  couponId: coupons.id,
  couponTitle: coupons.title,
  temperatureC: coupons.temperatureC,
  holdSeconds: coupons.holdSeconds,
};
const leading = and(eq(swatches.rank, 0), eq(swatches.isMean, false));

/** The builder's two lists: swatches of coupons shared with the sheet's class, and the owner's own. */
export async function pickableSwatches(viewer: Viewer, classId: number | null, limit = 120): Promise<{ fromClass: PickableSwatch[]; own: PickableSwatch[] }> {
  const own = db()
    .select(columns)
    .from(swatches)
    .innerJoin(coupons, eq(coupons.id, swatches.couponId))
    .where(and(eq(coupons.ownerId, viewer.id), leading))
    .orderBy(desc(coupons.createdAt), swatches.id)
    .limit(limit);
  const fromClass =
    classId === null
      ? Promise.resolve([])
      : db()
          .select(columns)
          .from(swatches)
          .innerJoin(coupons, eq(coupons.id, swatches.couponId))
          .where(
            and(inArray(swatches.couponId, db().select({ id: classCoupons.couponId }).from(classCoupons).where(eq(classCoupons.classId, classId))), leading),
          )
          .orderBy(coupons.temperatureC, swatches.id)
          .limit(limit);
  const [ownRows, classRows] = await Promise.all([own, fromClass]);
  return { fromClass: classRows, own: ownRows };
}
