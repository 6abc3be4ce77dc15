// The rate limiter against MariaDB, across a window boundary.
//
// The limiter's only clock is MariaDB's UTC_TIMESTAMP(): a window has passed when its stored
// window_start is at least windowSeconds older than the database's now. Moving a bucket's
// window_start back by more than windowSeconds is therefore exactly the state the table would be in
// had that much time passed, without waiting for it (and without a test-only clock in the app).
import { afterAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { rateLimits } from '../../db/schema';
import { hit, refund, type Limit } from '~/lib/server/rate-limit';
import { db as appDb } from '~/lib/server/db';
import { newJar } from '../support/app';
import { postSignIn } from '../support/auth';
import { testDatabase } from '../support/database';

const { db, pool } = testDatabase();
afterAll(async () => {
  await pool.end();
  await appDb().$client.end();
});

const unique = () => `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 7)}`;

/** The stored bucket of a subject: the limit's name and the first 40 hex digits of SHA-256 of the lower-cased subject. */
const bucketOf = (name: string, subject: string) => `${name}:${createHash('sha256').update(subject.toLowerCase()).digest('hex').slice(0, 40)}`;

/** Moves a bucket's window back, as if `seconds` had passed on the database's clock. */
async function letTimePass(bucket: string, seconds: number) {
  await db.execute(sql`UPDATE ${rateLimits} SET window_start = window_start - INTERVAL ${seconds} SECOND WHERE bucket = ${bucket}`);
}

async function storedHits(bucket: string): Promise<number | undefined> {
  const [row] = await db
    .select({ hits: rateLimits.hits })
    .from(rateLimits)
    .where(sql`${rateLimits.bucket} = ${bucket}`);
  return row?.hits;
}

describe('the rate limiter', () => {
  const limit: Limit = { name: `test-window-${unique()}`, max: 3, windowSeconds: 60 };

  it('refuses the attempt after the last allowed one, then counts from one again once the window has passed', async () => {
    const subject = 'smith@oxbloom.test';
    const bucket = bucketOf(limit.name, subject);
    const results = [];
    for (let attempt = 0; attempt < 4; attempt += 1) results.push((await hit(limit, subject)).allowed);
    expect(results).toEqual([true, true, true, false]);

    await letTimePass(bucket, limit.windowSeconds + 1);
    expect(await hit(limit, subject)).toEqual({ allowed: true });
    expect(await storedHits(bucket)).toBe(1);
    // The new window allows max attempts in all, and refuses the next.
    expect((await hit(limit, subject)).allowed).toBe(true);
    expect((await hit(limit, subject)).allowed).toBe(true);
    expect((await hit(limit, subject)).allowed).toBe(false);
  });

  it('keeps counting inside the window (a second short of it)', async () => {
    const subject = `inside-${unique()}`;
    const bucket = bucketOf(limit.name, subject);
    for (let attempt = 0; attempt < 3; attempt += 1) await hit(limit, subject);
    await letTimePass(bucket, limit.windowSeconds - 5);
    const refused = await hit(limit, subject);
    expect(refused.allowed).toBe(false);
    // Retry-After counts down to the end of the window: about 5 s are left of 60.
    expect(refused.allowed === false && refused.retryAfterSeconds).toBeGreaterThanOrEqual(1);
    expect(refused.allowed === false && refused.retryAfterSeconds).toBeLessThanOrEqual(6);
  });

  it('a refund takes back one attempt and never goes below zero', async () => {
    const subject = `refund-${unique()}`;
    const bucket = bucketOf(limit.name, subject);
    await hit(limit, subject);
    await refund(limit, subject);
    await refund(limit, subject);
    expect(await storedHits(bucket)).toBe(0);
  });
});

describe('password sign-in across a window', () => {
  const wrong = 'wrong password here';
  // Source: src/lib/server/limits.ts is the rule under test (5 failures per e-mail address in 15 minutes).
  const windowSeconds = 15 * 60;

  it('locks an address after 5 failures, and lets it try again when the 15 minutes have passed', async () => {
    const email = `window-${unique()}@oxbloom.test`;
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 6; attempt += 1) statuses.push((await postSignIn(newJar(), email, wrong, `198.51.100.${20 + attempt}`)).status);
    expect(statuses).toEqual([302, 302, 302, 302, 302, 429]);

    await letTimePass(bucketOf('sign-in:email', email), windowSeconds + 1);
    const again: number[] = [];
    for (let attempt = 0; attempt < 6; attempt += 1) again.push((await postSignIn(newJar(), email, wrong, `198.51.100.${30 + attempt}`)).status);
    expect(again).toEqual([302, 302, 302, 302, 302, 429]);
  });

  it('locks a client address after 30 tries, and lets it try again when the 15 minutes have passed', async () => {
    const from = `192.0.2.${1 + Math.floor(Math.random() * 250)}`;
    let status = 0;
    for (let attempt = 0; attempt < 31; attempt += 1) status = (await postSignIn(newJar(), `many-${unique()}@oxbloom.test`, wrong, from)).status;
    expect(status).toBe(429);

    await letTimePass(bucketOf('sign-in:address', from), windowSeconds + 1);
    expect((await postSignIn(newJar(), `after-${unique()}@oxbloom.test`, wrong, from)).status).toBe(302);
  });
});
