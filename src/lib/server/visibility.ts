import { eq, inArray, or, type SQL } from 'drizzle-orm';
import { coupons } from '../../../db/schema';
import type { RoleName } from '~/lib/account';
import type { Visibility } from '~/lib/coupons';

/**
 * Who may see and who may change a coupon (and with it its photos and swatches). One rule, in two
 * forms side by side: for a coupon in hand (maySee, mayChange: the pages and checkAccess), and as
 * a condition on the coupons table (visibleCoupons: lists and the library fit).
 * tests/integration/visibility.test.ts checks the two agree for every kind of viewer.
 *
 * - Everyone, signed in or not, sees public coupons.
 * - A signed-in person also sees members-only coupons, and their own private ones.
 * - An admin sees every coupon.
 * - Only the owner and an admin may change a coupon.
 *
 * Classes: a coupon its owner shares with a class is also seen by that class's students and
 * instructor, but only on the class page and on the coupon's own page (classes/class-coupons.ts,
 * seesThroughClass). maySee and visibleCoupons leave it out on purpose: sharing with a class never
 * widens who sees a coupon in the library, the search, the API's lists or the fit.
 */

/** The person asking; null for a visitor. */
export interface Viewer {
  id: string;
  role: RoleName;
}

export interface CouponAccess {
  ownerId: string;
  visibility: Visibility;
}

export function maySee(viewer: Viewer | null, coupon: CouponAccess): boolean {
  if (coupon.visibility === 'public') return true;
  if (!viewer) return false;
  return viewer.role === 'admin' || coupon.ownerId === viewer.id || coupon.visibility === 'members';
}

export function mayChange(viewer: Viewer | null, coupon: Pick<CouponAccess, 'ownerId'>): boolean {
  return viewer !== null && (viewer.role === 'admin' || coupon.ownerId === viewer.id);
}

/** maySee as a condition on `coupons`; undefined (no condition) for an admin. */
export function visibleCoupons(viewer: Viewer | null): SQL | undefined {
  if (viewer?.role === 'admin') return undefined;
  if (!viewer) return eq(coupons.visibility, 'public');
  return or(inArray(coupons.visibility, ['public', 'members']), eq(coupons.ownerId, viewer.id));
}
