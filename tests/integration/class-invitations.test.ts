import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { and, eq, sql } from 'drizzle-orm';
import { api, baseUrl, newJar, type Jar } from '../support/app';
import { confirmedAccount, demo, newAddress, postSignIn, sessionCookie, signedIn } from '../support/auth';
import { countMail, linkIn, waitForMail } from '../support/mail';
import { testDatabase } from '../support/database';
import { classMembers, invitations, users } from '../../db/schema';

/**
 * Class invitations end to end, against MariaDB and the captured mail: the e-mail, the link's
 * single use, the 14-day life, revoking and resending, and which account may accept.
 * Source for the rules: the product's design (journey 3: single-use, hashed at rest, 14 days).
 */
const { db, pool } = testDatabase();
afterAll(() => pool.end());

let instructor: Jar;
let classId: number;
const className = `Kiln evenings ${Date.now().toString(36)}`;

const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');
const joinPrefix = `${baseUrl}/classes/join?token=`;
const pathOf = (link: string) => {
  const url = new URL(link);
  return url.pathname + url.search;
};

/** Invites `email` to the test class and returns the link from the mail it gets. */
async function invite(email: string): Promise<string> {
  const before = await countMail(email, 'invites you');
  const response = await api(`/api/classes/${classId}/invitations`, { jar: instructor, json: { emails: [email] } });
  expect(response.status).toBe(201);
  return linkIn(await waitForMail(email, 'invites you', before), joinPrefix);
}

async function isStudent(userId: string) {
  const rows = await db
    .select()
    .from(classMembers)
    .where(and(eq(classMembers.classId, classId), eq(classMembers.userId, userId)));
  return rows.length === 1;
}

beforeAll(async () => {
  instructor = await signedIn(demo.instructor);
  const created = await api('/api/classes', { jar: instructor, json: { name: className, term: 'Spring 2027' } });
  expect(created.status).toBe(201);
  classId = ((await created.json()) as { id: number }).id;
});

describe('sending an invitation', () => {
  it('mails a link that names the class and the instructor, and keeps only the SHA-256 of its token, for 14 days', async () => {
    const email = newAddress();
    const link = await invite(email);
    const mail = await waitForMail(email, 'invites you');
    const [teacher] = await db.select({ name: users.name }).from(users).where(eq(users.email, demo.instructor));
    expect(mail.subject).toContain(className);
    expect(mail.subject).toContain(teacher.name);
    expect(mail.text).toContain(className);
    const token = new URL(link).searchParams.get('token')!;
    const [row] = await db.select().from(invitations).where(eq(invitations.email, email));
    // FIPS 180-4 SHA-256, computed here with node:crypto.
    expect(row.tokenHash).toBe(sha256(token));
    expect(JSON.stringify(row)).not.toContain(token);
    const days = (row.expiresAt.getTime() - row.createdAt.getTime()) / 86_400_000;
    expect(days).toBeGreaterThan(13.99);
    expect(days).toBeLessThan(14.01);
  });

  it('refuses a look-alike address (Cyrillic s, full-width letters) with a 400 naming it', async () => {
    for (const lookAlike of ['\u0455mith@oxbloom.test', 'ｓmith@oxbloom.test', 'smith@oxbloom.test\u200b']) {
      const response = await api(`/api/classes/${classId}/invitations`, { jar: instructor, json: { emails: [lookAlike] } });
      expect(response.status).toBe(400);
      expect(((await response.json()) as { field: string }).field).toBe('emails');
    }
  });

  it('stores the address normalised, so the account with the plain address can accept it', async () => {
    const account = await confirmedAccount();
    const before = await countMail(account.email, 'invites you');
    const response = await api(`/api/classes/${classId}/invitations`, { jar: instructor, json: { emails: `  ${account.email.toUpperCase()}  ` } });
    expect(response.status).toBe(201);
    const link = linkIn(await waitForMail(account.email, 'invites you', before), joinPrefix);
    const accepted = await api(pathOf(link), { jar: account.jar, form: { intent: 'accept' } });
    expect(accepted.status).toBe(303);
    expect(await isStudent(account.id)).toBe(true);
  });
});

