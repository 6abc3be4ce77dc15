import { defineMiddleware, sequence } from 'astro:middleware';
import { PASSWORD_MAX_LENGTH, emailSchema } from './lib/account';
import { allowedMethods, asJsonError, errorMessage, needsJson } from './lib/server/api-errors';
import { authRoute, isAuthPath, isPlainForm, isSignInAttempt, signInFields } from './lib/server/auth-routes';
import { clientAddress } from './lib/server/client-address';
import { config } from './lib/server/config';
import { limits } from './lib/server/limits';
import { hitAll, refund, type Limit } from './lib/server/rate-limit';
import { problem, tooManyAttemptsProblem, wantsHtml } from './lib/server/http';
import { BoundedCache, cachedBody, sendCached, type CachedBody } from './lib/server/http-cache';
import { libraryVersion } from './lib/server/library/recent';
import { MAX_BODY_LABEL, bodyTooLarge } from './lib/server/request-limits';
import { securityHeaders } from './lib/server/security-headers';
import { sessionUserOf } from './lib/server/session';
import { startUploadSweeper } from './lib/server/photos/uploads-ledger';
import { answerDatabaseOutage } from './lib/server/database-outage';

// A missing or malformed setting stops the server before it answers anyone, naming the setting.
config();

/** The route auth-astro adds for Auth.js. */
const AUTH_ROUTE_PATTERN = '/api/auth/[...auth]';

/**
 * Sign-in attempts through Auth.js are limited per client address (all attempts) and per e-mail
 * address (failed password attempts, and every request for a sign-in link). Only Auth.js paths
 * written the way our pages write them are served, and a sign-in must be a plain form, so the
 * e-mail address counted here is the one Auth.js checks.
 */
const limitSignIn = defineMiddleware(async (context, next) => {
  if (!isAuthPath(context.url.pathname) && context.routePattern !== AUTH_ROUTE_PATTERN) return next();
  // Auth.js reads the path as sent; Astro's `context.url` has it decoded, so `/api/%61uth/…` comes
  // here too, and Auth.js would answer nothing for that spelling.
  const route = authRoute(new URL(context.request.url).pathname);
  if (!route) return problem(404, 'There is nothing at this address.');
  if (!isSignInAttempt(context.request.method, route)) return next();
  if (!isPlainForm(context.request.headers.get('content-type'))) {
    return problem(415, 'Send sign-in requests as a form (application/x-www-form-urlencoded).');
  }
  const fields = await signInFields(context.request);
  const email = emailSchema.safeParse(fields.email);
  const checks: [Limit, string][] = [[limits.signInPerAddress, clientAddress(context)]];
  if (email.success) checks.push([limits.signInPerEmail, email.data]);
  const result = await hitAll(checks);
  if (!result.allowed) return refuseSignIn(context.request, 'TooManyAttempts', tooManyAttemptsProblem(result.retryAfterSeconds));
  // A password longer than any we accept can't be right; a link only goes to an address we could count.
  if ((fields.password ?? '').length > PASSWORD_MAX_LENGTH) {
    return refuseSignIn(context.request, 'CredentialsSignin', problem(400, `password: Use at most ${PASSWORD_MAX_LENGTH} characters.`, 'password'));
  }
  if (route.provider === 'nodemailer' && !email.success) {
    return refuseSignIn(context.request, 'EmailSignin', problem(400, `email: ${email.error.issues[0].message}`, 'email'));
  }
  const response = await next();
  const signedIn = route.provider === 'credentials' && response.status === 302 && !response.headers.get('location')?.includes('error=');
  if (signedIn && email.success) await refund(limits.signInPerEmail, email.data);
  return response;
});

/** A refused sign-in: JSON for scripts; back to the sign-in page with a message for a browser's form post. */
function refuseSignIn(request: Request, code: string, json: Response): Response {
  if (!wantsHtml(request)) return json;
  const location = new URL('/sign-in', request.url);
  location.searchParams.set('error', code);
  const retryAfter = json.headers.get('retry-after');
  if (retryAfter) location.searchParams.set('retryAfter', retryAfter);
  return new Response(null, { status: 303, headers: { location: `${location.pathname}${location.search}` } });
}

/**
 * Reads the session once per request into `locals.user` (null when signed out). A request without
 * a session cookie is a visitor's at once; one with a cookie costs one decryption and one
 * primary-key read (lib/server/session.ts), not a run through Auth.js.
 */
const loadSession = defineMiddleware(async (context, next) => {
  context.locals.user = null;
  if (context.url.pathname.startsWith('/api/auth/') || context.url.pathname.startsWith('/_astro/')) return next();
  context.locals.user = await sessionUserOf(context.request, context.url, context.cookies).catch(() => null);
  return next();
});

/**
 * Pages that are a pure function of their address for a visitor (the same HTML for everyone signed
 * out): rendered once per process and address, and sent with an ETag, so a repeat visit costs a
 * 304. The front page also shows the library's recent coupons, so its copy is kept with the
 * library's version (lib/server/library/recent.ts) read before it was rendered, and sent only
 * while the version is still that one: a write through the app, in any process, renders it anew.
 * Signed-in people get the page rendered for them, never kept by a cache (`secureHeaders`).
 */
