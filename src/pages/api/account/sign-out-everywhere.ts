import type { APIRoute } from 'astro';
import { isResponse, requireCurrentUser } from '~/lib/server/authorise';
import { json, wantsHtml } from '~/lib/server/http';
import { closeAllSessions, endSession } from '~/lib/server/session';

/** Ends every session of the signed-in person, on every device, this one included. */
export const POST: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  await closeAllSessions(user.id);
  await endSession(context.cookies, context.url);
  return wantsHtml(context.request) ? context.redirect('/sign-in?signed-out=everywhere', 303) : json({ message: 'Signed out everywhere.' });
};
