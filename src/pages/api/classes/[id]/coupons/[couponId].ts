import type { APIRoute } from 'astro';
import { forbidden, isResponse, notFound } from '~/lib/server/authorise';
import { classToChange } from '~/lib/server/classes/access';
import { classIdsSharing, shareCoupon, unshareCoupon } from '~/lib/server/classes/class-coupons';
import { findCoupon } from '~/lib/server/coupons';
import { json, problem } from '~/lib/server/http';
import { parseRouteId } from '~/lib/server/route-params';
import { maySee } from '~/lib/server/visibility';

async function load(context: Parameters<APIRoute>[0]) {
  const found = await classToChange(context, 'belong');
  if (isResponse(found)) return found;
  const couponId = parseRouteId(context.params.couponId);
  const coupon = couponId ? await findCoupon(couponId) : undefined;
  return { ...found, coupon };
}

/** The coupon's owner shares it with a class they belong to. Sharing changes nobody else's view of it. */
export const PUT: APIRoute = async (context) => {
  const found = await load(context);
  if (isResponse(found)) return found;
  const { coupon, user, cls } = found;
  if (!coupon || !maySee(user, coupon)) return notFound('That coupon');
  if (coupon.ownerId !== user.id) return forbidden();
  await shareCoupon(cls.id, coupon.id);
  return json({ classId: cls.id, couponId: coupon.id, shared: true });
};

/** The owner takes their coupon out of the class; the instructor (or an admin) may too. */
export const DELETE: APIRoute = async (context) => {
  const found = await load(context);
  if (isResponse(found)) return found;
  const { coupon, user, cls, standing } = found;
  const sharedHere = coupon ? (await classIdsSharing(coupon.id)).includes(cls.id) : false;
  if (!coupon || (!sharedHere && !maySee(user, coupon))) return notFound('That coupon');
  if (coupon.ownerId !== user.id && standing !== 'manager') return forbidden();
  if (!(await unshareCoupon(cls.id, coupon.id))) return problem(404, 'That coupon is not shared with this class.');
  return new Response(null, { status: 204 });
};
