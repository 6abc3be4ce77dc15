import type { APIRoute } from 'astro';
import { z } from 'zod';
import { couponInputSchema } from '../../../lib/coupons';
import { isResponse, requireCurrentUser } from '../../../lib/server/authorise';
import { couponView, createCoupon, findCoupon, listCoupons } from '../../../lib/server/coupons';
import { json, parseJson, parseValue } from '../../../lib/server/http';

const listQuery = z.object({
  mine: z.enum(['1', 'true']).optional(),
  limit: z.coerce.number().int().min(1).max(100).default(25),
  offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
});

/** Coupons the caller may see (visitors: public ones), newest first; `?mine=1` for one's own. */
export const GET: APIRoute = async (context) => {
  const query = parseValue(Object.fromEntries(context.url.searchParams), listQuery);
  if (!query.ok) return query.response;
  const viewer = context.locals.user;
  if (query.data.mine && !viewer) return json({ error: 'Sign in to see your own coupons.' }, 401);
  const page = await listCoupons(viewer, { ownerId: query.data.mine ? viewer!.id : undefined, limit: query.data.limit, offset: query.data.offset });
  return json({ coupons: page.coupons.map((coupon) => couponView(coupon, viewer)), total: page.total, limit: query.data.limit, offset: query.data.offset });
};

export const POST: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const input = await parseJson(context.request, couponInputSchema);
  if (!input.ok) return input.response;
  const id = await createCoupon(user.id, input.data);
  return json(couponView((await findCoupon(id))!, user), 201, { location: `/api/coupons/${id}` });
};