const VISITOR_PAGES = new Set(['/tint-ladder']);
const LIBRARY_PAGES = new Set(['/']);
const VISITOR_PAGE_CACHE_CONTROL = 'public, no-cache';
const visitorPages = new BoundedCache<string, { page: CachedBody; libraryVersion?: string }>(128);

const cacheVisitorPages = defineMiddleware(async (context, next) => {
  const { request, url } = context;
  const followsLibrary = LIBRARY_PAGES.has(url.pathname);
  if (context.locals.user || request.method !== 'GET' || !(followsLibrary || VISITOR_PAGES.has(url.pathname))) return next();
  const key = `${url.pathname}${url.search}`;
  const version = followsLibrary ? await libraryVersion() : undefined;
  const known = visitorPages.get(key);
  if (known && known.libraryVersion === version) return sendCached(request, known.page, VISITOR_PAGE_CACHE_CONTROL, { vary: 'cookie' });
  const response = await next();
  if (response.status !== 200 || response.headers.has('set-cookie')) return response;
  const page = cachedBody(await response.text(), response.headers.get('content-type') ?? 'text/html');
  visitorPages.set(key, { page, libraryVersion: version });
  return sendCached(request, page, VISITOR_PAGE_CACHE_CONTROL, { vary: 'cookie' });
});

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Every state-changing request must come from our own pages: its Origin must be the app's own.
 * This covers form posts, JSON and bodiless requests alike (Astro's own check, which covers form
 * posts only and answers in plain text, is switched off in astro.config.mjs).
 */
const checkOrigin = defineMiddleware((context, next) => {
  if (SAFE_METHODS.has(context.request.method)) return next();
  const origin = context.request.headers.get('origin');
  if (origin && origin === context.url.origin) return next();
  return problem(403, 'Cross-site requests are refused: send this from Oxbloom’s own pages.');
});

/** Refuses a body over the cap (lib/server/request-limits.ts) before anything reads it. */
const limitBodies = defineMiddleware(async (context, next) => {
  if (await bodyTooLarge(context.request)) return problem(413, `The request body is larger than ${MAX_BODY_LABEL}.`);
  return next();
});

/**
 * Every error under /api/ is JSON `{error, field?}`: Astro's 404 page for an unknown route, its
 * empty 404 for a method the route lacks (a 405 naming the methods it has), a thrown error (500)
 * and any other error that isn't JSON yet.
 */
const jsonErrors = defineMiddleware(async (context, next) => {
  if (!context.url.pathname.startsWith('/api/')) return next();
  let response: Response;
  try {
    response = await next();
  } catch (error) {
    console.error(error);
    return problem(500, errorMessage(500));
  }
  if (context.routePattern === '/404') return needsJson(response) ? asJsonError(response, 'There is no API route at this address.') : response;
  if (response.status === 404 && response.body === null) {
    const allowed = await allowedMethods(context.routePattern);
    if (allowed && !allowed.includes(context.request.method)) {
      const refused = problem(405, `This address takes ${allowed.join(', ')} only.`);
      refused.headers.set('allow', allowed.join(', '));
      return refused;
    }
  }
  return needsJson(response) ? asJsonError(response) : response;
});

/** Pages and routes of accounts and sign-in: never kept by a cache, signed in or not. */
const PERSONAL_PATHS = /^\/(account|admin|sign-in|sign-up|forgot-password|reset-password|confirm-email|api\/account|api\/admin|api\/auth)(\/|$)/;
const headerLists = new Map<boolean, [string, string][]>();

/** The security headers over http or https, worked out once (they depend on settings read at start). */
function securityHeaderList(https: boolean): [string, string][] {
  let list = headerLists.get(https);
  if (!list)
    headerLists.set(https, (list = Object.entries(securityHeaders({ storageOrigin: new URL(config().S3_ENDPOINT).origin, https, dev: import.meta.env.DEV }))));
  return list;
}

/**
 * Security headers on every answer (lib/server/security-headers.ts), and `Cache-Control: no-store`
 * on every answer to someone signed in and on every account page. A response whose headers are
 * immutable (a redirect, a fetched one) is copied first; the rest are changed in place.
 */
const secureHeaders = defineMiddleware(async (context, next) => {
  let response = await next();
  const list = securityHeaderList(context.url.protocol === 'https:');
  try {
    response.headers.set(list[0][0], list[0][1]);
  } catch {
    response = new Response(response.body, response);
  }
  for (const [name, value] of list) response.headers.set(name, value);
  if (context.locals.user || PERSONAL_PATHS.test(context.url.pathname)) response.headers.set('cache-control', 'no-store');
  return response;
});

/** Starts this process's timer for the sweep of stale uploads (once; see lib/server/photos/uploads-ledger.ts). */
const startTimers = defineMiddleware((_context, next) => {
  startUploadSweeper();
  return next();
});

export const onRequest = sequence(
  startTimers,
  secureHeaders,
  jsonErrors,
  answerDatabaseOutage,
  checkOrigin,
  limitBodies,
  limitSignIn,
  loadSession,
  cacheVisitorPages,
);
