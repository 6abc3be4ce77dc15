import type { APIRoute } from 'astro';
import { couponInputSchema } from '~/lib/coupons';
import { isResponse, requireCurrentUser } from '~/lib/server/authorise';
import { couponView, createCoupon, findCoupon } from '~/lib/server/coupons';
import { libraryQuerySchema } from '~/lib/library/query';
import { BadCursor, listLibrary } from '~/lib/server/library/list';
import { json, parseJson, parseValue, problem } from '~/lib/server/http';
import { sendCached } from '~/lib/server/http-cache';
import { libraryAnswer, visitorLibraryAnswer } from '~/lib/server/library/list-answer';

/**
 * Coupons the caller may see (visitors: public ones), filtered, sorted and paged as the library's
 * query says (src/lib/library/query.ts): `?mine=1` for one's own, `cursor` from `nextCursor`.
 * A visitor's page is kept per library version and sent with an ETag (list-answer.ts); a signed-in
 * person's is read afresh and never kept by a cache (the middleware marks it no-store).
 */
export const GET: APIRoute = async (context) => {
  const query = parseValue(Object.fromEntries(context.url.searchParams), libraryQuerySchema);
  if (!query.ok) return query.response;
  const viewer = context.locals.user;
  if (query.data.mineOnly && !viewer) return json({ error: 'Sign in to see your own coupons.' }, 401);
  try {
    if (!viewer) return sendCached(context.request, await visitorLibraryAnswer(query.data), 'public, no-cache', { vary: 'cookie' });
    return json(libraryAnswer(await listLibrary(viewer, query.data), query.data, viewer));
  } catch (error) {
    if (error instanceof BadCursor) return problem(400, `cursor: ${error.message}`, 'cursor');
    throw error;
  }
};

export const POST: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const input = await parseJson(context, couponInputSchema);
  if (!input.ok) return input.response;
  const id = await createCoupon(user.id, input.data);
  return json(couponView((await findCoupon(id))!, user), 201, { location: `/api/coupons/${id}` });
};
