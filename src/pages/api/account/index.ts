import type { APIRoute } from 'astro';
import { changeNameSchema, deleteAccountSchema } from '~/lib/account';
import { deleteAccount } from '~/lib/server/account-data';
import { isResponse, requireCurrentUser } from '~/lib/server/authorise';
import { json, parseBody } from '~/lib/server/http';
import { endSession } from '~/lib/server/session';
import { findUserById, updateName } from '~/lib/server/users';

/** My account as the database has it (never the password hash). */
export const GET: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  return isResponse(user) ? user : json(user);
};

export const PATCH: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const input = await parseBody(context, changeNameSchema);
  if (!input.ok) return input.response;
  await updateName(user.id, input.data.name);
  return json(await findUserById(user.id));
};

export const DELETE: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const input = await parseBody(context, deleteAccountSchema);
  if (!input.ok) return input.response;
  await deleteAccount(user.id);
  await endSession(context.cookies, context.url);
  return new Response(null, { status: 204 });
};
