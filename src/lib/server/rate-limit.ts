import { createHash } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { rateLimits } from '../../../db/schema';
import { db } from './db';

export interface Limit {
  /** What is limited, e.g. "sign-in:email". */
  name: string;
  max: number;
  windowSeconds: number;
}

export type LimitResult = { allowed: true } | { allowed: false; retryAfterSeconds: number };

const bucketOf = (limit: Limit, subject: string) => `${limit.name}:${createHash('sha256').update(subject.toLowerCase()).digest('hex').slice(0, 40)}`;

/**
 * Counts one attempt against a fixed window kept in MariaDB, so every app process shares it.
 * The window restarts when it has passed.
 *
 * Two statements, each of which reads only values it does not assign: MariaDB applies the
 * assignments of one UPDATE (and of ON DUPLICATE KEY UPDATE) left to right, each seeing the ones
 * before it, so a single statement that both restarts the window and tests it would depend on the
 * order its columns are written in. The restart matches only an expired window, so two requests at
 * the boundary restart it once.
 */
export async function hit(limit: Limit, subject: string): Promise<LimitResult> {
  const bucket = bucketOf(limit, subject);
  const window = limit.windowSeconds;
  await db()
    .update(rateLimits)
    .set({ hits: 0, windowStart: sql`UTC_TIMESTAMP()` })
    .where(sql`${rateLimits.bucket} = ${bucket} AND ${rateLimits.windowStart} <= UTC_TIMESTAMP() - INTERVAL ${window} SECOND`);
  await db()
    .insert(rateLimits)
    .values({ bucket, windowStart: sql`UTC_TIMESTAMP()`, hits: 1 })
    .onDuplicateKeyUpdate({ set: { hits: sql`${rateLimits.hits} + 1` } });
  const [row] = await db()
    .select({ hits: rateLimits.hits, age: sql<number>`TIMESTAMPDIFF(SECOND, ${rateLimits.windowStart}, UTC_TIMESTAMP())` })
    .from(rateLimits)
    .where(sql`${rateLimits.bucket} = ${bucket}`);
  if (!row || row.hits <= limit.max) return { allowed: true };
  return { allowed: false, retryAfterSeconds: Math.max(1, window - Number(row.age)) };
}

/** Checks several limits (say per e-mail and per address); the first one exceeded wins. */
export async function hitAll(checks: [Limit, string][]): Promise<LimitResult> {
  let worst: LimitResult = { allowed: true };
  for (const [limit, subject] of checks) {
    const result = await hit(limit, subject);
    if (!result.allowed && (worst.allowed || result.retryAfterSeconds > worst.retryAfterSeconds)) worst = result;
  }
  return worst;
}

/** Takes back one counted attempt, e.g. a sign-in that succeeded, so only failures add up. */
export async function refund(limit: Limit, subject: string): Promise<void> {
  await db()
    .update(rateLimits)
    .set({ hits: sql`GREATEST(${rateLimits.hits} - 1, 0)` })
    .where(sql`${rateLimits.bucket} = ${bucketOf(limit, subject)}`);
}
