import { createDatabase, type Database } from '../../../db/client';
import { config } from './config';
import { isDatabaseUnreachable } from './database-errors';

let instance: ReturnType<typeof createDatabase> | undefined;

/**
 * A database that is away refuses at once; one that does not answer at all (a network fault) is
 * given up on after this long, so a request answers 503 (lib/server/database-outage.ts), never hangs.
 */
const CONNECT_TIMEOUT_MS = 3_000;

/** The pool's address with mysql2's connect timeout, unless the address sets its own. */
function withConnectTimeout(url: string): string {
  const address = new URL(url);
  if (!address.searchParams.has('connectTimeout')) address.searchParams.set('connectTimeout', String(CONNECT_TIMEOUT_MS));
  return address.toString();
}

let unreachable = 0;

/** How many times the pool found the database unreachable, so far (the outage middleware compares it before and after a request). */
export const unreachableCount = () => unreachable;

/** Counts the pool's failures to reach the database, even those a caller catches and hides (e.g. a session read). */
function watch(pool: ReturnType<typeof createDatabase>['pool']) {
  const methods = pool as unknown as Record<'query' | 'execute' | 'getConnection', (...args: unknown[]) => Promise<unknown>>;
  for (const name of ['query', 'execute', 'getConnection'] as const) {
    const original = methods[name].bind(pool);
    methods[name] = (...args) =>
      original(...args).catch((error: unknown) => {
        if (isDatabaseUnreachable(error)) unreachable += 1;
        throw error;
      });
  }
}

function open() {
  if (!instance) {
    instance = createDatabase(withConnectTimeout(config().DATABASE_URL));
    watch(instance.pool);
  }
  return instance;
}

/**
 * The process-wide Drizzle client (a mysql2 pool; the app keeps no other state of its own). A
 * connection that fails leaves the pool, and the next query opens a new one: after an outage the
 * app reconnects by itself.
 */
export function db(): Database {
  return open().db;
}

export async function pingDatabase(): Promise<void> {
  await open().pool.query('SELECT 1');
}
