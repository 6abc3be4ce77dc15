import type { APIRoute } from 'astro';
import { createSheetSchema } from '~/lib/sheets/requests';
import { isResponse, requireRole } from '~/lib/server/authorise';
import { json, parseJson } from '~/lib/server/http';
import { classIdsOf } from '~/lib/server/sheets/access';
import { createSheet, findSheet, listSheets } from '~/lib/server/sheets/records';
import { checkClass } from '~/lib/server/sheets/service';
import { sheetView } from '~/lib/server/sheets/view';

/** The sheets the caller may see: public ones, their classes' published ones, and their own. */
export const GET: APIRoute = async ({ locals }) => {
  const sheets = await listSheets(locals.user, await classIdsOf(locals.user));
  return json({ sheets });
};

/** A new draft; instructors and admins only. */
export const POST: APIRoute = async (context) => {
  const user = await requireRole(context, 'instructor');
  if (isResponse(user)) return user;
  const parsed = await parseJson(context, createSheetSchema);
  if (!parsed.ok) return parsed.response;
  const refusal = await checkClass(user, parsed.data.classId);
  if (refusal) return refusal;
  const id = await createSheet(user.id, parsed.data);
  return json(await sheetView((await findSheet(id))!, user), 201, { location: `/api/sheets/${id}` });
};
