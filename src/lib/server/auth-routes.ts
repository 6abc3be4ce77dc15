/**
 * The Auth.js routes (served by auth-astro under /api/auth) as Auth.js itself reads them, so the
 * middleware's limits see exactly the request Auth.js will act on.
 */

export const AUTH_PREFIX = '/api/auth';

/** The actions auth-astro hands to Auth.js; only `signin` and `callback` take a provider. */
const ACTIONS = new Set(['providers', 'session', 'csrf', 'signin', 'signout', 'callback', 'verify-request', 'error']);
const WITH_PROVIDER = new Set(['signin', 'callback']);

export interface AuthRoute {
  action: string;
  provider?: string;
}

export const isAuthPath = (pathname: string) => pathname === AUTH_PREFIX || pathname.startsWith(`${AUTH_PREFIX}/`);

/**
 * The action and provider of an Auth.js path written the one way our pages write it
 * (`/api/auth/callback/credentials`), or null. Auth.js drops empty segments, so
 * `/api/auth/callback//credentials/` would reach the same action: such spellings are not served.
 */
export function authRoute(pathname: string): AuthRoute | null {
  const match = /^\/api\/auth\/([a-z-]+)(?:\/([a-z0-9-]+))?$/.exec(pathname);
  if (!match || !ACTIONS.has(match[1])) return null;
  const [, action, provider] = match;
  if (provider && !WITH_PROVIDER.has(action)) return null;
  return provider ? { action, provider } : { action };
}

/** A POST to these actions tries a password or asks for a sign-in link: the sign-in limits apply. */
export const isSignInAttempt = (method: string, route: AuthRoute) => method === 'POST' && (route.action === 'callback' || route.action === 'signin');

/**
 * True for the one body type sign-in forms send. Auth.js reads any body whose content type merely
 * contains "application/json" as JSON, and a form otherwise; allowing only a plain form (with at
 * most a UTF-8 charset) means the fields read here are the fields Auth.js reads.
 */
export const isPlainForm = (contentType: string | null) => /^application\/x-www-form-urlencoded\s*(;\s*charset="?utf-8"?\s*)?$/i.test(contentType ?? '');

/** The fields of a sign-in form as Auth.js reads them: URLSearchParams into an object, so a repeated field's last value wins. */
export async function signInFields(request: Request): Promise<Record<string, string>> {
  return Object.fromEntries(new URLSearchParams(await request.clone().text()));
}
