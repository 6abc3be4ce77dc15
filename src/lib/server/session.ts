import { randomBytes } from 'node:crypto';
import { decode, encode } from '@auth/core/jwt';
import type { AstroCookies } from 'astro';
import { and, count, eq, gt, lt, sql } from 'drizzle-orm';
import { sessions, users } from '../../../db/schema';
import type { RoleName } from '~/lib/account';
import type { SessionUser } from './authorise';
import { config } from './config';
import { db } from './db';
import { BoundedCache } from './http-cache';

/** How long a sign-in lasts (Auth.js session.maxAge uses the same). */
export const SESSION_MAX_AGE_SECONDS = 7 * 24 * 3600;

/** Auth.js's own cookie name for JWT sessions; secure cookies get the __Secure- prefix. */
export const sessionCookieName = (url: URL) => (url.protocol === 'https:' ? '__Secure-authjs.session-token' : 'authjs.session-token');

const secret = () => config().AUTH_SECRET;

/**
 * Live sessions. A session cookie is an encrypted JWT that names a row of `sessions` (its `sid`);
 * it is good only while that row exists and has not expired. Every request checks it with one
 * primary-key read (joined to the user's row, which the session needs anyway), so signing out,
 * signing out everywhere, a password change or reset, and a role change take effect at once.
 */
export interface LiveSession {
  userId: string;
  name: string | null;
  email: string;
  role: RoleName;
}

/** Records a new sign-in for `userId` and returns its id (for the cookie's `sid`). */
export async function openSession(userId: string): Promise<string> {
  const id = randomBytes(32).toString('hex');
  await db()
    .insert(sessions)
    .values({ sessionToken: id, userId, expires: new Date(Date.now() + SESSION_MAX_AGE_SECONDS * 1000) });
  // Housekeeping on the same index: this person's sessions that ran out.
  await db()
    .delete(sessions)
    .where(and(eq(sessions.userId, userId), lt(sessions.expires, sql`UTC_TIMESTAMP()`)));
  return id;
}

/** The session's person as the database has them now, or undefined when the session is over. */
export async function findLiveSession(id: string): Promise<LiveSession | undefined> {
  const [row] = await db()
    .select({ userId: users.id, name: users.name, email: users.email, role: users.role })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(and(eq(sessions.sessionToken, id), gt(sessions.expires, sql`UTC_TIMESTAMP()`)));
  return row;
}

export async function closeSession(id: string): Promise<void> {
  await db().delete(sessions).where(eq(sessions.sessionToken, id));
}

/** Ends every session of a person (sign out everywhere, a password change or reset). */
export async function closeAllSessions(userId: string): Promise<void> {
  await db().delete(sessions).where(eq(sessions.userId, userId));
}

export async function countLiveSessions(userId: string): Promise<number> {
  const [row] = await db()
    .select({ live: count() })
    .from(sessions)
    .where(and(eq(sessions.userId, userId), gt(sessions.expires, sql`UTC_TIMESTAMP()`)));
  return Number(row?.live ?? 0);
}

/**
 * Signs someone in from our own flows (e-mail confirmation, password reset, a password change)
 * with a new live session and the same encrypted JWT cookie Auth.js makes, so Auth.js reads it
 * like any other session.
 */
export async function startSession(cookies: AstroCookies, url: URL, user: { id: string; name: string | null; email: string }) {
  const name = sessionCookieName(url);
  const sid = await openSession(user.id);
  const token = await encode({
    token: { sub: user.id, name: user.name, email: user.email, sid },
    secret: secret(),
    salt: name,
    maxAge: SESSION_MAX_AGE_SECONDS,
  });
  cookies.set(name, token, {
    path: '/',
    httpOnly: true,
    sameSite: 'lax',
    secure: url.protocol === 'https:',
    maxAge: SESSION_MAX_AGE_SECONDS,
  });
}

/** The live-session id the request's cookie names, if the cookie is ours and readable. */
async function sessionIdOf(cookies: AstroCookies, url: URL): Promise<string | undefined> {
  const name = sessionCookieName(url);
  const value = cookies.get(name)?.value;
  if (!value) return undefined;
  const token = await decode({ token: value, secret: secret(), salt: name }).catch(() => null);
  return typeof token?.sid === 'string' ? token.sid : undefined;
}

/** Signs out: ends this session for good (a kept copy of its cookie stops working) and clears the cookie. */
export async function endSession(cookies: AstroCookies, url: URL) {
  const sid = await sessionIdOf(cookies, url);
  if (sid) await closeSession(sid);
  cookies.delete(sessionCookieName(url), { path: '/' });
}

/**
 * The name Auth.js gives its session cookie for this request: it takes https from
 * X-Forwarded-Proto when there is one, else from the request's own address.
 */
export function authSessionCookieName(request: Request, url: URL): string {
  const forwarded = request.headers.get('x-forwarded-proto');
  const https = forwarded ? forwarded.trim().toLowerCase() === 'https' : url.protocol === 'https:';
  return https ? '__Secure-authjs.session-token' : 'authjs.session-token';
}

/** The session cookie's value, joined again when Auth.js split a long one into `name.0`, `name.1`, … */
function sessionCookieValue(cookies: AstroCookies, name: string): string | undefined {
  const whole = cookies.get(name)?.value;
  if (whole) return whole;
  const chunks: string[] = [];
  for (let index = 0; cookies.has(`${name}.${index}`); index += 1) chunks.push(cookies.get(`${name}.${index}`)!.value);
  return chunks.length ? chunks.join('') : undefined;
}

interface SessionClaims {
  sub: string;
  sid: string;
  /** Seconds since the epoch. */
  exp: number;
}

/**
 * Decoded cookies, by their exact text: decrypting a token (a key derivation and an AES-CBC +
 * HMAC check) gives the same claims every time, so a browser's later requests skip it. Only tokens
 * that decrypted are kept, and their expiry is checked again on every use.
 */
const decodedTokens = new BoundedCache<string, SessionClaims>(1024);

async function claimsOf(token: string, salt: string): Promise<SessionClaims | undefined> {
  const key = `${salt}\n${token}`;
  let claims = decodedTokens.get(key);
  if (!claims) {
    const payload = await decode({ token, secret: secret(), salt }).catch(() => null);
    if (!payload || typeof payload.sub !== 'string' || typeof payload.sid !== 'string' || typeof payload.exp !== 'number') return undefined;
    claims = { sub: payload.sub, sid: payload.sid, exp: payload.exp };
    decodedTokens.set(key, claims);
  }
  return claims.exp * 1000 > Date.now() ? claims : undefined;
}

/**
 * The signed-in person a request's session cookie names, or null: no cookie costs nothing; a cookie
 * costs one decryption (the first time it is seen) and one primary-key read of its live session,
 * joined to the person's row, the same checks Auth.js's jwt callback makes (src/auth.config.ts).
 * A forged, altered, expired or ended session's cookie is a visitor's.
 */
export async function sessionUserOf(request: Request, url: URL, cookies: AstroCookies): Promise<SessionUser | null> {
  const name = authSessionCookieName(request, url);
  const token = sessionCookieValue(cookies, name);
  if (!token) return null;
  const claims = await claimsOf(token, name);
  if (!claims) return null;
  const live = await findLiveSession(claims.sid);
  if (!live || live.userId !== claims.sub) return null;
  return { id: live.userId, name: live.name, email: live.email, role: live.role };
}
