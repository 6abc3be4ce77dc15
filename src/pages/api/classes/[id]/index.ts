import type { APIRoute } from 'astro';
import { classPatchSchema } from '~/lib/classes/requests';
import { isResponse } from '~/lib/server/authorise';
import { classToChange, classToSee } from '~/lib/server/classes/access';
import { deleteClass, findClass, updateClass } from '~/lib/server/classes/classes';
import { classView } from '~/lib/server/classes/views';
import { json, parseJson, problem } from '~/lib/server/http';

export const GET: APIRoute = async (context) => {
  const found = await classToSee(context.locals.user, context.params.id);
  if (isResponse(found)) return found;
  return json(await classView(found.cls, found.standing));
};

export const PATCH: APIRoute = async (context) => {
  const found = await classToChange(context, 'manage');
  if (isResponse(found)) return found;
  const changes = await parseJson(context, classPatchSchema);
  if (!changes.ok) return changes.response;
  await updateClass(found.cls.id, changes.data);
  return json(await classView((await findClass(found.cls.id))!, found.standing));
};

export const DELETE: APIRoute = async (context) => {
  const found = await classToChange(context, 'manage');
  if (isResponse(found)) return found;
  if (!(await deleteClass(found.cls.id))) return problem(404, 'That class was not found.');
  return new Response(null, { status: 204 });
};
