import { afterAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { encode } from '@auth/core/jwt';
import { api, baseUrl, newJar, type Jar } from '../support/app';
import { confirmedAccount, csrfToken, demo, demoPassword, newAddress, postSignIn, sessionCookie, signedIn } from '../support/auth';
import { countMail, linkIn, waitForMail } from '../support/mail';
import { testDatabase } from '../support/database';
import { keysUnder, putTestObject } from '../support/storage';
import { accountTokens, alloys, couponLayers, coupons, photos, users, verificationTokens } from '../../db/schema';

const { db, pool } = testDatabase();
afterAll(() => pool.end());

const errorCode = (response: Response) => new URL(response.headers.get('location') ?? '/', baseUrl).searchParams.get('code');

describe('demo accounts', () => {
  it.each(Object.entries(demo))('%s signs in with the demo password and has its role', async (role, email) => {
    const jar = await signedIn(email, demoPassword);
    const me = await (await api('/api/account', { jar })).json();
    expect(me).toMatchObject({ email, role: role === 'member2' ? 'member' : role });
  });
});

describe('password sign-in', () => {
  it('gives one answer for an unknown address and a wrong password', async () => {
    const wrongPassword = await postSignIn(newJar(), demo.member, 'not the password at all');
    const unknownAddress = await postSignIn(newJar(), newAddress(), 'not the password at all');
    expect(wrongPassword.status).toBe(302);
    expect(unknownAddress.status).toBe(302);
    expect(errorCode(wrongPassword)).toBe('credentials');
    expect(errorCode(unknownAddress)).toBe('credentials');
    expect(new URL(wrongPassword.headers.get('location')!).pathname).toBe('/sign-in');
  });

  it('sets an httpOnly, SameSite=Lax session cookie', async () => {
    const jar = newJar();
    const response = await postSignIn(jar, demo.member, demoPassword);
    const cookie = response.headers.getSetCookie().find((line) => line.includes('authjs.session-token'))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('refuses an account whose address is not confirmed yet', async () => {
    const email = newAddress();
    await api('/api/account/sign-up', { json: { name: 'Unconfirmed', email, password: 'a long test password' } });
    const jar = newJar();
    expect(errorCode(await postSignIn(jar, email, 'a long test password'))).toBe('unconfirmed');
    expect(sessionCookie(jar)).toBeUndefined();
  });

  it('treats a session past its expiry as signed out', async () => {
    const [member] = await db.select().from(users).where(eq(users.email, demo.member));
    const name = 'authjs.session-token';
    const token = await encode({ token: { sub: member.id, email: member.email }, secret: process.env.AUTH_SECRET!, salt: name, maxAge: -60 });
    const response = await api('/api/account', { headers: { cookie: `${name}=${token}` } });
    expect(response.status).toBe(401);
  });
});

describe('sign-up', () => {
  it('refuses a password shorter than 10 characters, naming the field', async () => {
    const response = await api('/api/account/sign-up', { json: { name: 'Short', email: newAddress(), password: 'nine char' } });
    expect(response.status).toBe(400);
    expect(await response.json()).toEqual({ error: 'password: Use at least 10 characters.', field: 'password' });
  });

  it('answers the same for an address that already has an account, and tells its owner', async () => {
    const before = await countMail(demo.member2, 'Someone tried to sign up');
    const taken = await api('/api/account/sign-up', { json: { name: 'Copycat', email: demo.member2, password: 'a long test password' } });
    const fresh = await api('/api/account/sign-up', { json: { name: 'New', email: newAddress(), password: 'a long test password' } });
    expect(taken.status).toBe(202);
    expect(await taken.json()).toEqual(await fresh.json());
    await waitForMail(demo.member2, 'Someone tried to sign up', before);
  });

  it('confirms the address by a single-use link that signs the person in', async () => {
    const email = newAddress();
    await api('/api/account/sign-up', { json: { name: 'Linkfollower', email, password: 'a long test password' } });
    const link = new URL(linkIn(await waitForMail(email, 'Confirm your e-mail'), `${baseUrl}/confirm-email`));
    const jar = newJar();
    const first = await api(link.pathname + link.search, { jar });
    expect(first.status).toBe(200);
    expect(sessionCookie(jar)).toBeDefined();
    const again = await api(link.pathname + link.search);
    expect(again.status).toBe(410);
    expect(await again.text()).toContain('This link has already been used');
  });

  it('says clearly when a confirmation link has expired', async () => {
    const email = newAddress();
    await api('/api/account/sign-up', { json: { name: 'Latecomer', email, password: 'a long test password' } });
    const link = new URL(linkIn(await waitForMail(email, 'Confirm your e-mail'), `${baseUrl}/confirm-email`));
    const tokenHash = createHash('sha256').update(link.searchParams.get('token')!).digest('hex');
    await db
      .update(accountTokens)
      .set({ expiresAt: new Date(Date.now() - 60_000) })
      .where(eq(accountTokens.tokenHash, tokenHash));
    const response = await api(link.pathname + link.search);
    expect(response.status).toBe(410);
    expect(await response.text()).toContain('This link has expired');
  });
});

describe('forgotten password', () => {
  it('resets by a single-use link; the old password stops working', async () => {
    const account = await confirmedAccount();
    expect((await api('/api/account/forgot-password', { json: { email: account.email } })).status).toBe(202);
    const token = new URL(linkIn(await waitForMail(account.email, 'Reset your Oxbloom password'), `${baseUrl}/reset-password`)).searchParams.get('token')!;
    const reset = await api('/api/account/reset-password', { json: { token, password: 'a brand new password' } });
    expect(reset.status).toBe(200);
    const reused = await api('/api/account/reset-password', { json: { token, password: 'yet another password' } });
    expect(reused.status).toBe(410);
    expect((await reused.json()).error).toContain('already been used');
    expect(errorCode(await postSignIn(newJar(), account.email, account.password))).toBe('credentials');
    await signedIn(account.email, 'a brand new password');
  });

  it('answers the same for an address with no account, and sends no reset link', async () => {
    const email = newAddress();
    const unknown = await api('/api/account/forgot-password', { json: { email } });
    const known = await api('/api/account/forgot-password', { json: { email: demo.instructor } });
    expect(unknown.status).toBe(202);
    expect(await unknown.json()).toEqual(await known.json());
    await waitForMail(email, 'No Oxbloom account');
    expect(await countMail(email, 'Reset your Oxbloom password')).toBe(0);
  });
});

describe('sign-in by e-mailed link', () => {
  async function requestLink(email: string, jar: Jar) {
    const before = await countMail(email, 'Your Oxbloom sign-in link');
    const response = await api('/api/auth/signin/nodemailer', {
      jar,
      form: { csrfToken: await csrfToken(jar), email, callbackUrl: `${baseUrl}/account` },
    });
    expect(response.status).toBe(302);
    // Auth.js sends the browser to its verify-request step, which forwards to our page.
    expect(new URL(response.headers.get('location')!).pathname).toBe('/api/auth/verify-request');
    return new URL(linkIn(await waitForMail(email, 'Your Oxbloom sign-in link', before), `${baseUrl}/api/auth/callback/nodemailer`));
  }

  it('signs in once; the same link again is refused', async () => {
    const jar = newJar();
    const link = await requestLink(demo.member2, jar);
    const first = await api(link.pathname + link.search, { jar });
    expect(first.status).toBe(302);
    expect(new URL(first.headers.get('location')!).pathname).toBe('/account');
    expect(sessionCookie(jar)).toBeDefined();
    const again = await api(link.pathname + link.search, { jar: newJar() });
    expect(new URL(again.headers.get('location')!, baseUrl).search).toContain('error=Verification');
  });

  it('signs in once when the same link is followed twice at the same moment', async () => {
    const link = await requestLink(demo.member2, newJar());
    const jars = [newJar(), newJar(), newJar()];
    await Promise.all(jars.map((jar) => api(link.pathname + link.search, { jar })));
    expect(jars.filter((jar) => sessionCookie(jar) !== undefined)).toHaveLength(1);
  });

  it('refuses an expired link', async () => {
    const jar = newJar();
    const link = await requestLink(demo.instructor, jar);
    await db
      .update(verificationTokens)
      .set({ expires: new Date(Date.now() - 60_000) })
      .where(eq(verificationTokens.identifier, demo.instructor));
    const response = await api(link.pathname + link.search, { jar: newJar() });
    expect(new URL(response.headers.get('location')!, baseUrl).search).toContain('error=Verification');
    const page = await api('/sign-in/problem?error=Verification');
    expect(await page.text()).toContain('already been used or has expired');
  });

  it('never makes an account for an unknown address', async () => {
    const email = newAddress();
    const jar = newJar();
    await api('/api/auth/signin/nodemailer', { jar, form: { csrfToken: await csrfToken(jar), email, callbackUrl: `${baseUrl}/account` } });
    await waitForMail(email, 'No Oxbloom account');
    expect(await db.select().from(users).where(eq(users.email, email))).toEqual([]);
  });
});

describe('rate limits', () => {
  it('stops password sign-in after 5 tries for one address, with Retry-After', async () => {
    const email = newAddress();
    const statuses: number[] = [];
    let last: Response | undefined;
    for (let attempt = 0; attempt < 6; attempt += 1) {
      // Each try from another client address: only the per-e-mail limit applies.
      last = await postSignIn(newJar(), email, 'wrong password here', `198.51.100.${10 + attempt}`);
      statuses.push(last.status);
    }
    expect(statuses).toEqual([302, 302, 302, 302, 302, 429]);
    expect(Number(last!.headers.get('retry-after'))).toBeGreaterThan(0);
  });

  it('stops sign-in from one client address after 30 tries', async () => {
    const from = `198.51.100.${100 + Math.floor(Math.random() * 100)}`;
    const jar = newJar();
    const token = await csrfToken(jar, from);
    let status = 0;
    for (let attempt = 0; attempt < 31; attempt += 1) {
      const response = await api('/api/auth/callback/credentials', {
        jar,
        from,
        form: { csrfToken: token, email: newAddress(), password: 'wrong password here' },
      });
      status = response.status;
    }
    expect(status).toBe(429);
  });

  it('stops sign-up after 3 tries for one address', async () => {
    const email = newAddress();
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 4; attempt += 1) {
      const response = await api('/api/account/sign-up', {
        json: { name: 'Eager', email, password: 'a long test password' },
        from: `198.51.100.${attempt + 1}`,
      });
      statuses.push(response.status);
    }
    expect(statuses).toEqual([202, 202, 202, 429]);
  });
});

describe('account page actions', () => {
  it('changes the name, and the password only with the current one', async () => {
    const account = await confirmedAccount();
    expect((await api('/api/account', { method: 'PATCH', jar: account.jar, json: { name: 'Renamed Smith' } })).status).toBe(200);
    const wrong = await api('/api/account/password', { jar: account.jar, json: { currentPassword: 'not it at all', newPassword: 'another long password' } });
    expect(wrong.status).toBe(400);
    expect((await wrong.json()).field).toBe('currentPassword');
    const right = await api('/api/account/password', { jar: account.jar, json: { currentPassword: account.password, newPassword: 'another long password' } });
    expect(right.status).toBe(200);
    await signedIn(account.email, 'another long password');
  });

  it('never returns a password or its hash', async () => {
    const admin = await signedIn(demo.admin);
    for (const path of ['/api/account', '/api/admin/users', '/api/account/export']) {
      const text = await (await api(path, { jar: admin })).text();
      expect(text, path).not.toMatch(/password|argon2/i);
    }
  });

  it.each([
    ['a JSON request from another site', 'http://evil.example'],
    ['a JSON request with no Origin', ''],
  ])('refuses %s (Origin check)', async (_label, origin) => {
    const jar = await signedIn(demo.member);
    const headers = origin ? { origin } : { origin: 'null' };
    const response = await api('/api/account', { method: 'PATCH', jar, json: { name: 'Hijacked' }, headers });
    expect(response.status).toBe(403);
    expect((await (await api('/api/account', { jar })).json()).name).not.toBe('Hijacked');
  });

  it('refuses a cross-site form post to a page', async () => {
    const jar = await signedIn(demo.member);
    const response = await api('/account', { jar, form: { intent: 'name', name: 'Hijacked' }, headers: { origin: 'http://evil.example' } });
    expect(response.status).toBe(403);
  });
});

describe('admin roles', () => {
  it('changes a role and refuses to demote the last admin', async () => {
    const admin = await signedIn(demo.admin);
    const account = await confirmedAccount();
    const promoted = await api(`/api/admin/users/${account.id}`, { method: 'PATCH', jar: admin, json: { role: 'instructor' } });
    expect(promoted.status).toBe(200);
    expect((await promoted.json()).role).toBe('instructor');
    expect((await (await api('/api/account', { jar: account.jar })).json()).role).toBe('instructor');

    const [adminRow] = await db.select().from(users).where(eq(users.email, demo.admin));
    const demoteLast = await api(`/api/admin/users/${adminRow.id}`, { method: 'PATCH', jar: admin, json: { role: 'member' } });
    expect(demoteLast.status).toBe(409);
    expect((await demoteLast.json()).error).toContain('last admin');
  });
});

describe('the people page', () => {
  it('is shown to admins only, and refuses to demote the last admin', async () => {
    expect((await api('/admin/users', { jar: await signedIn(demo.member) })).status).toBe(404);
    expect((await api('/admin/users')).status).toBe(302);
    const admin = await signedIn(demo.admin);
    const page = await api('/admin/users', { jar: admin });
    expect(page.status).toBe(200);
    expect(await page.text()).toContain(demo.member2);
    const [adminRow] = await db.select().from(users).where(eq(users.email, demo.admin));
    const refused = await api('/admin/users', { jar: admin, form: { userId: adminRow.id, role: 'member' } });
    expect(refused.status).toBe(400);
    expect(await refused.text()).toContain('That is the last admin');
  });
});

describe('account deletion', () => {
  it('needs the typed confirmation, then removes the account, its coupons and its stored photos', async () => {
    const account = await confirmedAccount();
    const prefix = `users/${account.id}/`;
    const [alloy] = await db.select().from(alloys).where(eq(alloys.slug, 'ti-grade-2'));
    const [{ id: couponId }] = await db
      .insert(coupons)
      .values({ ownerId: account.id, title: 'Doomed coupon', layerKey: 'ti-grade-2', surfacePrep: 'ground', process: 'oven', visibility: 'private' })
      .$returningId();
    await db.insert(couponLayers).values({ couponId, position: 0, alloyId: alloy.id });
    const keys = ['original.jpg', 'display.webp', 'thumb.webp'].map((name) => `${prefix}photos/${name}`);
    for (const key of keys) await putTestObject(key);
    await db.insert(photos).values({
      couponId,
      ownerId: account.id,
      originalKey: keys[0],
      displayKey: keys[1],
      thumbKey: keys[2],
      contentType: 'image/jpeg',
      byteSize: 1,
      width: 1,
      height: 1,
    });

    const refused = await api('/api/account', { method: 'DELETE', jar: account.jar, json: { confirmation: 'yes please' } });
    expect(refused.status).toBe(400);
    expect(await keysUnder(prefix)).toHaveLength(3);

    const deleted = await api('/api/account', { method: 'DELETE', jar: account.jar, json: { confirmation: 'delete my account' } });
    expect(deleted.status).toBe(204);
    expect(await db.select().from(users).where(eq(users.id, account.id))).toEqual([]);
    expect(await db.select().from(coupons).where(eq(coupons.id, couponId))).toEqual([]);
    expect(
      Number(
        (
          await db
            .select({ count: sql<number>`count(*)` })
            .from(photos)
            .where(eq(photos.ownerId, account.id))
        )[0].count,
      ),
    ).toBe(0);
    expect(await keysUnder(prefix)).toEqual([]);
    expect((await api('/api/account', { jar: account.jar })).status).toBe(401);
  });
});
