import type { APIRoute } from 'astro';
import { json, wantsHtml } from '../../../lib/server/http';
import { endSession } from '../../../lib/server/session';

export const POST: APIRoute = async (context) => {
  endSession(context.cookies, context.url);
  return wantsHtml(context.request) ? context.redirect('/', 303) : json({ message: 'Signed out.' });
};
