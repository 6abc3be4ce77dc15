import { defineMiddleware } from 'astro:middleware';
import { isDatabaseUnreachable } from './database-errors';
import { pingDatabase, unreachableCount } from './db';
import { problem } from './http';
import { outagePage } from './outage-page';

/**
 * When MariaDB cannot be reached (stopped, restarting, out of connections), requests answer 503
 * with Retry-After at once: `{error}` under /api/, a page for people. A request during which the
 * pool failed to reach the database answers 503 even when a step caught the failure (a session
 * that could not be read would otherwise look signed out). Once one request has found the database
 * away, each request first asks it `SELECT 1` (refused at once, or given up after the pool's
 * connect timeout) and answers 503 while it is still away. The pool opens new connections on the
 * next request, so the app recovers by itself when the database is back.
 */

/** How long we ask clients to wait before trying again, in seconds. */
export const RETRY_AFTER_SECONDS = 15;

export const DATABASE_UNAVAILABLE =
  'The database is not answering just now, so Oxbloom cannot do this. Nothing you saved before is lost; try again in a moment.';

/** The 503 for a request that needed the database: JSON for the API and scripts, a page for a browser. */
export function databaseUnavailable(url: URL, accept: string | null): Response {
  const headers = { 'retry-after': String(RETRY_AFTER_SECONDS), 'cache-control': 'no-store' };
  if (url.pathname.startsWith('/api/') || !(accept ?? '').includes('text/html')) {
    const response = problem(503, DATABASE_UNAVAILABLE);
    for (const [name, value] of Object.entries(headers)) response.headers.set(name, value);
    return response;
  }
  return new Response(outagePage(RETRY_AFTER_SECONDS), { status: 503, headers: { ...headers, 'content-type': 'text/html; charset=utf-8' } });
}

let lastLogged = 0;
/** Set when a request found the database away; cleared by the first `SELECT 1` that answers. */
let away = false;

function logOutage(error: unknown) {
  // One line every few seconds, not one per request, while the database is away.
  if (Date.now() - lastLogged < 5_000) return;
  lastLogged = Date.now();
  console.error(`[oxbloom] the database is not answering: ${error instanceof Error ? error.message : String(error)}`);
}

/** The health check reports the database's state itself (`{status: "down"}`). */
const REPORTS_ITSELF = '/api/health';

/** Answers 503 for any request whose handling found the database unreachable. */
export const answerDatabaseOutage = defineMiddleware(async (context, next) => {
  if (context.url.pathname === REPORTS_ITSELF) return next();
  const unavailable = (error: unknown) => {
    away = true;
    logOutage(error);
    return databaseUnavailable(context.url, context.request.headers.get('accept'));
  };
  if (away) {
    try {
      await pingDatabase();
      away = false;
      console.error('[oxbloom] the database is answering again.');
    } catch (error) {
      if (isDatabaseUnreachable(error)) return unavailable(error);
      throw error;
    }
  }
  const failuresBefore = unreachableCount();
  let response: Response;
  try {
    response = await next();
  } catch (error) {
    if (!isDatabaseUnreachable(error)) throw error;
    return unavailable(error);
  }
  if (unreachableCount() !== failuresBefore) {
    await response.body?.cancel().catch(() => undefined);
    return unavailable('a query failed while this request was answered');
  }
  return response;
});
