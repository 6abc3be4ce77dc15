import { and, desc, eq, inArray, or } from 'drizzle-orm';
import { classCoupons, classes, classMembers, coupons } from '../../../../db/schema';
import type { CohortCoupon } from '~/lib/classes/cohort';
import { db } from '../db';
import { listCouponRows, type CouponRecord } from '../library/coupon-rows';
import { dominantSwatches } from '../library/list';
import type { Viewer } from '../visibility';
import { standingIn } from './access';
import { findClass } from './classes';

/** The most coupons a class page shows at once. */
export const CLASS_COUPON_LIMIT = 500;

/**
 * Sharing a coupon with a class lets the class's students and instructor (and admins) see it on
 * the class page and on the coupon's own page, whatever its visibility; it never changes the
 * coupon's visibility for anyone else (see visibility.ts). Only the coupon's owner shares it, and
 * only with a class they belong to; the owner or the class's instructor (or an admin) takes it out.
 */

export type ShareOutcome = 'shared' | 'not-found' | 'forbidden';

/** Classes where `userId` is a student or the instructor: where they may share. */
export async function classesToShareWith(userId: string): Promise<{ id: number; name: string; term: string | null }[]> {
  const memberOf = db().select({ classId: classMembers.classId }).from(classMembers).where(eq(classMembers.userId, userId));
  return db()
    .select({ id: classes.id, name: classes.name, term: classes.term })
    .from(classes)
    .where(or(eq(classes.instructorId, userId), inArray(classes.id, memberOf)))
    .orderBy(desc(classes.createdAt), desc(classes.id))
    .limit(200);
}

/** Ids of the classes a coupon is shared with. */
export async function classIdsSharing(couponId: number): Promise<number[]> {
  const rows = await db().select({ classId: classCoupons.classId }).from(classCoupons).where(eq(classCoupons.couponId, couponId));
  return rows.map((row) => row.classId);
}

export async function shareCoupon(classId: number, couponId: number): Promise<void> {
  await db().insert(classCoupons).ignore().values({ classId, couponId });
}

export async function unshareCoupon(classId: number, couponId: number): Promise<boolean> {
  const [result] = await db()
    .delete(classCoupons)
    .where(and(eq(classCoupons.classId, classId), eq(classCoupons.couponId, couponId)));
  return result.affectedRows === 1;
}

/**
 * Sets which of the owner's classes a coupon is shared with (the coupon page's and form's choice):
 * classes the owner may share with are added or removed; any others are left as they are.
 */
export async function setCouponClasses(ownerId: string, couponId: number, classIds: number[]): Promise<void> {
  const allowed = new Set((await classesToShareWith(ownerId)).map((cls) => cls.id));
  const current = new Set(await classIdsSharing(couponId));
  for (const id of allowed) {
    if (classIds.includes(id) && !current.has(id)) await shareCoupon(id, couponId);
    if (!classIds.includes(id) && current.has(id)) await unshareCoupon(id, couponId);
  }
}

/**
 * Whether the viewer sees the coupon through a class it is shared with (as a student, the
 * instructor, or an admin). The coupon page adds this to maySee; nothing else does.
 */
export async function seesThroughClass(viewer: Viewer | null, couponId: number): Promise<boolean> {
  if (!viewer) return false;
  for (const classId of await classIdsSharing(couponId)) {
    const cls = await findClass(classId);
    if (cls && (await standingIn(viewer, cls))) return true;
  }
  return false;
}

export type ClassCoupon = CouponRecord & { swatches: { alloy: string; hex: string }[] };

/** The coupons shared with a class, newest first, each with its layers' dominant swatches. */
export async function classCouponRows(classId: number): Promise<ClassCoupon[]> {
  const shared = db().select({ id: classCoupons.couponId }).from(classCoupons).where(eq(classCoupons.classId, classId));
  const rows = await listCouponRows(inArray(coupons.id, shared), [desc(coupons.createdAt), desc(coupons.id)], CLASS_COUPON_LIMIT);
  const dominant = await dominantSwatches(rows.flatMap((coupon) => coupon.layerDetails.map((layer) => layer.id)));
  return rows.map((coupon) => ({
    ...coupon,
    swatches: coupon.layerDetails.flatMap((layer) => {
      const swatch = dominant.get(layer.id);
      return swatch ? [{ alloy: layer.alloyName, hex: swatch.hex }] : [];
    }),
  }));
}

export const cohortCoupon = (coupon: ClassCoupon): CohortCoupon => ({
  id: coupon.id,
  title: coupon.title,
  ownerName: coupon.ownerName,
  layerKey: coupon.layerKey,
  alloyNames: coupon.layerDetails.map((layer) => layer.alloyName),
  temperatureC: coupon.temperatureC,
  holdSeconds: coupon.holdSeconds,
  anodizeVolts: coupon.process === 'anodize' ? coupon.volts : null,
  swatches: coupon.swatches,
});
