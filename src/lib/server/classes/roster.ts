import { and, asc, count, eq, inArray } from 'drizzle-orm';
import { classCoupons, classMembers, coupons, users } from '../../../../db/schema';
import { db } from '../db';

export interface RosterStudent {
  userId: string;
  name: string | null;
  email: string;
  joinedAt: Date;
  /** Coupons they have shared with this class. */
  shared: number;
}

/** The class's students, by name, each with how many coupons they share with it. */
export async function studentsOf(classId: number): Promise<RosterStudent[]> {
  const rows = await db()
    .select({ userId: users.id, name: users.name, email: users.email, joinedAt: classMembers.joinedAt })
    .from(classMembers)
    .innerJoin(users, eq(users.id, classMembers.userId))
    .where(eq(classMembers.classId, classId))
    .orderBy(asc(users.name), asc(users.email));
  if (rows.length === 0) return [];
  const shares = await db()
    .select({ ownerId: coupons.ownerId, n: count() })
    .from(classCoupons)
    .innerJoin(coupons, eq(coupons.id, classCoupons.couponId))
    .where(
      and(
        eq(classCoupons.classId, classId),
        inArray(
          coupons.ownerId,
          rows.map((row) => row.userId),
        ),
      ),
    )
    .groupBy(coupons.ownerId);
  return rows.map((row) => ({ ...row, shared: Number(shares.find((share) => share.ownerId === row.userId)?.n ?? 0) }));
}

/**
 * Takes a student out of a class (removed by the instructor, or leaving): their shares with the
 * class go too, so the class no longer sees their coupons. False when they were not in it.
 */
export async function removeStudent(classId: number, userId: string): Promise<boolean> {
  return db().transaction(async (tx) => {
    const [result] = await tx.delete(classMembers).where(and(eq(classMembers.classId, classId), eq(classMembers.userId, userId)));
    if (result.affectedRows !== 1) return false;
    const theirs = tx.select({ id: coupons.id }).from(coupons).where(eq(coupons.ownerId, userId));
    await tx.delete(classCoupons).where(and(eq(classCoupons.classId, classId), inArray(classCoupons.couponId, theirs)));
    return true;
  });
}
