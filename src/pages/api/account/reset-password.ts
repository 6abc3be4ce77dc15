import type { APIRoute } from 'astro';
import { resetPasswordSchema } from '~/lib/account';
import { resetPassword } from '~/lib/server/accounts';
import { json, parseBody } from '~/lib/server/http';
import { startSession } from '~/lib/server/session';
import { tokenProblem } from '~/lib/server/token-messages';

export const POST: APIRoute = async (context) => {
  const input = await parseBody(context, resetPasswordSchema);
  if (!input.ok) return input.response;
  const result = await resetPassword(input.data.token, input.data.password);
  if (result.status !== 'reset') return tokenProblem(result.status);
  await startSession(context.cookies, context.url, result.user);
  return json({ message: 'Your password is changed and you are signed in.' });
};
