import type { APIRoute } from 'astro';
import { isResponse, requireRole } from '~/lib/server/authorise';
import { json } from '~/lib/server/http';
import { listUsers } from '~/lib/server/users';

export const GET: APIRoute = async (context) => {
  const admin = await requireRole(context, 'admin');
  return isResponse(admin) ? admin : json(await listUsers());
};
