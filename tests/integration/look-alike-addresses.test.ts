import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { domainToASCII } from 'node:url';
import { and, eq, like } from 'drizzle-orm';
import { api, baseUrl, newJar, type Jar } from '../support/app';
import { anotherClientAddress, confirmedAccount, csrfToken, demo, postSignIn, sessionCookie, type TestAccount } from '../support/auth';
import { linksIn, mailMentioning, type CapturedMail } from '../support/mail';
import { testDatabase } from '../support/database';
import { users, verificationTokens } from '../../db/schema';

/**
 * Someone who controls a mailbox whose address only looks like an account's address must not
 * get into that account on any route: password sign-in, e-mailed sign-in link, sign-up,
 * forgotten password. Every address is compared exactly after one normalisation (trim,
 * lower-case ASCII); mail goes only to the address as stored.
 */
const { db, pool } = testDatabase();
afterAll(() => pool.end());

const tag = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
const local = `smith-${tag}`;
const attackerPassword = 'an attacker password';
let victim: TestAccount;

beforeAll(async () => {
  victim = await confirmedAccount({ email: `${local}@probe.test` });
});

/** [what, the address, whether the app refuses it outright] */
const lookAlikes: [string, string, boolean][] = [
  // U+00ED i with acute: equal to "i" under an accent-insensitive collation (utf8mb4_unicode_ci).
  ['accented local part', `${local.replace('i', 'í')}@probe.test`, true],
  // U+00F4 o with circumflex: nodemailer mails it to the punycode domain, which anyone may register.
  ['accented domain', `${local}@prôbe.test`, true],
  // The same domain in its ASCII form (RFC 3492, computed by Node's url.domainToASCII): a domain
  // of its own, so a valid address, but never the account's.
  ['punycode domain', `${local}@${domainToASCII('prôbe.test')}`, false],
  // U+FF53 FULLWIDTH LATIN SMALL LETTER S: folded to "s" by NFKC and by the Unicode collation.
  ['full-width letter', `\uff53${local.slice(1)}@probe.test`, true],
  // A trailing dot (the DNS root, RFC 1034 §3.1): the same host, another string.
  ['trailing dot', `${local}@probe.test.`, true],
];

/** Mail to any spelling of this file's address that arrived since `before`. */
async function newMail(before: CapturedMail[]): Promise<CapturedMail[]> {
  const seen = new Set(before.map((mail) => mail.file));
  return (await mailMentioning(tag)).filter((mail) => !seen.has(mail.file));
}

/** Whose account a jar is signed in to (undefined when signed out). */
async function accountOf(jar: Jar): Promise<string | undefined> {
  const response = await api('/api/account', { jar });
  return response.status === 200 ? ((await response.json()) as { id: string }).id : undefined;
}

/** Follows every sign-in, reset and confirmation link in these messages; none may reach the victim's account. */
async function expectNoLinkIntoVictim(mails: CapturedMail[]) {
  for (const mail of mails) {
    for (const link of linksIn(mail.mail, `${baseUrl}/api/auth/callback/nodemailer`)) {
      const jar = newJar();
      await api(new URL(link).pathname + new URL(link).search, { jar });
      expect(await accountOf(jar), `sign-in link mailed to ${mail.to.join(', ')}`).not.toBe(victim.id);
    }
    for (const link of linksIn(mail.mail, `${baseUrl}/reset-password?token=`)) {
      const token = new URL(link).searchParams.get('token')!;
      const jar = newJar();
      await api('/api/account/reset-password', { jar, json: { token, password: attackerPassword } });
      expect(await accountOf(jar), `reset link mailed to ${mail.to.join(', ')}`).not.toBe(victim.id);
    }
  }
}

async function requestLink(email: string, jar = newJar()) {
  return api('/api/auth/signin/nodemailer', { jar, form: { csrfToken: await csrfToken(jar), email, callbackUrl: `${baseUrl}/account` } });
}

describe.each(lookAlikes)('a look-alike address (%s: %s)', (_kind, address, refused) => {
  it('signs in to no account by password, even with the account’s own password', async () => {
    const jar = newJar();
    const response = await postSignIn(jar, address, victim.password);
    expect(response.status).toBe(302);
    expect(new URL(response.headers.get('location')!, baseUrl).searchParams.get('error')).toBe('CredentialsSignin');
    expect(sessionCookie(jar)).toBeUndefined();
  });

  it('gets no e-mailed sign-in link into the account', async () => {
    const before = await mailMentioning(tag);
    const response = await requestLink(address);
    const mails = await newMail(before);
    if (refused) {
      // Refused before anything is looked up or mailed: a 400 naming the field (a browser is sent
      // back to the sign-in page with the same message instead).
      expect(response.status).toBe(400);
      expect((await response.json()).field).toBe('email');
      expect(mails.map((mail) => mail.to)).toEqual([]);
    } else {
      expect(response.status).toBe(302);
    }
    await expectNoLinkIntoVictim(mails);
  });

  it('cannot sign up over the account or take its address', async () => {
    const before = await mailMentioning(tag);
    const response = await api('/api/account/sign-up', { json: { name: 'Look-alike', email: address, password: attackerPassword } });
    expect(response.status).toBe(refused ? 400 : 202);
    if (refused) expect((await response.json()).field).toBe('email');
    const mails = await newMail(before);
    await expectNoLinkIntoVictim(mails);
    for (const link of mails.flatMap((mail) => linksIn(mail.mail, `${baseUrl}/confirm-email?token=`))) {
      const jar = newJar();
      await api(new URL(link).pathname + new URL(link).search, { jar });
      expect(await accountOf(jar)).not.toBe(victim.id);
    }
    // The account is as it was: its own address, its own password.
    const [row] = await db.select({ email: users.email }).from(users).where(eq(users.id, victim.id));
    expect(row.email).toBe(victim.email);
    expect(sessionCookie(await signInJar(victim.email, victim.password))).toBeDefined();
  });

  it('gets no password-reset link for the account', async () => {
    const before = await mailMentioning(tag);
    const response = await api('/api/account/forgot-password', { json: { email: address } });
    expect(response.status).toBe(refused ? 400 : 202);
    await expectNoLinkIntoVictim(await newMail(before));
  });
});

