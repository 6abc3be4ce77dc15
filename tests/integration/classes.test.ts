import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { api, baseUrl, newJar, type Jar } from '../support/app';
import { confirmedAccount, demo, signedIn, type TestAccount } from '../support/auth';
import { linkIn, waitForMail } from '../support/mail';
import { testDatabase } from '../support/database';
import { classCoupons, classes, classMembers, coupons, invitations, users } from '../../db/schema';
import { demoClass } from '../../scripts/seed/classes';

/**
 * Who sees a class and what is shared with it, for every kind of caller, with exact statuses.
 * Source for the rule: the product's design (journey 3) — the instructor and admins manage a
 * class, its students see it and what is shared with it, nobody else learns it exists (404).
 */
const { db, pool } = testDatabase();
afterAll(() => pool.end());

type Caller = 'visitor' | 'member' | 'otherMember' | 'student' | 'instructor' | 'otherInstructor' | 'admin';
const jars = {} as Record<Caller, Jar>;
let student: TestAccount;
let classmate: TestAccount;
let classId: number;
let privateCoupon: number;

async function joinClass(account: TestAccount) {
  const before = (await api(`/api/classes/${classId}/invitations`, { jar: jars.instructor, json: { emails: [account.email] } })).status;
  expect(before).toBe(201);
  const link = new URL(linkIn(await waitForMail(account.email, 'invites you'), `${baseUrl}/classes/join?token=`));
  expect((await api(link.pathname + link.search, { jar: account.jar, form: { intent: 'accept' } })).status).toBe(303);
}

async function couponOf(account: TestAccount, visibility: 'private' | 'members' | 'public') {
  const response = await api('/api/coupons', {
    jar: account.jar,
    json: {
      title: `Class test ${visibility}`,
      layers: ['steel-1084'],
      surfacePrep: 'ground',
      surfaceGrit: 400,
      process: 'oven',
      temperatureC: 260,
      temperatureMethod: 'thermocouple',
      holdSeconds: 600,
      atmosphere: 'air',
      cooling: 'still-air',
      visibility,
    },
  });
  expect(response.status).toBe(201);
  return ((await response.json()) as { id: number }).id;
}

beforeAll(async () => {
  jars.visitor = newJar();
  jars.member = await signedIn(demo.member);
  jars.otherMember = await signedIn(demo.member2);
  jars.instructor = await signedIn(demo.instructor);
  jars.admin = await signedIn(demo.admin);
  const otherInstructor = await confirmedAccount();
  await db.update(users).set({ role: 'instructor' }).where(eq(users.email, otherInstructor.email));
  jars.otherInstructor = otherInstructor.jar;
  const created = await api('/api/classes', { jar: jars.instructor, json: { name: 'Temper colours on 1084', term: 'Autumn 2027', description: 'Evenings.' } });
  expect(created.status).toBe(201);
  classId = ((await created.json()) as { id: number }).id;
  student = await confirmedAccount();
  classmate = await confirmedAccount();
  await joinClass(student);
  await joinClass(classmate);
  jars.student = student.jar;
  privateCoupon = await couponOf(student, 'private');
});

const seeing: Record<Caller, number> = { visitor: 404, member: 404, otherMember: 404, student: 200, instructor: 200, otherInstructor: 404, admin: 200 };
const callers = Object.keys(seeing) as Caller[];

describe('who sees a class', () => {
  it.each(callers)('GET /api/classes/{id} as %s', async (who) => {
    expect((await api(`/api/classes/${classId}`, { jar: jars[who] })).status).toBe(seeing[who]);
  });

  it.each(callers)('the class page as %s', async (who) => {
    expect((await api(`/classes/${classId}`, { jar: jars[who] })).status).toBe(seeing[who]);
  });

  it('lists the class to its instructor and student, and not to others', async () => {
    const names = async (jar: Jar) => ((await (await api('/api/classes', { jar })).json()) as { classes: { id: number }[] }).classes.map((cls) => cls.id);
    expect(await names(jars.instructor)).toContain(classId);
    expect(await names(jars.student)).toContain(classId);
    expect(await names(jars.admin)).toContain(classId);
    expect(await names(jars.otherMember)).not.toContain(classId);
    expect(await names(jars.otherInstructor)).not.toContain(classId);
    expect((await api('/api/classes', { jar: jars.visitor })).status).toBe(401);
  });

  it('shows students classmates’ names but no addresses; the instructor sees addresses and open invitations', async () => {
    const asStudent = (await (await api(`/api/classes/${classId}`, { jar: jars.student })).json()) as Record<string, unknown>;
    expect(JSON.stringify(asStudent)).not.toContain(classmate.email);
    expect(asStudent.invitations).toBeUndefined();
    const asInstructor = (await (await api(`/api/classes/${classId}`, { jar: jars.instructor })).json()) as { students: { email: string }[] };
    expect(asInstructor.students.map((entry) => entry.email)).toEqual(expect.arrayContaining([student.email, classmate.email]));
  });
});

