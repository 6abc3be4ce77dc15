import type { APIRoute } from 'astro';
import { refuseUpload, uploadRequestSchema } from '~/lib/photo-requests';
import type { PhotoContentType } from '~/lib/photos';
import { isResponse, requireCurrentUser } from '~/lib/server/authorise';
import { json, parseJson, problem } from '~/lib/server/http';
import { createUpload, tooManyOpenUploads } from '~/lib/server/photos/uploads-ledger';

/**
 * A presigned PUT for one photo, under the caller's own prefix, signed for its type and size; the
 * browser uploads straight to storage. A 429 while the caller has too many uploads open.
 */
export const POST: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const input = await parseJson(context, uploadRequestSchema);
  if (!input.ok) return input.response;
  const refusal = refuseUpload(input.data);
  if (refusal) return problem(refusal.status, refusal.message, refusal.field);
  const created = await createUpload(user.id, input.data.contentType as PhotoContentType, input.data.size);
  if (created.status === 'limited') {
    const response = problem(429, tooManyOpenUploads(created.retryAfterSeconds));
    response.headers.set('retry-after', String(created.retryAfterSeconds));
    return response;
  }
  return json(created.ticket, 201);
};