async function signInJar(email: string, password: string) {
  const jar = newJar();
  await postSignIn(jar, email, password, anotherClientAddress());
  return jar;
}

describe('the account’s own address in capitals', () => {
  const shouted = `${local.toUpperCase()}@Probe.TEST`;

  it('signs in to that account by password', async () => {
    const jar = await signInJar(shouted, victim.password);
    expect(await accountOf(jar)).toBe(victim.id);
  });

  it('gets the sign-in link mailed to the address exactly as stored, and it signs in to that account', async () => {
    const before = await mailMentioning(tag);
    expect((await requestLink(shouted)).status).toBe(302);
    const links = (await newMail(before)).filter((mail) => mail.subject.includes('sign-in link'));
    expect(links.map((mail) => mail.to)).toEqual([[victim.email]]);
    const [link] = linksIn(links[0].mail, `${baseUrl}/api/auth/callback/nodemailer`);
    expect(new URL(link).searchParams.get('email')).toBe(victim.email);
    const jar = newJar();
    await api(new URL(link).pathname + new URL(link).search, { jar });
    expect(await accountOf(jar)).toBe(victim.id);
  });

  it('sends the reset link and the already-registered note to the address as stored', async () => {
    const before = await mailMentioning(tag);
    expect((await api('/api/account/forgot-password', { json: { email: shouted } })).status).toBe(202);
    expect((await api('/api/account/sign-up', { json: { name: 'Again', email: shouted, password: attackerPassword } })).status).toBe(202);
    const mails = await newMail(before);
    expect(mails.map((mail) => [mail.subject.includes('Reset') ? 'reset' : 'already', mail.to]).sort()).toEqual([
      ['already', [victim.email]],
      ['reset', [victim.email]],
    ]);
  });
});

describe('a sign-in link whose address was changed', () => {
  it.each([
    ['to the account’s address', (link: URL) => link.searchParams.set('email', victim.email)],
    ['to a look-alike of it', (link: URL) => link.searchParams.set('email', `${local.replace('i', 'í')}@probe.test`)],
    ['to nothing', (link: URL) => link.searchParams.delete('email')],
  ])('signs no one in to the account when changed %s', async (_how, change) => {
    const attacker = await confirmedAccount({ email: `other-${tag}-${Math.random().toString(36).slice(2, 6)}@probe.test` });
    const before = await mailMentioning(tag);
    await requestLink(attacker.email);
    const [mail] = (await newMail(before)).filter((mail) => mail.subject.includes('sign-in link'));
    const link = new URL(linksIn(mail.mail, `${baseUrl}/api/auth/callback/nodemailer`)[0]);
    change(link);
    const jar = newJar();
    const response = await api(link.pathname + link.search, { jar });
    expect(response.status).toBeLessThan(500);
    expect(await accountOf(jar)).not.toBe(victim.id);
  });
});

describe('the database compares addresses exactly', () => {
  // Source: MariaDB reference, "Character Sets and Collations": _ci collations fold case and
  // accents, PAD SPACE collations ignore trailing spaces; a NO PAD binary collation does neither.
  it.each([
    ['capitals', demo.member.toUpperCase()],
    ['an accent', demo.member.replace('e', 'è')],
    ['a full-width letter', demo.member.replace('m', '\uff4d')],
    ['a trailing space', `${demo.member} `],
  ])('finds no account for %s', async (_kind, spelling) => {
    expect(await db.select({ id: users.id }).from(users).where(eq(users.email, spelling))).toEqual([]);
    expect(await db.select({ id: users.id }).from(users).where(eq(users.email, demo.member))).toHaveLength(1);
  });

  it('finds no sign-in link token for another spelling of its address', async () => {
    const token = `exact-${tag}`;
    await db.insert(verificationTokens).values({ identifier: demo.member, token, expires: new Date(Date.now() + 60_000) });
    const found = (identifier: string) =>
      db
        .select()
        .from(verificationTokens)
        .where(and(eq(verificationTokens.identifier, identifier), eq(verificationTokens.token, token)));
    expect(await found(demo.member.replace('e', 'è'))).toEqual([]);
    expect(await found(demo.member.toUpperCase())).toEqual([]);
    expect(await found(demo.member)).toHaveLength(1);
    await db.delete(verificationTokens).where(like(verificationTokens.token, token));
  });
});
