import { and, eq, inArray, or } from 'drizzle-orm';
import { classCoupons, classes, classMembers } from '../../../../db/schema';
import { db } from '../db';
import type { Viewer } from '../visibility';
import type { SheetAudience, SheetStatus } from '~/lib/sheets/requests';

/**
 * Who may see and change a colour sheet:
 * - its owner and admins see and change it, draft or published;
 * - a published sheet for the public is seen by everyone, visitors included;
 * - a published sheet for a class is seen by that class's instructor and members;
 * - nobody else learns it exists (404).
 */

export interface SheetAccess {
  ownerId: string | null;
  classId: number | null;
  status: SheetStatus;
  audience: SheetAudience;
}

export const mayChangeSheet = (viewer: Viewer | null, sheet: Pick<SheetAccess, 'ownerId'>) =>
  viewer !== null && (viewer.role === 'admin' || (sheet.ownerId !== null && sheet.ownerId === viewer.id));

export function maySeeSheet(viewer: Viewer | null, sheet: SheetAccess, viewerClassIds: ReadonlySet<number>): boolean {
  if (mayChangeSheet(viewer, sheet)) return true;
  if (sheet.status !== 'published') return false;
  if (sheet.audience === 'public') return true;
  return sheet.classId !== null && viewerClassIds.has(sheet.classId);
}

/** The classes a person belongs to or teaches. */
export async function classIdsOf(viewer: Viewer | null): Promise<Set<number>> {
  if (!viewer) return new Set();
  const [taught, joined] = await Promise.all([
    db().select({ id: classes.id }).from(classes).where(eq(classes.instructorId, viewer.id)),
    db().select({ id: classMembers.classId }).from(classMembers).where(eq(classMembers.userId, viewer.id)),
  ]);
  return new Set([...taught, ...joined].map((row) => row.id));
}

/** True when a person may build a sheet for this class: they teach it, or are an admin. */
export async function mayUseClass(viewer: Viewer, classId: number): Promise<boolean> {
  const teaches = or(
    eq(classes.instructorId, viewer.id),
    inArray(
      classes.id,
      db()
        .select({ id: classMembers.classId })
        .from(classMembers)
        .where(and(eq(classMembers.userId, viewer.id), eq(classMembers.role, 'instructor'))),
    ),
  );
  const [row] = await db()
    .select({ id: classes.id })
    .from(classes)
    .where(and(eq(classes.id, classId), viewer.role === 'admin' ? undefined : teaches));
  return row !== undefined;
}

/** Which of these coupons are shared with the class. */
export async function sharedWithClass(classId: number | null, couponIds: number[]): Promise<Set<number>> {
  if (classId === null || couponIds.length === 0) return new Set();
  const rows = await db()
    .select({ couponId: classCoupons.couponId })
    .from(classCoupons)
    .where(and(eq(classCoupons.classId, classId), inArray(classCoupons.couponId, couponIds)));
  return new Set(rows.map((row) => row.couponId));
}

/** The students of a class, with their addresses, for the publish mail. */
export async function studentsOf(classId: number): Promise<{ userId: string }[]> {
  return db()
    .select({ userId: classMembers.userId })
    .from(classMembers)
    .where(and(eq(classMembers.classId, classId), eq(classMembers.role, 'student')));
}

/** The classes a person teaches (every class for an admin), for the sheet's class picker. */
export async function taughtClasses(viewer: Viewer): Promise<{ id: number; name: string }[]> {
  const query = db().select({ id: classes.id, name: classes.name }).from(classes);
  return viewer.role === 'admin' ? query.orderBy(classes.name).limit(500) : query.where(eq(classes.instructorId, viewer.id)).orderBy(classes.name);
}
