import type { APIRoute } from 'astro';
import { z } from 'zod';
import { changeRoleSchema } from '~/lib/account';
import { isResponse, notFound, requireRole } from '~/lib/server/authorise';
import { json, parseBody, parseValue, problem } from '~/lib/server/http';
import { changeRole, findUserById } from '~/lib/server/users';

export const PATCH: APIRoute = async (context) => {
  const admin = await requireRole(context, 'admin');
  if (isResponse(admin)) return admin;
  const params = parseValue(context.params, z.object({ id: z.string().min(1).max(255) }));
  if (!params.ok) return params.response;
  const input = await parseBody(context, changeRoleSchema);
  if (!input.ok) return input.response;
  const result = await changeRole(params.data.id, input.data.role);
  if (result === 'not-found') return notFound('That user');
  if (result === 'last-admin') return problem(409, 'This is the last admin: make someone else an admin first.', 'role');
  return json(await findUserById(params.data.id));
};
