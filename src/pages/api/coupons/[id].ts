import type { APIRoute } from 'astro';
import { z } from 'zod';
import { couponInputSchema } from '../../../lib/coupons';
import { checkAccess, isResponse, requireCurrentUser } from '../../../lib/server/authorise';
import { couponView, deleteCoupon, findCoupon, updateCoupon } from '../../../lib/server/coupons';
import { json, parseJson, parseValue, problem } from '../../../lib/server/http';

const params = z.object({ id: z.coerce.number().int().positive() });

async function load(context: Parameters<APIRoute>[0]) {
  const id = parseValue(context.params, params);
  if (!id.ok) return problem(404, 'That coupon was not found.');
  return (await findCoupon(id.data.id)) ?? problem(404, 'That coupon was not found.');
}

export const GET: APIRoute = async (context) => {
  const coupon = await load(context);
  if (isResponse(coupon)) return coupon;
  return checkAccess(context.locals.user, coupon, 'see', 'That coupon') ?? json(couponView(coupon, context.locals.user));
};

/** Changes any fields; the merged coupon must pass the same checks as a new one. */
export const PATCH: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const coupon = await load(context);
  if (isResponse(coupon)) return coupon;
  const denied = checkAccess(user, coupon, 'change', 'That coupon');
  if (denied) return denied;
  const changes = await parseJson(context.request, z.record(z.string(), z.unknown()));
  if (!changes.ok) return changes.response;
  const { layerDetails: _details, id: _id, ownerId: _owner, ownerName: _name, layerKey: _key, createdAt: _created, updatedAt: _updated, ...current } = coupon;
  const merged = parseValue({ ...current, ...changes.data }, couponInputSchema);
  if (!merged.ok) return merged.response;
  await updateCoupon(coupon.id, merged.data);
  return json(couponView((await findCoupon(coupon.id))!, user));
};

export const DELETE: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const coupon = await load(context);
  if (isResponse(coupon)) return coupon;
  const denied = checkAccess(user, coupon, 'change', 'That coupon');
  if (denied) return denied;
  await deleteCoupon(coupon.id);
  return new Response(null, { status: 204 });
};
