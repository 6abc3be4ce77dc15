import type { APIRoute } from 'astro';
import { inviteSchema } from '~/lib/classes/requests';
import { isResponse } from '~/lib/server/authorise';
import { classToChange } from '~/lib/server/classes/access';
import { inviteToClass, pendingInvitations } from '~/lib/server/classes/invitations';
import { json, parseBody } from '~/lib/server/http';

/** The class's open invitations (managers only). */
export const GET: APIRoute = async (context) => {
  const found = await classToChange(context, 'manage');
  if (isResponse(found)) return found;
  const list = await pendingInvitations(found.cls.id);
  return json({ invitations: list.map((row) => ({ id: row.id, email: row.email, expiresAt: row.expiresAt.toISOString(), expired: row.expired })) });
};

/** Invites addresses by e-mail; each answer says whether a mail went out. */
export const POST: APIRoute = async (context) => {
  const found = await classToChange(context, 'manage');
  if (isResponse(found)) return found;
  const input = await parseBody(context, inviteSchema);
  if (!input.ok) return input.response;
  const outcomes = await inviteToClass(found.cls, found.user, input.data.emails);
  return json({ invitations: outcomes }, outcomes.some((outcome) => outcome.status === 'sent') ? 201 : 200);
};
