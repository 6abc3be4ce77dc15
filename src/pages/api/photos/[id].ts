import type { APIRoute } from 'astro';
import { checkAccess, isResponse, requireCurrentUser } from '../../../lib/server/authorise';
import { json, problem } from '../../../lib/server/http';
import { deletePhoto, findPhoto, photoView } from '../../../lib/server/photos/views';
import { routeId } from '../../../lib/server/route-params';

async function load(params: Record<string, string | undefined>) {
  const id = routeId(params, 'That photo');
  if (isResponse(id)) return id;
  return (await findPhoto(id)) ?? problem(404, 'That photo was not found.');
}

export const GET: APIRoute = async (context) => {
  const found = await load(context.params);
  if (isResponse(found)) return found;
  const denied = checkAccess(context.locals.user, found.coupon, 'see', 'That photo');
  if (denied) return denied;
  const view = await photoView(found.photo);
  return view ? json(view) : problem(404, 'That photo was not found.');
};

/** Deletes the photo, its regions and swatches, and its files in storage (the coupon's owner or an admin). */
export const DELETE: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const found = await load(context.params);
  if (isResponse(found)) return found;
  const denied = checkAccess(user, found.coupon, 'change', 'That photo');
  if (denied) return denied;
  if (!(await deletePhoto(found.photo))) return problem(404, 'That photo was not found.');
  return new Response(null, { status: 204 });
};
