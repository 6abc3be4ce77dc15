import type { APIRoute } from 'astro';
import { isResponse } from '~/lib/server/authorise';
import { classToChange } from '~/lib/server/classes/access';
import { resendInvitation } from '~/lib/server/classes/invitations';
import { json, problem } from '~/lib/server/http';
import { parseRouteId } from '~/lib/server/route-params';

/** Sends a new link for an open invitation; the old link stops working. */
export const POST: APIRoute = async (context) => {
  const found = await classToChange(context, 'manage');
  if (isResponse(found)) return found;
  const invitationId = parseRouteId(context.params.invitationId);
  const outcome = invitationId ? await resendInvitation(found.cls, found.user, invitationId) : 'not-found';
  if (outcome === 'not-found') return problem(404, 'No open invitation with that id in this class.');
  if (outcome === 'limited') return problem(429, 'Too many invitations to that address this hour. Try again later.');
  return json({ status: 'sent' }, 201);
};