describe('accepting', () => {
  it('lets a person without an account sign up from the link and land in the class, signed in and confirmed', async () => {
    const email = newAddress();
    const link = await invite(email);
    const page = await api(pathOf(link));
    expect(page.status).toBe(200);
    expect(await page.text()).toContain(className);
    const jar = newJar();
    const joined = await api(pathOf(link), { jar, form: { intent: 'sign-up', name: 'Pip Newcomer', password: 'a long test password' } });
    expect(joined.status).toBe(303);
    expect(joined.headers.get('location')).toBe(`/classes/${classId}?joined=1`);
    expect(sessionCookie(jar)).toBeDefined();
    const seen = await api(`/api/classes/${classId}`, { jar });
    expect(seen.status).toBe(200);
    expect(((await seen.json()) as { standing: string }).standing).toBe('student');
    // The account is confirmed: the password signs in.
    const again = newJar();
    await postSignIn(again, email, 'a long test password');
    expect(sessionCookie(again)).toBeDefined();
  });

  it('lets a signed-in member with the invited address accept, once: the same link again gets a 410 page', async () => {
    const account = await confirmedAccount();
    const link = await invite(account.email);
    expect((await api(pathOf(link), { jar: account.jar })).status).toBe(200);
    const accepted = await api(pathOf(link), { jar: account.jar, form: { intent: 'accept' } });
    expect(accepted.status).toBe(303);
    expect(await isStudent(account.id)).toBe(true);
    const reused = await api(pathOf(link), { jar: account.jar });
    expect(reused.status).toBe(410);
    expect(await reused.text()).toContain('already been used');
    expect((await api(pathOf(link), { jar: account.jar, form: { intent: 'accept' } })).status).toBe(410);
  });

  it('joins once when the link is clicked twice at once', async () => {
    const account = await confirmedAccount();
    const link = await invite(account.email);
    const answers = await Promise.all([1, 2, 3].map(() => api(pathOf(link), { jar: account.jar, form: { intent: 'accept' } })));
    expect(answers.filter((answer) => answer.status === 303)).toHaveLength(1);
    expect(answers.filter((answer) => answer.status === 410)).toHaveLength(2);
    const rows = await db.select().from(invitations).where(eq(invitations.email, account.email));
    expect(rows.filter((row) => row.acceptedAt !== null)).toHaveLength(1);
  });

  it('shows an expired link a 410 page and does not join', async () => {
    const account = await confirmedAccount();
    const link = await invite(account.email);
    await db
      .update(invitations)
      .set({ expiresAt: sql`UTC_TIMESTAMP() - INTERVAL 1 MINUTE` })
      .where(eq(invitations.tokenHash, sha256(new URL(link).searchParams.get('token')!)));
    const page = await api(pathOf(link), { jar: account.jar });
    expect(page.status).toBe(410);
    expect(await page.text()).toContain('expired');
    expect((await api(pathOf(link), { jar: account.jar, form: { intent: 'accept' } })).status).toBe(410);
    expect(await isStudent(account.id)).toBe(false);
  });

  it('kills a revoked link; a resent link replaces the old one', async () => {
    const account = await confirmedAccount();
    const first = await invite(account.email);
    const [row] = await db.select().from(invitations).where(eq(invitations.email, account.email));
    expect((await api(`/api/classes/${classId}/invitations/${row.id}/resend`, { jar: instructor, method: 'POST' })).status).toBe(201);
    const second = linkIn(await waitForMail(account.email, 'invites you', 1), joinPrefix);
    expect(second).not.toBe(first);
    const old = await api(pathOf(first), { jar: account.jar });
    expect(old.status).toBe(410);
    expect(await old.text()).toContain('withdrawn');
    const [open] = await db
      .select()
      .from(invitations)
      .where(and(eq(invitations.email, account.email), sql`${invitations.revokedAt} IS NULL`));
    expect((await api(`/api/classes/${classId}/invitations/${open.id}`, { jar: instructor, method: 'DELETE' })).status).toBe(204);
    expect((await api(pathOf(second), { jar: account.jar, form: { intent: 'accept' } })).status).toBe(410);
    expect(await isStudent(account.id)).toBe(false);
  });

  it('tells someone signed in with another account which (masked) address the invitation is for, and does not join them', async () => {
    const email = newAddress();
    const link = await invite(email);
    const other = await signedIn(demo.member2);
    const page = await api(pathOf(link), { jar: other });
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('another address');
    expect(html).not.toContain(email);
    expect(html).toContain(`${email[0]}•`);
    await api(pathOf(link), { jar: other, form: { intent: 'accept' } });
    expect((await api(`/api/classes/${classId}`, { jar: other })).status).toBe(404);
    // Still usable by its owner afterwards.
    const [row] = await db.select().from(invitations).where(eq(invitations.email, email));
    expect(row.acceptedAt).toBeNull();
    // Signing out from the page ends that session and comes back to the same link.
    const signedOut = await api(pathOf(link), { jar: other, form: { intent: 'sign-out' } });
    expect(signedOut.status).toBe(303);
    expect(signedOut.headers.get('location')).toBe(pathOf(link));
    expect((await api('/api/account', { jar: other })).status).toBe(401);
  });

  it('does not let a look-alike account accept: an address that differs by a dot is another account', async () => {
    const invited = newAddress();
    const link = await invite(invited);
    const [local, domain] = invited.split('@');
    const lookAlike = await confirmedAccount({ email: `${local.slice(0, 3)}.${local.slice(3)}@${domain}` });
    await api(pathOf(link), { jar: lookAlike.jar, form: { intent: 'accept' } });
    expect(await isStudent(lookAlike.id)).toBe(false);
  });

  it('answers an unknown or malformed token with a page, not an error', async () => {
    expect((await api(`/classes/join?token=${'z'.repeat(43)}`)).status).toBe(404);
    // A broken escape is refused before the page reads it; either way a 4xx page, never a 500.
    expect((await api('/classes/join?token=%00%ff')).status).toBe(400);
    expect((await api('/classes/join')).status).toBe(404);
  });
});
