import type { APIRoute } from 'astro';
import { classInputSchema } from '~/lib/classes/requests';
import { isResponse, requireCurrentUser, requireRole } from '~/lib/server/authorise';
import { classesFor, createClass, findClass } from '~/lib/server/classes/classes';
import { classView } from '~/lib/server/classes/views';
import { json, parseBody } from '~/lib/server/http';

/** The classes the caller teaches or belongs to (an admin: every class). */
export const GET: APIRoute = async (context) => {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const list = await classesFor(user);
  return json({
    classes: list.map((cls) => ({
      id: cls.id,
      name: cls.name,
      term: cls.term,
      instructor: { id: cls.instructorId, name: cls.instructorName },
      standing: cls.standing,
      students: cls.students,
      coupons: cls.coupons,
      ...(cls.standing === 'student' ? {} : { pendingInvitations: cls.pending }),
    })),
  });
};

/** An instructor (or admin) starts a class; they are its instructor. */
export const POST: APIRoute = async (context) => {
  const user = await requireRole(context, 'instructor');
  if (isResponse(user)) return user;
  const input = await parseBody(context, classInputSchema);
  if (!input.ok) return input.response;
  const id = await createClass(user.id, input.data);
  return json(await classView((await findClass(id))!, 'manager'), 201, { location: `/api/classes/${id}` });
};
