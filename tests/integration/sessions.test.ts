import { afterAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { encode } from '@auth/core/jwt';
import { api, baseUrl, newJar, type Jar } from '../support/app';
import { anotherClientAddress, confirmedAccount, csrfToken, demo, sessionCookie, signedIn } from '../support/auth';
import { countMail, linkIn, waitForMail } from '../support/mail';
import { testDatabase } from '../support/database';
import { coupons, users } from '../../db/schema';

/**
 * A session cookie is only as good as the server's record of it: signing out, signing out
 * everywhere, a password change or reset end sessions for good, and a kept copy of an ended
 * session's cookie is refused like no cookie at all (401 on a route that needs a session).
 */
const { db, pool } = testDatabase();
afterAll(() => pool.end());

/** Each sign-in from a client address of its own: this file signs in more often than one address may. */
const signIn = (email: string, password?: string) => signedIn(email, password, anotherClientAddress());
const copyOf = (jar: Jar): Jar => ({ cookies: new Map(jar.cookies) });
const statusWith = async (jar: Jar) => (await api('/api/account', { jar })).status;

describe('signing out', () => {
  it('ends that session for good: a kept copy of its cookie is refused; other sessions go on', async () => {
    const account = await confirmedAccount();
    const other = await signIn(account.email, account.password);
    const jar = await signIn(account.email, account.password);
    const kept = copyOf(jar);
    expect(await statusWith(kept)).toBe(200);
    expect((await api('/api/account/sign-out', { method: 'POST', jar })).status).toBe(200);
    expect(sessionCookie(jar)).toBeUndefined();
    expect(await statusWith(kept)).toBe(401);
    expect(await statusWith(other)).toBe(200);
  });

  it('through Auth.js’s own sign-out route ends the session too', async () => {
    const account = await confirmedAccount();
    const jar = await signIn(account.email, account.password);
    const kept = copyOf(jar);
    const response = await api('/api/auth/signout', { jar, form: { csrfToken: await csrfToken(jar), callbackUrl: baseUrl } });
    expect(response.status).toBe(302);
    expect(await statusWith(kept)).toBe(401);
  });

  it('ends a session that a confirmation link started', async () => {
    const account = await confirmedAccount();
    const kept = copyOf(account.jar);
    expect((await api('/api/account/sign-out', { method: 'POST', jar: account.jar })).status).toBe(200);
    expect(await statusWith(kept)).toBe(401);
  });

  it('refuses a well-formed cookie the server never started a session for', async () => {
    // Signed with the app's own secret (as a cookie from before sessions were recorded would be),
    // valid for a week, but naming no live session.
    const [member] = await db.select().from(users).where(eq(users.email, demo.member));
    const name = 'authjs.session-token';
    const token = await encode({
      token: { sub: member.id, email: member.email, role: member.role },
      secret: process.env.AUTH_SECRET!,
      salt: name,
      maxAge: 3600,
    });
    expect((await api('/api/account', { headers: { cookie: `${name}=${token}` } })).status).toBe(401);
    expect((await api('/account', { headers: { cookie: `${name}=${token}` } })).status).toBe(302);
  });
});

describe('signing out everywhere', () => {
  it('ends every session of the account, this one included, and no one else’s', async () => {
    const account = await confirmedAccount();
    const laptop = await signIn(account.email, account.password);
    const phone = await signIn(account.email, account.password);
    const kept = copyOf(laptop);
    const bystander = await signIn(demo.member2);
    const response = await api('/api/account/sign-out-everywhere', { method: 'POST', jar: laptop });
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ message: 'Signed out everywhere.' });
    for (const jar of [laptop, kept, phone, account.jar]) expect(await statusWith(jar)).toBe(401);
    expect(await statusWith(bystander)).toBe(200);
    await signIn(account.email, account.password);
  });

  it('is offered on the account page, and works from its plain form', async () => {
    const account = await confirmedAccount();
    const phone = await signIn(account.email, account.password);
    const page = await (await api('/account', { jar: account.jar })).text();
    expect(page).toContain('action="/api/account/sign-out-everywhere"');
    expect(page).toContain('Sign out everywhere');
    const response = await api('/api/account/sign-out-everywhere', { jar: account.jar, form: {}, headers: { accept: 'text/html' } });
    expect(response.status).toBe(303);
    expect(response.headers.get('location')).toBe('/sign-in?signed-out=everywhere');
    expect(await statusWith(phone)).toBe(401);
    expect(await statusWith(account.jar)).toBe(401);
  });

  it('needs a session', async () => {
    expect((await api('/api/account/sign-out-everywhere', { method: 'POST' })).status).toBe(401);
  });
});

