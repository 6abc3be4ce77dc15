import type { APIRoute } from 'astro';
import { attachRequestSchema } from '~/lib/photo-requests';
import { checkAccess, isResponse, requireCurrentUser } from '~/lib/server/authorise';
import { couponFromRoute } from '~/lib/server/coupons';
import { json, parseJson, problem } from '~/lib/server/http';
import { attachPhoto } from '~/lib/server/photos/attach';
import { findPhoto } from '~/lib/server/photos/records';
import { photoView, photoViews } from '~/lib/server/photos/views';
import { refusalResponse } from '~/lib/server/refusal';

/** The coupon's photos with regions and swatches, for anyone who may see the coupon. */
export const GET: APIRoute = async (context) => {
  const coupon = await couponFromRoute(context.params);
  if (isResponse(coupon)) return coupon;
  return checkAccess(context.locals.user, coupon, 'see', 'That coupon') ?? json({ photos: await photoViews(coupon.id) });
};

/** Attaches an uploaded photo to the coupon: decoded, measured, stored; answers the photo with its swatches. */
export const POST: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const coupon = await couponFromRoute(context.params);
  if (isResponse(coupon)) return coupon;
  const denied = checkAccess(user, coupon, 'change', 'That coupon');
  if (denied) return denied;
  const input = await parseJson(context, attachRequestSchema);
  if (!input.ok) return input.response;
  try {
    const layerIds = coupon.layerDetails.map((layer) => layer.id);
    const id = await attachPhoto({ ownerId: user.id, couponId: coupon.id, layerIds, key: input.data.key, regions: input.data.regions ?? [] });
    const stored = await findPhoto(id);
    const view = stored && (await photoView(stored.photo));
    // Attached, and then the coupon was deleted with it before we could answer.
    if (!view) return problem(404, 'That coupon was not found.');
    return json(view, 201, { location: `/api/photos/${id}` });
  } catch (error) {
    return refusalResponse(error);
  }
};
