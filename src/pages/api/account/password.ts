import type { APIRoute } from 'astro';
import { changePasswordSchema } from '~/lib/account';
import { changePassword } from '~/lib/server/accounts';
import { isResponse, requireCurrentUser } from '~/lib/server/authorise';
import { json, parseBody, problem, tooManyAttempts } from '~/lib/server/http';
import { startSession } from '~/lib/server/session';

/** Changes the password; every other session ends, and this browser gets a new one. */
export const POST: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const input = await parseBody(context, changePasswordSchema);
  if (!input.ok) return input.response;
  const result = await changePassword(user.id, input.data.currentPassword, input.data.newPassword);
  if (result.status === 'limited') return tooManyAttempts(result.retryAfterSeconds, context.request);
  if (result.status === 'wrong-password') return problem(400, 'currentPassword: That is not your current password.', 'currentPassword');
  await startSession(context.cookies, context.url, user);
  return json({ message: 'Your password is changed.' });
};
