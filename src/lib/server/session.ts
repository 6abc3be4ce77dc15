import { encode } from '@auth/core/jwt';
import type { AstroCookies } from 'astro';

/** How long a sign-in lasts (Auth.js session.maxAge uses the same). */
export const SESSION_MAX_AGE_SECONDS = 7 * 24 * 3600;

/** Auth.js's own cookie name for JWT sessions; secure cookies get the __Secure- prefix. */
export const sessionCookieName = (url: URL) => (url.protocol === 'https:' ? '__Secure-authjs.session-token' : 'authjs.session-token');

function secret(): string {
  const value = process.env.AUTH_SECRET;
  if (!value) throw new Error('AUTH_SECRET is not set.');
  return value;
}

/**
 * Signs someone in from our own flows (e-mail confirmation, password reset) with the same
 * encrypted JWT cookie Auth.js makes, so Auth.js reads it like any other session.
 */
export async function startSession(cookies: AstroCookies, url: URL, user: { id: string; name: string | null; email: string }) {
  const name = sessionCookieName(url);
  const token = await encode({
    token: { sub: user.id, name: user.name, email: user.email },
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

export function endSession(cookies: AstroCookies, url: URL) {
  cookies.delete(sessionCookieName(url), { path: '/' });
}
