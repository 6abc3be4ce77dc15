import type { APIContext } from 'astro';
import { and, eq } from 'drizzle-orm';
import { classMembers } from '../../../../db/schema';
import { forbidden, isResponse, notFound, requireCurrentUser } from '../authorise';
import { db } from '../db';
import { parseRouteId } from '../route-params';
import type { UserRecord } from '../users';
import type { Viewer } from '../visibility';
import { findClass, type ClassRecord } from './classes';

/**
 * Who may see and run a class. The class's instructor and admins manage it; its students see it
 * and what is shared with it; nobody else learns it exists (404, whatever the id). A student who
 * tries to manage gets 403: they may see the class, not change it.
 */
export type ClassStanding = 'manager' | 'student';

export async function isStudentOf(classId: number, userId: string): Promise<boolean> {
  const [row] = await db()
    .select({ userId: classMembers.userId })
    .from(classMembers)
    .where(and(eq(classMembers.classId, classId), eq(classMembers.userId, userId)));
  return row !== undefined;
}

/** The viewer's standing in the class, or null when they may not see it. */
export async function standingIn(viewer: Viewer | null, cls: Pick<ClassRecord, 'id' | 'instructorId'>): Promise<ClassStanding | null> {
  if (!viewer) return null;
  if (viewer.role === 'admin' || cls.instructorId === viewer.id) return 'manager';
  return (await isStudentOf(cls.id, viewer.id)) ? 'student' : null;
}

export interface ClassInHand {
  cls: ClassRecord;
  standing: ClassStanding;
}

const classNotFound = () => notFound('That class');

/** The class an `[id]` names, if the viewer may see it; the same 404 for a bad id, no class and someone else's. */
export async function classToSee(viewer: Viewer | null, id: string | undefined): Promise<ClassInHand | Response> {
  const classId = parseRouteId(id);
  const cls = classId ? await findClass(classId) : undefined;
  if (!cls) return classNotFound();
  const standing = await standingIn(viewer, cls);
  return standing ? { cls, standing } : classNotFound();
}

/**
 * For anything that changes a class: the signed-in person as the database has them now (401
 * otherwise) and the class (404 when they may not see it); with `manage`, 403 for a student.
 */
export async function classToChange(
  context: Pick<APIContext, 'locals' | 'params'>,
  need: 'manage' | 'belong',
): Promise<(ClassInHand & { user: UserRecord }) | Response> {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const found = await classToSee(user, context.params.id);
  if (isResponse(found)) return found;
  if (need === 'manage' && found.standing !== 'manager') return forbidden();
  return { ...found, user };
}