describe('who manages a class', () => {
  const patchStatus: Record<Caller, number> = { visitor: 401, member: 404, otherMember: 404, student: 403, instructor: 200, otherInstructor: 404, admin: 200 };
  it.each(callers)('PATCH /api/classes/{id} as %s', async (who) => {
    const response = await api(`/api/classes/${classId}`, { jar: jars[who], method: 'PATCH', json: { term: 'Autumn 2027' } });
    expect(response.status).toBe(patchStatus[who]);
  });

  it('lets only instructors and admins start a class', async () => {
    expect((await api('/api/classes', { jar: jars.visitor, json: { name: 'x' } })).status).toBe(401);
    expect((await api('/api/classes', { jar: jars.member, json: { name: 'x' } })).status).toBe(403);
    expect((await api('/api/classes', { jar: jars.student, json: { name: 'x' } })).status).toBe(403);
    expect((await api('/api/classes', { jar: jars.otherInstructor, json: { name: '' } })).status).toBe(400);
  });

  it('refuses a student removing a classmate (403) and an outsider removing anyone (404)', async () => {
    expect((await api(`/api/classes/${classId}/members/${classmate.id}`, { jar: jars.student, method: 'DELETE' })).status).toBe(403);
    expect((await api(`/api/classes/${classId}/members/${classmate.id}`, { jar: jars.otherMember, method: 'DELETE' })).status).toBe(404);
    expect((await api(`/api/classes/${classId}/invitations`, { jar: jars.student, json: { emails: ['a@oxbloom.test'] } })).status).toBe(403);
    expect((await api(`/api/classes/${classId}/invitations`, { jar: jars.otherInstructor, json: { emails: ['a@oxbloom.test'] } })).status).toBe(404);
  });
});

describe('sharing a coupon with a class', () => {
  it('lets the class see a private coupon on the class and coupon pages, and nobody else anywhere', async () => {
    expect((await api(`/api/classes/${classId}/coupons/${privateCoupon}`, { jar: student.jar, method: 'PUT' })).status).toBe(200);
    const onClass = (await (await api(`/api/classes/${classId}`, { jar: classmate.jar })).json()) as { coupons: { id: number }[] };
    expect(onClass.coupons.map((coupon) => coupon.id)).toContain(privateCoupon);
    expect((await api(`/coupons/${privateCoupon}`, { jar: classmate.jar })).status).toBe(200);
    expect((await api(`/coupons/${privateCoupon}`, { jar: jars.instructor })).status).toBe(200);
    // Never wider: outsiders still get 404, the coupon stays private, lists and the API's own view don't gain it.
    for (const who of ['visitor', 'otherMember', 'otherInstructor'] as const) {
      expect((await api(`/coupons/${privateCoupon}`, { jar: jars[who] })).status).toBe(404);
      expect((await api(`/api/coupons/${privateCoupon}`, { jar: jars[who] })).status).toBe(404);
    }
    const [row] = await db.select({ visibility: coupons.visibility }).from(coupons).where(eq(coupons.id, privateCoupon));
    expect(row.visibility).toBe('private');
    const library = (await (await api('/api/coupons?limit=100&sort=date', { jar: classmate.jar })).json()) as { coupons: { id: number }[] };
    expect(library.coupons.map((coupon) => coupon.id)).not.toContain(privateCoupon);
  });

  it('refuses sharing someone else’s coupon (404 when unseen, 403 when seen) or into a class one is not in (404)', async () => {
    expect((await api(`/api/classes/${classId}/coupons/${privateCoupon}`, { jar: classmate.jar, method: 'PUT' })).status).toBe(404);
    const members = await couponOf(student, 'members');
    expect((await api(`/api/classes/${classId}/coupons/${members}`, { jar: classmate.jar, method: 'PUT' })).status).toBe(403);
    const own = await couponOf(classmate, 'public');
    const other = await api('/api/classes', { jar: jars.otherInstructor, json: { name: 'Another class' } });
    const otherId = ((await other.json()) as { id: number }).id;
    expect((await api(`/api/classes/${otherId}/coupons/${own}`, { jar: classmate.jar, method: 'PUT' })).status).toBe(404);
  });

  it('takes a student’s shares away when they leave, and the class from their sight', async () => {
    const leaver = await confirmedAccount();
    await joinClass(leaver);
    const coupon = await couponOf(leaver, 'private');
    expect((await api(`/api/classes/${classId}/coupons/${coupon}`, { jar: leaver.jar, method: 'PUT' })).status).toBe(200);
    expect((await api(`/api/classes/${classId}/members/${leaver.id}`, { jar: leaver.jar, method: 'DELETE' })).status).toBe(204);
    expect((await api(`/api/classes/${classId}`, { jar: leaver.jar })).status).toBe(404);
    expect(await db.select().from(classCoupons).where(eq(classCoupons.couponId, coupon))).toHaveLength(0);
    expect((await api(`/coupons/${coupon}`, { jar: classmate.jar })).status).toBe(404);
  });

  it('lets the instructor remove a student', async () => {
    const removed = await confirmedAccount();
    await joinClass(removed);
    expect((await api(`/api/classes/${classId}/members/${removed.id}`, { jar: jars.instructor, method: 'DELETE' })).status).toBe(204);
    expect((await api(`/api/classes/${classId}`, { jar: removed.jar })).status).toBe(404);
  });
});

describe('the demo class', () => {
  it('is taught by the demo instructor, with three students who share coupons and one invitation waiting', async () => {
    const [cls] = await db.select().from(classes).where(eq(classes.name, demoClass.name));
    const [teacher] = await db.select().from(users).where(eq(users.id, cls.instructorId));
    expect(teacher.email).toBe(demo.instructor);
    expect(await db.select().from(classMembers).where(eq(classMembers.classId, cls.id))).toHaveLength(3);
    expect((await db.select().from(classCoupons).where(eq(classCoupons.classId, cls.id))).length).toBeGreaterThan(0);
    const waiting = await db.select().from(invitations).where(eq(invitations.classId, cls.id));
    expect(waiting.filter((row) => row.email === demoClass.pending && row.acceptedAt === null)).toHaveLength(1);
  });
});
