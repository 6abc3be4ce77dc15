// Two app processes against the same MariaDB, S3 fake and mail fake, as the README's "Scaling past
// one machine" promises: the suite's own app (A) and a second one started here on another port (B).
// A session begun on one is accepted, and ended, on the other; sign-in limits count attempts on
// both; the heat planner's cached fit on one sees the library change made through the other; and
// the upload sweep, run by two processes at once, removes each stale upload once and nothing else.
import { PutObjectCommand } from '@aws-sdk/client-s3';
import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { eq, inArray, like } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appSettings, uploads } from '../../db/schema';
import { api, baseUrl, newJar } from '../support/app';
import { anotherClientAddress, confirmedAccount, demo, newAddress, postSignIn, signedIn, type TestAccount } from '../support/auth';
import { startAppProcess, type AppProcess } from '../support/app-process';
import { callApp } from '../support/other-app';
import { testDatabase } from '../support/database';
import { keysUnder, testS3 } from '../support/storage';
import { userIdOf } from '../support/photos';
import { deleteCoupons, insertSyntheticCoupon } from '../fixtures/library-coupons';

const { db, pool } = testDatabase();
let other: AppProcess;
const inserted: number[] = [];

beforeAll(async () => {
  other = await startAppProcess();
}, 60_000);

afterAll(async () => {
  await other?.stop();
  await deleteCoupons(db, inserted);
  await pool.end();
}, 60_000);

describe('a session across two app processes', () => {
  it('begun on one is accepted on the other, and signing out on the other ends it on both', async () => {
    const jar = await signedIn(demo.member2);
    const onA = await api('/api/account', { jar });
    const onB = await callApp(other.url, '/api/account', { jar });
    expect(onA.status).toBe(200);
    expect(onB.status).toBe(200);
    expect(await onB.json()).toMatchObject({ email: demo.member2 });

    const signOut = await callApp(other.url, '/api/account/sign-out', { jar: { cookies: new Map(jar.cookies) }, method: 'POST' });
    expect(signOut.status).toBeLessThan(400);
    // The copy of the cookie still in `jar` names a session row that is gone.
    expect((await api('/api/account', { jar })).status).toBe(401);
    expect((await callApp(other.url, '/api/account', { jar })).status).toBe(401);
  });
});

describe('sign-in limits across two app processes', () => {
  it('counts failed attempts for one address on both: the sixth is refused, wherever it lands', async () => {
    // Source: limits.signInPerEmail in src/lib/server/limits.ts — 5 failed attempts per e-mail per
    // 15 minutes (each from its own client address, so only the per-e-mail count can trip).
    const email = newAddress();
    const attempt = async (base: string) => {
      const jar = newJar();
      const from = anotherClientAddress();
      if (base === baseUrl) return postSignIn(jar, email, 'not the password', from);
      const csrf = ((await (await callApp(base, '/api/auth/csrf', { jar, from })).json()) as { csrfToken: string }).csrfToken;
      return callApp(base, '/api/auth/callback/credentials', {
        jar,
        from,
        form: { csrfToken: csrf, email, password: 'not the password', callbackUrl: '/account' },
      });
    };
    const bases = [baseUrl, other.url, baseUrl, other.url, baseUrl];
    for (const base of bases) expect((await attempt(base)).status).toBe(302);
    expect((await attempt(other.url)).status).toBe(429);
    expect((await attempt(baseUrl)).status).toBe(429);
  });
});

describe('the heat planner’s cached fit on two app processes', () => {
  let account: TestAccount;
  const ALLOY = 'ti-grade-9';
  const plan = { alloy: ALLOY, process: 'heat', temperatureC: 540, holdMinutes: 60 };
  const count = async (base: string) => {
    const response = await callApp(base, '/api/tint/predict', { jar: account.jar, json: plan });
    expect(response.status).toBe(200);
    return ((await response.json()) as { couponCount: number }).couponCount;
  };

  beforeAll(async () => {
    account = await confirmedAccount();
    // Invented coupons of the account's own, private: the fit of this person's library alone counts them.
    for (const [temperatureC, thicknessNm] of [
      [480, 28],
      [520, 36],
      [560, 45],
      [600, 55],
    ])
      inserted.push(
        await insertSyntheticCoupon(db, { ownerEmail: account.email, alloy: ALLOY, visibility: 'private', thicknessNm, temperatureC, holdMinutes: 60 }),
      );
  });

  it('a coupon deleted through one process leaves the other’s fit at once', async () => {
    const before = await count(other.url);
    expect(await count(baseUrl)).toBe(before);
    // Asked again: B answers from its cache now.
    expect(await count(other.url)).toBe(before);

    const victim = inserted.pop()!;
    expect((await api(`/api/coupons/${victim}`, { jar: account.jar, method: 'DELETE' })).status).toBeLessThan(300);
    // B never saw the deletion; it must read the new library version and fit again.
    expect(await count(other.url)).toBe(before - 1);
    expect(await count(baseUrl)).toBe(before - 1);
  });
});

