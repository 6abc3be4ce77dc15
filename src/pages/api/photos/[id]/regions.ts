import type { APIRoute } from 'astro';
import { checkRegions, regionsRequestSchema } from '~/lib/photo-requests';
import { isResponse } from '~/lib/server/authorise';
import { photoToChange } from '~/lib/server/coupons';
import { json, parseJson, problem } from '~/lib/server/http';
import { layerIdsOf } from '~/lib/server/photos/records';
import { reanalysePhoto } from '~/lib/server/photos/remeasure';
import { photoView } from '~/lib/server/photos/views';
import { refusalResponse } from '~/lib/server/refusal';

/** Replaces the photo's regions and measures it again; answers the photo with its new swatches. */
export const PUT: APIRoute = async (context) => {
  const found = await photoToChange(context);
  if (isResponse(found)) return found;
  const input = await parseJson(context, regionsRequestSchema);
  if (!input.ok) return input.response;
  const layerIds = await layerIdsOf(found.coupon.id);
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
