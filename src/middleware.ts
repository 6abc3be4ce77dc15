import { defineMiddleware, sequence } from 'astro:middleware';
import { getSession } from 'auth-astro/server';
import { emailSchema } from './lib/account';
import { clientAddress } from './lib/server/client-address';
import { limits } from './lib/server/limits';
import { hitAll, refund, type Limit } from './lib/server/rate-limit';
import { problem, tooManyAttempts } from './lib/server/http';
import { startUploadSweeper } from './lib/server/uploads';

const SIGN_IN_ROUTES = ['/api/auth/callback/credentials', '/api/auth/signin/nodemailer'];

/**
 * Sign-in attempts through Auth.js are limited per client address (all attempts) and per e-mail
 * address (failed password attempts, and every request for a sign-in link).
 */
const limitSignIn = defineMiddleware(async (context, next) => {
  if (context.request.method !== 'POST' || !SIGN_IN_ROUTES.includes(context.url.pathname)) return next();
  const form = await context.request.clone().formData().catch(() => undefined);
  const email = emailSchema.safeParse(form?.get('email'));
  const checks: [Limit, string][] = [[limits.signInPerAddress, clientAddress(context)]];
  if (email.success) checks.push([limits.signInPerEmail, email.data]);
  const result = await hitAll(checks);
  if (!result.allowed) return tooManyAttempts(result.retryAfterSeconds, context.request);
  const response = await next();
  const signedIn = context.url.pathname.endsWith('/credentials') && response.status === 302 && !response.headers.get('location')?.includes('error=');
  if (signedIn && email.success) await refund(limits.signInPerEmail, email.data);
  return response;
});

/** Reads the session once per request; `locals.user` is null when signed out. */
const loadSession = defineMiddleware(async (context, next) => {
  context.locals.user = null;
  if (context.url.pathname.startsWith('/api/auth/') || context.url.pathname.startsWith('/_astro/')) return next();
  const session = await getSession(context.request).catch(() => null);
  const user = session?.user;
  if (user?.id && user.email) {
    context.locals.user = { id: user.id, name: user.name ?? null, email: user.email, role: user.role };
  }
  return next();
});

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Every state-changing request must come from our own pages: its Origin must be the app's own.
 * (Astro's checkOrigin covers form posts only; this covers JSON too.)
 */
const checkOrigin = defineMiddleware((context, next) => {
  if (SAFE_METHODS.has(context.request.method)) return next();
  const origin = context.request.headers.get('origin');
  if (origin && origin === context.url.origin) return next();
  return problem(403, 'Cross-site requests are refused: send this from Oxbloom’s own pages.');
});

/** Security headers on every answer (copying the response when its headers are immutable). */
const secureHeaders = defineMiddleware(async (_context, next) => {
  const original = await next();
  const response = new Response(original.body, original);
  response.headers.set('x-content-type-options', 'nosniff');
  response.headers.set('referrer-policy', 'same-origin');
  response.headers.set('x-frame-options', 'DENY');
  return response;
});

/** Starts this process's timer for the sweep of stale uploads (once; see lib/server/uploads.ts). */
const startTimers = defineMiddleware((_context, next) => {
  startUploadSweeper();
  return next();
});

export const onRequest = sequence(startTimers, secureHeaders, checkOrigin, limitSignIn, loadSession);
