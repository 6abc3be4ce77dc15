import type { APIRoute } from 'astro';
import { z } from 'zod';
import { couponInputSchema } from '~/lib/coupons';
import { checkAccess, isResponse, requireCurrentUser } from '~/lib/server/authorise';
import { couponFromRoute, couponView, deleteCoupon, findCoupon, heatRecordOf, updateCoupon } from '~/lib/server/coupons';
import { json, parseJson, parseValue, problem } from '~/lib/server/http';

export const GET: APIRoute = async (context) => {
  const coupon = await couponFromRoute(context.params);
  if (isResponse(coupon)) return coupon;
  return checkAccess(context.locals.user, coupon, 'see', 'That coupon') ?? json(couponView(coupon, context.locals.user));
};

/** The caller (as the database has them now) and a coupon they may change, or the refusal. */
async function loadForChange(context: Parameters<APIRoute>[0]) {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const coupon = await couponFromRoute(context.params);
  if (isResponse(coupon)) return coupon;
  return checkAccess(user, coupon, 'change', 'That coupon') ?? { user, coupon };
}

/** Changes any fields; the merged coupon must pass the same checks as a new one. */
export const PATCH: APIRoute = async (context) => {
  const found = await loadForChange(context);
  if (isResponse(found)) return found;
  const { user, coupon } = found;
  const changes = await parseJson(context, z.record(z.string(), z.unknown()));
  if (!changes.ok) return changes.response;
  const merged = parseValue({ ...heatRecordOf(coupon), ...changes.data }, couponInputSchema);
  if (!merged.ok) return merged.response;
  await updateCoupon(coupon.id, merged.data);
  return json(couponView((await findCoupon(coupon.id))!, user));
};

export const DELETE: APIRoute = async (context) => {
  const found = await loadForChange(context);
  if (isResponse(found)) return found;
  if (!(await deleteCoupon(found.coupon.id))) return problem(404, 'That coupon was not found.');
  return new Response(null, { status: 204 });
};
