import type { APIRoute } from 'astro';
import { checkAccess, isResponse } from '~/lib/server/authorise';
import { photoFromRoute, photoToChange } from '~/lib/server/coupons';
import { json, problem } from '~/lib/server/http';
import { deletePhoto } from '~/lib/server/photos/deletion';
import { photoView } from '~/lib/server/photos/views';

export const GET: APIRoute = async (context) => {
  const found = await photoFromRoute(context.params);
  if (isResponse(found)) return found;
  const denied = checkAccess(context.locals.user, found.coupon, 'see', 'That photo');
  if (denied) return denied;
  const view = await photoView(found.photo);
  return view ? json(view) : problem(404, 'That photo was not found.');
};

/** Deletes the photo, its regions and swatches, and its files in storage (the coupon's owner or an admin). */
export const DELETE: APIRoute = async (context) => {
  const found = await photoToChange(context);
  if (isResponse(found)) return found;
  if (!(await deletePhoto(found.photo))) return problem(404, 'That photo was not found.');
  return new Response(null, { status: 204 });
};
