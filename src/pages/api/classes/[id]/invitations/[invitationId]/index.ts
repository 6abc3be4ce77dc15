import type { APIRoute } from 'astro';
import { isResponse } from '~/lib/server/authorise';
import { classToChange } from '~/lib/server/classes/access';
import { revokeInvitation } from '~/lib/server/classes/invitations';
import { problem } from '~/lib/server/http';
import { parseRouteId } from '~/lib/server/route-params';

/** Revokes an open invitation: its link stops working. */
export const DELETE: APIRoute = async (context) => {
  const found = await classToChange(context, 'manage');
  if (isResponse(found)) return found;
  const invitationId = parseRouteId(context.params.invitationId);
  if (!invitationId || !(await revokeInvitation(found.cls.id, invitationId))) return problem(404, 'No open invitation with that id in this class.');
  return new Response(null, { status: 204 });
};
