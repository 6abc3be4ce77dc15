// The demo class: the demo instructor teaches it, three demo members have joined, one invited
// person has not yet, and the students have shared some of their coupons with it. Invented.
import { createHash, randomBytes } from 'node:crypto';
import { and, inArray, ne } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { classCoupons, classes, classMembers, coupons, invitations } from '../../db/schema';
import { collectiveName } from './people';

type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];

export const demoClass = {
  instructor: 'instructor@oxbloom.test',
  name: `${collectiveName}: colour on steel and titanium`,
  term: 'Spring 2027, Tuesday evenings',
  description:
    'Six evenings at the forge and the kiln. Each student runs a ladder of temper colours on 1084 and on titanium, photographs the coupons under the same light, and shares them here so we can compare the whole class at each heat.',
  students: ['member@oxbloom.test', 'wren@oxbloom.test', 'jory@oxbloom.test'],
  /** Invited, not joined yet (no account). */
  pending: 'pip.saltmarsh@oxbloom.test',
  /**
   * Coupons each student shares: their members-only and public test-series coupons of the class's ladders
   * (the 1084 / 15N20 billet, titanium Grade 2 sheet and the Grade 2 / Grade 5 laminate), taking
   * each ladder in turn, coolest first.
   */
  sharedPerStudent: 4,
  ladders: ['steel-1084+steel-15n20', 'ti-grade-2', 'ti-grade-2+ti-grade-5'],
};

export async function seedDemoClass(tx: Transaction, idByEmail: Map<string, string>, seriesTitles: ReadonlySet<string>) {
  const instructorId = idByEmail.get(demoClass.instructor)!;
  const [{ id: classId }] = await tx
    .insert(classes)
    .values({ instructorId, name: demoClass.name, term: demoClass.term, description: demoClass.description })
    .$returningId();
  for (const email of demoClass.students) await tx.insert(classMembers).values({ classId, userId: idByEmail.get(email)!, role: 'student' });
  await tx.insert(invitations).values({
    classId,
    email: demoClass.pending,
    // A token nobody holds: the demo's pending invitation is shown on the roster, never mailed.
    tokenHash: createHash('sha256').update(randomBytes(32)).digest('hex'),
    invitedBy: instructorId,
    expiresAt: new Date(Date.now() + 14 * 24 * 3600 * 1000),
  });
  const studentIds = demoClass.students.map((email) => idByEmail.get(email)!);
  const candidates = await tx
    .select({ id: coupons.id, ownerId: coupons.ownerId, layerKey: coupons.layerKey, title: coupons.title })
    .from(coupons)
    .where(and(inArray(coupons.ownerId, studentIds), ne(coupons.visibility, 'private'), inArray(coupons.layerKey, demoClass.ladders)))
    .orderBy(coupons.temperatureC, coupons.holdSeconds, coupons.id)
    // Test-series coupons only: every one of them is photographed, so each share has swatches.
    .then((rows) => rows.filter((row) => seriesTitles.has(row.title)));
  for (const studentId of studentIds) {
    const byLadder = demoClass.ladders.map((ladder) => candidates.filter((coupon) => coupon.ownerId === studentId && coupon.layerKey === ladder));
    const theirs: number[] = [];
    for (let round = 0; theirs.length < demoClass.sharedPerStudent && byLadder.some((ladder) => ladder.length > round); round += 1) {
      for (const ladder of byLadder) if (ladder[round] && theirs.length < demoClass.sharedPerStudent) theirs.push(ladder[round].id);
    }
    if (theirs.length) await tx.insert(classCoupons).values(theirs.map((couponId) => ({ classId, couponId })));
  }
  return classId;
}
