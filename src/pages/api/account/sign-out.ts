import type { APIRoute } from 'astro';
import { json, wantsHtml } from '~/lib/server/http';
import { endSession } from '~/lib/server/session';

/** Ends this session for good, not just its cookie. */
export const POST: APIRoute = async (context) => {
  await endSession(context.cookies, context.url);
  return wantsHtml(context.request) ? context.redirect('/', 303) : json({ message: 'Signed out.' });
};
