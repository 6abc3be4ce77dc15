import type { APIRoute } from 'astro';
import { checkRegions, regionsRequestSchema } from '../../../../lib/photo-requests';
import { checkAccess, isResponse, requireCurrentUser } from '../../../../lib/server/authorise';
import { db } from '../../../../lib/server/db';
import { json, parseJson, problem } from '../../../../lib/server/http';
import { layerAlloys } from '../../../../lib/server/photos/records';
import { findPhoto, photoView, reanalysePhoto } from '../../../../lib/server/photos/views';
import { refusalResponse } from '../../../../lib/server/refusal';
import { routeId } from '../../../../lib/server/route-params';

/** Replaces the photo's regions and measures it again; answers the photo with its new swatches. */
export const PUT: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const id = routeId(context.params, 'That photo');
  if (isResponse(id)) return id;
  const found = await findPhoto(id);
  const denied = checkAccess(user, found?.coupon, 'change', 'That photo');
  if (denied || !found) return denied ?? problem(404, 'That photo was not found.');
  const input = await parseJson(context.request, regionsRequestSchema);
  if (!input.ok) return input.response;
  const layerIds = [...(await layerAlloys(db(), found.coupon.id)).keys()];
  // Every coupon has a layer: none means it was deleted just now, with this photo.
  if (layerIds.length === 0) return problem(404, 'That photo was not found.');
  const fault = checkRegions(input.data.regions, layerIds, found.photo);
  if (fault) return problem(400, fault.message, fault.field);
  try {
    await reanalysePhoto(found.photo, input.data.regions);
    const view = await photoView(found.photo);
    return view ? json(view) : problem(404, 'That photo was not found.');
  } catch (error) {
    return refusalResponse(error);
  }
};
