import type { APIRoute } from 'astro';
import { refuseUpload, uploadRequestSchema } from '../../lib/photo-requests';
import type { PhotoContentType } from '../../lib/photos';
import { isResponse, requireRole } from '../../lib/server/authorise';
import { json, parseJson, problem } from '../../lib/server/http';
import { createUpload } from '../../lib/server/uploads';

/** A presigned PUT for one photo, under the caller's own prefix; the browser uploads straight to storage. */
export const POST: APIRoute = async (context) => {
  const user = await requireRole(context, 'member');
  if (isResponse(user)) return user;
  const input = await parseJson(context.request, uploadRequestSchema);
  if (!input.ok) return input.response;
  const refusal = refuseUpload(input.data);
  if (refusal) return problem(refusal.status, refusal.message, refusal.field);
  return json(await createUpload(user.id, input.data.contentType as PhotoContentType, input.data.size), 201);
};
