import { and, count, desc, eq, inArray, isNull, or } from 'drizzle-orm';
import { classCoupons, classes, classMembers, invitations, users } from '../../../../db/schema';
import type { ClassInput } from '~/lib/classes/requests';
import { db } from '../db';

/** A class with its instructor's name, as pages and the API show it. */
export interface ClassRecord {
  id: number;
  instructorId: string;
  instructorName: string | null;
  name: string;
  term: string | null;
  description: string | null;
  createdAt: Date;
  updatedAt: Date;
}

/** An invitation neither accepted nor revoked (it may have expired: the roster shows that). */
export const openInvitation = () => and(isNull(invitations.acceptedAt), isNull(invitations.revokedAt));

const classColumns = {
  id: classes.id,
  instructorId: classes.instructorId,
  instructorName: users.name,
  name: classes.name,
  term: classes.term,
  description: classes.description,
  createdAt: classes.createdAt,
  updatedAt: classes.updatedAt,
};

export async function findClass(id: number): Promise<ClassRecord | undefined> {
  const [row] = await db().select(classColumns).from(classes).innerJoin(users, eq(users.id, classes.instructorId)).where(eq(classes.id, id));
  return row;
}

export async function createClass(instructorId: string, input: ClassInput): Promise<number> {
  const [result] = await db().insert(classes).values({ instructorId, name: input.name, term: input.term, description: input.description });
  return result.insertId;
}

export async function updateClass(id: number, changes: Partial<ClassInput>): Promise<void> {
  const set = Object.fromEntries(Object.entries(changes).filter(([, value]) => value !== undefined));
  if (Object.keys(set).length === 0) return;
  await db().update(classes).set(set).where(eq(classes.id, id));
}

/** Deletes a class; its members, invitations and shares go with it (the coupons stay their owners'). */
export async function deleteClass(id: number): Promise<boolean> {
  const [result] = await db().delete(classes).where(eq(classes.id, id));
  return result.affectedRows === 1;
}

export interface ClassSummary extends ClassRecord {
  /** How the person asking stands in it. */
  standing: 'instructor' | 'student' | 'admin';
  students: number;
  coupons: number;
  pending: number;
}

/**
 * The classes someone teaches or belongs to, newest first; an admin sees every class. Counts of
 * students, shared coupons and open invitations beside each.
 */
export async function classesFor(viewer: { id: string; role: string }): Promise<ClassSummary[]> {
  const memberOf = db().select({ classId: classMembers.classId }).from(classMembers).where(eq(classMembers.userId, viewer.id));
  const rows = await db()
    .select(classColumns)
    .from(classes)
    .innerJoin(users, eq(users.id, classes.instructorId))
    .where(viewer.role === 'admin' ? undefined : or(eq(classes.instructorId, viewer.id), inArray(classes.id, memberOf)))
    .orderBy(desc(classes.createdAt), desc(classes.id))
    .limit(500);
  if (rows.length === 0) return [];
  const ids = rows.map((row) => row.id);
  const studentRows = await db()
    .select({ classId: classMembers.classId, userId: classMembers.userId })
    .from(classMembers)
    .where(inArray(classMembers.classId, ids));
  const couponCounts = await db()
    .select({ classId: classCoupons.classId, n: count() })
    .from(classCoupons)
    .where(inArray(classCoupons.classId, ids))
    .groupBy(classCoupons.classId);
  const pendingCounts = await db()
    .select({ classId: invitations.classId, n: count() })
    .from(invitations)
    .where(and(inArray(invitations.classId, ids), openInvitation()))
    .groupBy(invitations.classId);
  const countOf = (list: { classId: number; n: number }[], id: number) => Number(list.find((entry) => entry.classId === id)?.n ?? 0);
  return rows.map((row) => ({
    ...row,
    standing:
      row.instructorId === viewer.id
        ? 'instructor'
        : studentRows.some((member) => member.classId === row.id && member.userId === viewer.id)
          ? 'student'
          : 'admin',
    students: studentRows.filter((member) => member.classId === row.id).length,
    coupons: countOf(couponCounts, row.id),
    pending: countOf(pendingCounts, row.id),
  }));
}
