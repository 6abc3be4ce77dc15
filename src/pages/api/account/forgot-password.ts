import type { APIRoute } from 'astro';
import { forgotPasswordSchema } from '~/lib/account';
import { requestPasswordReset } from '~/lib/server/accounts';
import { clientAddress } from '~/lib/server/client-address';
import { json, parseBody, tooManyAttempts } from '~/lib/server/http';

export const POST: APIRoute = async (context) => {
  const input = await parseBody(context, forgotPasswordSchema);
  if (!input.ok) return input.response;
  const result = await requestPasswordReset(input.data.email, clientAddress(context));
  if (result.status === 'limited') return tooManyAttempts(result.retryAfterSeconds, context.request);
  return json({ message: 'If that address has an account, a link to reset the password is on its way.' }, 202);
};
