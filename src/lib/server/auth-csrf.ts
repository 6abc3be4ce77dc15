import { Auth } from '@auth/core';
import type { AstroGlobal } from 'astro';
import { parseString } from 'set-cookie-parser';
import authConfig from 'auth:config';

/**
 * Auth.js's CSRF token for the sign-in forms on our own pages (double-submit: the token goes in
 * the form, its signed twin in a cookie this sets).
 */
export async function authCsrfToken(astro: Pick<AstroGlobal, 'request' | 'url' | 'cookies'>): Promise<string> {
  const { prefix = '/api/auth', ...options } = authConfig;
  const response = await Auth(new Request(new URL(`${prefix}/csrf`, astro.url), { headers: astro.request.headers }), options);
  for (const cookie of response.headers.getSetCookie()) {
    const { name, value, ...cookieOptions } = parseString(cookie);
    astro.cookies.set(name, value, cookieOptions as Parameters<typeof astro.cookies.set>[2]);
  }
  const { csrfToken } = (await response.json()) as { csrfToken: string };
  return csrfToken;
}
