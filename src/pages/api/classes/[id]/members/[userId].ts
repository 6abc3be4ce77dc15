import type { APIRoute } from 'astro';
import { z } from 'zod';
import { forbidden, isResponse } from '~/lib/server/authorise';
import { classToChange } from '~/lib/server/classes/access';
import { removeStudent } from '~/lib/server/classes/roster';
import { parseValue, problem } from '~/lib/server/http';

const userIdSchema = z.string().min(1).max(255);

/** The instructor (or an admin) removes a student; a student removes themselves (leaves). */
export const DELETE: APIRoute = async (context) => {
  const found = await classToChange(context, 'belong');
  if (isResponse(found)) return found;
  const userId = parseValue(context.params.userId, userIdSchema);
  if (!userId.ok) return userId.response;
  if (found.standing !== 'manager' && userId.data !== found.user.id) return forbidden();
  if (!(await removeStudent(found.cls.id, userId.data))) return problem(404, 'That person is not a student of this class.');
  return new Response(null, { status: 204 });
};
