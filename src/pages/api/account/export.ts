import type { APIRoute } from 'astro';
import { exportAccount } from '~/lib/server/account-data';
import { isResponse, requireCurrentUser } from '~/lib/server/authorise';
import { json } from '~/lib/server/http';

export const GET: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const data = await exportAccount(user.id);
  return json(data, 200, { 'content-disposition': `attachment; filename="oxbloom-account-${new Date().toISOString().slice(0, 10)}.json"` });
};