/** Runs the sweep in two processes let go at the same moment (each as an app process's timer would), after `before`. */
async function sweepTwice(
  mode: 'due' | 'now',
  before: () => Promise<unknown> = async () => undefined,
): Promise<({ entries: number; objects: number } | null)[]> {
  const children = [0, 1].map(() =>
    spawn(process.execPath, ['node_modules/tsx/dist/cli.mjs', 'tests/support/sweep-process.ts', mode], { stdio: ['pipe', 'pipe', 'pipe'] }),
  );
  const outputs = children.map((child) => {
    let out = '';
    let errors = '';
    child.stdout.on('data', (chunk) => (out += chunk));
    child.stderr.on('data', (chunk) => (errors += chunk));
    const ready = new Promise<void>((resolve, reject) => {
      const check = () => out.includes('ready') && resolve();
      child.stdout.on('data', check);
      child.on('exit', () => reject(new Error(`the sweep process stopped before it was ready: ${errors}`)));
    });
    const result = new Promise<{ entries: number; objects: number } | null>((resolve, reject) =>
      child.on('exit', (code) => (code === 0 ? resolve(JSON.parse(out.trim().split('\n').pop()!).result) : reject(new Error(errors)))),
    );
    return { ready, result };
  });
  await Promise.all(outputs.map((output) => output.ready));
  await before();
  for (const child of children) child.stdin.end('go\n');
  return Promise.all(outputs.map((output) => output.result));
}

describe('the upload sweep run by two processes at once', () => {
  it('lets one of them take the turn', async () => {
    // The turn is made due just before both go: another app process would have to take it within milliseconds.
    const makeDue = () =>
      db
        .update(appSettings)
        .set({ value: new Date(0).toISOString() })
        .where(eq(appSettings.key, 'uploads-swept-at'));
    const results = await sweepTwice('due', makeDue);
    expect(results.filter((result) => result !== null)).toHaveLength(1);
  }, 120_000);

  it('removes each stale upload’s files and entry once, even when both sweep together', async () => {
    const ownerId = await userIdOf(db, demo.member2);
    const batch = `users/${ownerId}/photos/two-processes-${randomUUID()}`;
    const keys = Array.from({ length: 12 }, (_, index) => `${batch}-${index}/original.jpg`);
    // Stale and past any use of their URLs: expired an hour ago, issued two hours ago.
    const longAgo = new Date(Date.now() - 2 * 3600_000);
    await db
      .insert(uploads)
      .values(keys.map((key) => ({ key, ownerId, contentType: 'image/jpeg', byteSize: 1, expiresAt: new Date(Date.now() - 3600_000), createdAt: longAgo })));
    for (const key of keys) {
      await testS3.send(new PutObjectCommand({ Bucket: process.env.S3_BUCKET, Key: key, Body: 'x' }));
      await testS3.send(new PutObjectCommand({ Bucket: process.env.S3_BUCKET, Key: key.replace('original.jpg', 'ab12-display.webp'), Body: 'y' }));
    }

    const results = await sweepTwice('now');
    expect(results.every((result) => result !== null)).toBe(true);
    // Other test files' stale entries may be swept too; ours go exactly once between the two.
    expect(await db.select().from(uploads).where(inArray(uploads.key, keys))).toEqual([]);
    expect(results.reduce((sum, result) => sum + result!.entries, 0)).toBeGreaterThanOrEqual(keys.length);
    expect(await keysUnder(`${batch}`)).toEqual([]);
    expect(
      await db
        .select()
        .from(uploads)
        .where(like(uploads.key, `${batch}%`)),
    ).toEqual([]);
  }, 120_000);
});
