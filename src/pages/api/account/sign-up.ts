import type { APIRoute } from 'astro';
import { signUpSchema } from '~/lib/account';
import { signUp } from '~/lib/server/accounts';
import { clientAddress } from '~/lib/server/client-address';
import { json, parseBody, tooManyAttempts } from '~/lib/server/http';

export const POST: APIRoute = async (context) => {
  const input = await parseBody(context, signUpSchema);
  if (!input.ok) return input.response;
  const result = await signUp(input.data, clientAddress(context));
  if (result.status === 'limited') return tooManyAttempts(result.retryAfterSeconds, context.request);
  return json({ message: 'Check your e-mail: we sent a link to finish signing up.' }, 202);
};
