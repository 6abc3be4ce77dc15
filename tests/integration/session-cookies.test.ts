import { afterAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { encode } from '@auth/core/jwt';
import { api, newJar, type Jar } from '../support/app';
import { anotherClientAddress, confirmedAccount, demo, sessionCookie, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { sessions, users } from '../../db/schema';

/**
 * The session is read without Auth.js's round trip (a request with no cookie is a visitor's at
 * once; a cookie is decrypted and its live session read by primary key), and no cookie the server
 * would not honour gets more than the visitor's view: a page that greets no one, the visitor's
 * cacheable answers, and a 401 where a session is needed.
 */
const { db, pool } = testDatabase();
afterAll(() => pool.end());

const COOKIE = 'authjs.session-token';
const signIn = (email: string, password?: string) => signedIn(email, password, anotherClientAddress());
const copyOf = (jar: Jar): Jar => ({ cookies: new Map(jar.cookies) });
const withCookie = (value: string): Jar => ({ cookies: new Map([[COOKIE, value]]) });

/** What a caller with this jar is shown: whom the page greets, and what a session-only route says. */
async function viewOf(jar: Jar | undefined) {
  const page = await api('/', { jar });
  const html = await page.text();
  const account = await api('/api/account', { jar });
  return {
    pageStatus: page.status,
    signedIn: html.includes('action="/api/account/sign-out"'),
    offersSignIn: html.includes('href="/sign-in"'),
    accountStatus: account.status,
    cacheControl: page.headers.get('cache-control'),
  };
}

const visitorView = async () => viewOf(undefined);

/** A token the way Auth.js makes one, with this secret and these claims. */
const tokenWith = (claims: Record<string, unknown>, { secret = process.env.AUTH_SECRET!, maxAge = 3600 } = {}) =>
  encode({ token: claims, secret, salt: COOKIE, maxAge });

async function liveSessionOf(jar: Jar): Promise<{ sid: string; userId: string }> {
  // The newest session row of the person this jar is signed in as.
  const response = await api('/api/account', { jar });
  const { email } = (await response.json()) as { email: string };
  const [row] = await db
    .select({ sid: sessions.sessionToken, userId: sessions.userId })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(eq(users.email, email))
    .orderBy(sql`${sessions.expires} DESC`)
    .limit(1);
  return row;
}

describe('a session cookie the server honours', () => {
  it('shows the signed-in view, never kept by a cache', async () => {
    const jar = await signIn(demo.member);
    const view = await viewOf(jar);
    expect(view).toMatchObject({ pageStatus: 200, signedIn: true, offersSignIn: false, accountStatus: 200 });
    expect(view.cacheControl).toBe('no-store');
  });
});

describe('cookies that get the visitor view', () => {
  it('no cookie at all', async () => {
    expect(await visitorView()).toMatchObject({ pageStatus: 200, signedIn: false, offersSignIn: true, accountStatus: 401 });
  });

  it('a replayed copy of a cookie after its session was signed out', async () => {
    const account = await confirmedAccount();
    const jar = await signIn(account.email, account.password);
    const kept = copyOf(jar);
    expect((await viewOf(kept)).signedIn).toBe(true);
    expect((await api('/api/account/sign-out', { method: 'POST', jar })).status).toBe(200);
    expect(sessionCookie(jar)).toBeUndefined();
    // Twice: the second time the cookie's decryption is remembered, and the session must still be read.
    for (let attempt = 0; attempt < 2; attempt += 1) expect(await viewOf(kept)).toEqual(await visitorView());
  });

  it('a cookie forged with another secret, naming a live session', async () => {
    const jar = await signIn(demo.member2);
    const { sid, userId } = await liveSessionOf(jar);
    const forged = await tokenWith({ sub: userId, sid }, { secret: 'not-the-server-secret-but-just-as-long-0123456789' });
    expect(await viewOf(withCookie(forged))).toEqual(await visitorView());
  });

  it('a real cookie with one character changed', async () => {
    const jar = await signIn(demo.member2);
    const real = jar.cookies.get(sessionCookie(jar)!)!;
    const at = real.length - 10;
    const altered = `${real.slice(0, at)}${real[at] === 'A' ? 'B' : 'A'}${real.slice(at + 1)}`;
    expect(await viewOf(withCookie(altered))).toEqual(await visitorView());
  });

  it('text that is no token at all, whole or split into chunks', async () => {
    expect(await viewOf(withCookie('not-a-token'))).toEqual(await visitorView());
    const chunked: Jar = {
      cookies: new Map([
        [`${COOKIE}.0`, 'eyJhbGciOiJkaXIi'],
        [`${COOKIE}.1`, 'LCJlbmMiOiJBMjU2'],
      ]),
    };
    expect(await viewOf(chunked)).toEqual(await visitorView());
  });

  it('a token past its expiry, though made with the server’s secret and naming a live session', async () => {
    const jar = await signIn(demo.member2);
    const { sid, userId } = await liveSessionOf(jar);
    const expired = await tokenWith({ sub: userId, sid }, { maxAge: -60 });
    expect(await viewOf(withCookie(expired))).toEqual(await visitorView());
  });

  it('a cookie whose session row has run out', async () => {
    const account = await confirmedAccount();
    const jar = await signIn(account.email, account.password);
    expect((await viewOf(jar)).signedIn).toBe(true);
    const { userId } = await liveSessionOf(jar);
    await db
      .update(sessions)
      .set({ expires: sql`UTC_TIMESTAMP() - INTERVAL 1 MINUTE` })
      .where(eq(sessions.userId, userId));
    expect(await viewOf(jar)).toEqual(await visitorView());
  });

  it('a valid token naming someone else’s live session', async () => {
    const victim = await signIn(demo.member2);
    const { sid } = await liveSessionOf(victim);
    const [member] = await db.select({ id: users.id }).from(users).where(eq(users.email, demo.member));
    const mixed = await tokenWith({ sub: member.id, sid });
    expect(await viewOf(withCookie(mixed))).toEqual(await visitorView());
  });

  it('a token naming no session at all', async () => {
    const [member] = await db.select({ id: users.id }).from(users).where(eq(users.email, demo.member));
    expect(await viewOf(withCookie(await tokenWith({ sub: member.id, email: demo.member })))).toEqual(await visitorView());
  });

  it('a cookie under the name Auth.js uses over https, sent over http', async () => {
    const jar = await signIn(demo.member2);
    const real = jar.cookies.get(sessionCookie(jar)!)!;
    const renamed: Jar = { cookies: new Map([[`__Secure-${COOKIE}`, real]]) };
    expect(await viewOf(renamed)).toEqual(await visitorView());
  });
});

describe('a cookie jar without a session', () => {
  it('is a visitor, whatever other cookies it carries', async () => {
    const jar = newJar();
    jar.cookies.set('authjs.csrf-token', 'x');
    jar.cookies.set('theme', 'dark');
    expect(await viewOf(jar)).toEqual(await visitorView());
  });
});