describe('changing the password', () => {
  it('ends every other session; the session that changed it stays signed in', async () => {
    const account = await confirmedAccount();
    const other = await signIn(account.email, account.password);
    const before = copyOf(account.jar);
    const response = await api('/api/account/password', {
      jar: account.jar,
      json: { currentPassword: account.password, newPassword: 'a second long password' },
    });
    expect(response.status).toBe(200);
    expect(await statusWith(account.jar)).toBe(200);
    expect(await statusWith(other)).toBe(401);
    // The changing session was issued anew: its cookie from before the change is ended too.
    expect(await statusWith(before)).toBe(401);
  });

  it('from the account page ends every other session too', async () => {
    const account = await confirmedAccount();
    const other = await signIn(account.email, account.password);
    const response = await api('/account', {
      jar: account.jar,
      form: { intent: 'password', currentPassword: account.password, newPassword: 'a second long password' },
    });
    expect(response.status).toBe(200);
    expect(await response.text()).toContain('Your password is changed, and every other browser signed in to your account is signed out.');
    expect(await statusWith(account.jar)).toBe(200);
    expect(await statusWith(other)).toBe(401);
  });

  it('stops after 5 wrong current passwords for the account, with Retry-After, from any session', async () => {
    const account = await confirmedAccount();
    const other = await signIn(account.email, account.password);
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 5; attempt += 1) {
      const response = await api('/api/account/password', {
        jar: account.jar,
        json: { currentPassword: `wrong guess ${attempt}`, newPassword: 'a second long password' },
      });
      statuses.push(response.status);
    }
    expect(statuses).toEqual([400, 400, 400, 400, 400]);
    // The sixth try, from another session of the same account and with the right password, waits.
    const limited = await api('/api/account/password', { jar: other, json: { currentPassword: account.password, newPassword: 'a second long password' } });
    expect(limited.status).toBe(429);
    expect(Number(limited.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await limited.json()).error).toMatch(/^Too many attempts/);
    const page = await api('/account', {
      jar: account.jar,
      form: { intent: 'password', currentPassword: account.password, newPassword: 'a second long password' },
    });
    expect(page.status).toBe(429);
    expect(Number(page.headers.get('retry-after'))).toBeGreaterThan(0);
    // Nothing changed: the old password still signs in.
    expect(sessionCookie(await signIn(account.email, account.password))).toBeDefined();
    // Another account is not held back.
    const bystander = await confirmedAccount();
    const right = await api('/api/account/password', {
      jar: bystander.jar,
      json: { currentPassword: bystander.password, newPassword: 'a second long password' },
    });
    expect(right.status).toBe(200);
  });

  it('counts only wrong passwords: right ones in between do not add up', async () => {
    const account = await confirmedAccount();
    let password = account.password;
    for (let attempt = 0; attempt < 6; attempt += 1) {
      const next = `a long password number ${attempt}`;
      const response = await api('/api/account/password', { jar: account.jar, json: { currentPassword: password, newPassword: next } });
      expect(response.status).toBe(200);
      password = next;
    }
  });
});

