import type { APIRoute } from 'astro';
import { updateSheetSchema } from '~/lib/sheets/requests';
import { forbidden, isResponse, requireCurrentUser } from '~/lib/server/authorise';
import { json, parseJson, problem } from '~/lib/server/http';
import { mayChangeSheet } from '~/lib/server/sheets/access';
import { deleteSheet, findSheet } from '~/lib/server/sheets/records';
import { changeSheet, sheetFromRoute } from '~/lib/server/sheets/service';
import { sheetView } from '~/lib/server/sheets/view';

export const GET: APIRoute = async ({ params, locals }) => {
  const sheet = await sheetFromRoute(params, locals.user);
  if (isResponse(sheet)) return sheet;
  return json(await sheetView(sheet, locals.user));
};

/** The caller (as the database has them now) and a sheet they may change, or the refusal. */
async function loadForChange(context: Parameters<APIRoute>[0]) {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const sheet = await sheetFromRoute(context.params, user);
  if (isResponse(sheet)) return sheet;
  return mayChangeSheet(user, sheet) ? { user, sheet } : forbidden();
}

/** Changes settings, replaces the ordered entries, publishes or withdraws. */
export const PATCH: APIRoute = async (context) => {
  const found = await loadForChange(context);
  if (isResponse(found)) return found;
  const parsed = await parseJson(context, updateSheetSchema);
  if (!parsed.ok) return parsed.response;
  const refusal = await changeSheet(found.sheet, parsed.data, found.user);
  if (refusal) return refusal;
  return json(await sheetView((await findSheet(found.sheet.id))!, found.user));
};

export const DELETE: APIRoute = async (context) => {
  const found = await loadForChange(context);
  if (isResponse(found)) return found;
  if (!(await deleteSheet(found.sheet.id))) return problem(404, 'That sheet was not found.');
  return new Response(null, { status: 204 });
};
