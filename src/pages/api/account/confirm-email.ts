import type { APIRoute } from 'astro';
import { z } from 'zod';
import { tokenSchema } from '~/lib/account';
import { confirmEmail } from '~/lib/server/accounts';
import { json, parseBody } from '~/lib/server/http';
import { startSession } from '~/lib/server/session';
import { tokenProblem } from '~/lib/server/token-messages';

export const POST: APIRoute = async (context) => {
  const input = await parseBody(context, z.object({ token: tokenSchema }));
  if (!input.ok) return input.response;
  const result = await confirmEmail(input.data.token);
  if (result.status !== 'confirmed') return tokenProblem(result.status);
  await startSession(context.cookies, context.url, result.user);
  return json({ message: 'Your e-mail address is confirmed and you are signed in.' });
};