describe('resetting a forgotten password', () => {
  it('ends every session of the account and signs in only the browser that reset it', async () => {
    const account = await confirmedAccount();
    const other = await signIn(account.email, account.password);
    expect((await api('/api/account/forgot-password', { json: { email: account.email } })).status).toBe(202);
    const token = new URL(linkIn(await waitForMail(account.email, 'Reset your Oxbloom password'), `${baseUrl}/reset-password`)).searchParams.get('token')!;
    const resetter = newJar();
    expect((await api('/api/account/reset-password', { jar: resetter, json: { token, password: 'a brand new password' } })).status).toBe(200);
    expect(await statusWith(resetter)).toBe(200);
    expect(await statusWith(other)).toBe(401);
    expect(await statusWith(account.jar)).toBe(401);
  });

  it('from the reset page ends the other sessions too', async () => {
    const account = await confirmedAccount();
    await api('/api/account/forgot-password', { json: { email: account.email } });
    const link = new URL(linkIn(await waitForMail(account.email, 'Reset your Oxbloom password'), `${baseUrl}/reset-password`));
    const resetter = newJar();
    const response = await api(link.pathname + link.search, {
      jar: resetter,
      form: { token: link.searchParams.get('token')!, password: 'a brand new password' },
    });
    expect(response.status).toBe(303);
    expect(await statusWith(resetter)).toBe(200);
    expect(await statusWith(account.jar)).toBe(401);
  });
});

describe('changing a role', () => {
  it('takes effect at once on a session that is already open', async () => {
    const admin = await signIn(demo.admin);
    const account = await confirmedAccount();
    const [member] = await db.select({ id: users.id }).from(users).where(eq(users.email, demo.member));
    const [privateCoupon] = await db
      .select({ id: coupons.id })
      .from(coupons)
      .where(and(eq(coupons.ownerId, member.id), eq(coupons.visibility, 'private')))
      .limit(1);
    const promoted = await api(`/api/admin/users/${account.id}`, { method: 'PATCH', jar: admin, json: { role: 'admin' } });
    expect(promoted.status).toBe(200);
    // An admin may read a member's private coupon (the session's role decides reads).
    expect((await api(`/api/coupons/${privateCoupon.id}`, { jar: account.jar })).status).toBe(200);
    expect((await api('/api/admin/users', { jar: account.jar })).status).toBe(200);
    const demoted = await api(`/api/admin/users/${account.id}`, { method: 'PATCH', jar: admin, json: { role: 'member' } });
    expect(demoted.status).toBe(200);
    // The same cookie, the next request: a member now.
    expect((await (await api('/api/account', { jar: account.jar })).json()).role).toBe('member');
    expect((await api(`/api/coupons/${privateCoupon.id}`, { jar: account.jar })).status).toBe(404);
    expect((await api('/api/admin/users', { jar: account.jar })).status).toBe(403);
    expect((await api('/admin/users', { jar: account.jar })).status).toBe(404);
  });
});

describe('sessions that links start', () => {
  it('a reset link’s session is a live session like any other: signing out ends it', async () => {
    const account = await confirmedAccount();
    await api('/api/account/forgot-password', { json: { email: account.email } });
    const token = new URL(linkIn(await waitForMail(account.email, 'Reset your Oxbloom password'), `${baseUrl}/reset-password`)).searchParams.get('token')!;
    const jar = newJar();
    await api('/api/account/reset-password', { jar, json: { token, password: 'a brand new password' } });
    const kept = copyOf(jar);
    expect(await statusWith(kept)).toBe(200);
    await api('/api/account/sign-out', { method: 'POST', jar });
    expect(await statusWith(kept)).toBe(401);
  });

  it('an e-mailed sign-in link’s session ends at sign-out and at a password change elsewhere', async () => {
    const account = await confirmedAccount();
    const requestLink = async () => {
      const jar = newJar();
      const before = await countMail(account.email, 'Your Oxbloom sign-in link');
      await api('/api/auth/signin/nodemailer', { jar, form: { csrfToken: await csrfToken(jar), email: account.email, callbackUrl: `${baseUrl}/account` } });
      const link = new URL(linkIn(await waitForMail(account.email, 'Your Oxbloom sign-in link', before), `${baseUrl}/api/auth/callback/nodemailer`));
      await api(link.pathname + link.search, { jar });
      expect(await statusWith(jar)).toBe(200);
      return jar;
    };
    const first = await requestLink();
    const kept = copyOf(first);
    await api('/api/account/sign-out', { method: 'POST', jar: first });
    expect(await statusWith(kept)).toBe(401);
    const second = await requestLink();
    await api('/api/account/password', { jar: account.jar, json: { currentPassword: account.password, newPassword: 'a second long password' } });
    expect(await statusWith(second)).toBe(401);
  });
});
