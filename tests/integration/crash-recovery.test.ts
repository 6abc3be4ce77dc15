// The app process killed without warning (SIGKILL) in the middle of a photo attach and of a coupon
// save, at several moments of each: after a restart nothing is half-written. Checked with direct
// SQL and S3 listings of one fresh account's rows and objects: every photo row has all its files
// and its swatches, every object is a photo's file or has an uploads-ledger entry (so the sweep
// will take it), an upload cut short can still be attached, and once the ledger's entries are
// stale the sweep leaves exactly the photos' files. Coupons are whole: each with its layers.
import { spawnSync } from 'node:child_process';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { couponLayers, coupons, photos, swatches, uploads } from '../../db/schema';
import type { RegionInput, UploadTicket } from '~/lib/photos';
import { confirmedAccount, type TestAccount } from '../support/auth';
import { startAppProcess, type AppProcess } from '../support/app-process';
import { callApp } from '../support/other-app';
import { testDatabase } from '../support/database';
import { keysUnder } from '../support/storage';
import { insertCoupon, presign, putToStorage, type TestCoupon } from '../support/photos';
import { couponScene, encodeJpeg, renderScene, TINTS } from '../fixtures/synthetic-photos';

const { db, pool } = testDatabase();
let account: TestAccount;
let coupon: TestCoupon;
let app: AppProcess | undefined;
let photo: Uint8Array;
const scene = couponScene(1600, 1067, [TINTS.straw, TINTS.purple], { noise: { sigma: 6, seed: 7 } });
let regions: RegionInput[] = [];
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Starts the crash app again, and warms it (its first request loads the app's modules), so kills land where they are timed. */
async function restart(): Promise<AppProcess> {
  await app?.kill();
  app = await startAppProcess();
  expect((await callApp(app.url, '/api/account', { jar: account.jar })).status).toBe(200);
  return app;
}

/** Sends a request to the crash app and SIGKILLs it `delayMs` after the request went out; the answer if one came first. */
async function killDuring(send: (app: AppProcess) => Promise<Response>, delayMs: number): Promise<number | 'killed'> {
  const target = app!;
  const answer = send(target).then(
    (response) => response.status,
    () => 'killed' as const,
  );
  await sleep(delayMs);
  await target.kill();
  return answer;
}

/** Sends a request to the crash app and SIGKILLs it as soon as `moment` holds (polled); the answer if one came first. */
async function killWhen(send: (app: AppProcess) => Promise<Response>, moment: () => Promise<boolean>): Promise<number | 'killed'> {
  const target = app!;
  let answered = false;
  const answer = send(target).then(
    (response) => response.status,
    () => 'killed' as const,
  );
  void answer.finally(() => (answered = true));
  while (!answered && !(await moment())) await sleep(5);
  await target.kill();
  return answer;
}

/** A photo row's files (every photo attached here has an analysis copy). */
const filesOf = (row: typeof photos.$inferSelect) => [row.originalKey, row.displayKey, row.thumbKey, row.analysisKey ?? 'no analysis copy'];

/** Every key a photo row of the account names. */
async function photoKeys(ownerId: string) {
  const rows = await db.select().from(photos).where(eq(photos.ownerId, ownerId));
  return { rows, keys: new Set(rows.flatMap(filesOf)) };
}

/** The invariants: photo rows whole, every object owned by a row or a ledger entry's folder. */
async function checkInvariants(ownerId: string) {
  const { rows, keys } = await photoKeys(ownerId);
  const stored = new Set(await keysUnder(`users/${ownerId}/`));
  for (const row of rows) {
    for (const key of filesOf(row)) expect(stored.has(key), `photo ${row.id}: ${key}`).toBe(true);
    const measured = await db.select({ id: swatches.id }).from(swatches).where(eq(swatches.photoId, row.id));
    expect(measured.length, `photo ${row.id} has swatches`).toBeGreaterThan(0);
  }
  const ledger = new Set((await db.select({ key: uploads.key }).from(uploads).where(eq(uploads.ownerId, ownerId))).map((entry) => entry.key));
  const ledgerFolders = new Set([...ledger].map((key) => key.slice(0, key.lastIndexOf('/') + 1)));
  // An object is accounted for when a photo row names it, or a ledger entry names it or, for an
  // entry no photo owns, its folder (the sweep clears that whole folder).
  const ownedFolders = new Set([...keys].map((key) => key.slice(0, key.lastIndexOf('/') + 1)));
  const orphans = [...stored].filter((key) => {
    if (keys.has(key) || ledger.has(key)) return false;
    const folder = key.slice(0, key.lastIndexOf('/') + 1);
    return !(ledgerFolders.has(folder) && !ownedFolders.has(folder));
  });
  expect(orphans, 'objects with neither a photo row nor a ledger entry').toEqual([]);
  return { rows, stored, ledger };
}

beforeAll(async () => {
  account = await confirmedAccount();
  coupon = await insertCoupon(db, account.email, ['ti-grade-2', 'steel-1084'], 'private');
  regions = [
    { kind: 'layer', layerId: coupon.layerIds[0], ...scene.layers[0].region },
    { kind: 'layer', layerId: coupon.layerIds[1], ...scene.layers[1].region },
    { kind: 'grey', ...scene.grey },
  ];
  photo = await encodeJpeg(renderScene(scene.scene));
  await restart();
}, 60_000);

afterAll(async () => {
  await app?.kill();
  await pool.end();
}, 30_000);

describe('SIGKILL during a photo attach', () => {
  it('leaves no photo without its files, and no file without its photo or ledger entry; a cut-short upload can be attached again', async () => {
    const attachOn = (ticket: UploadTicket) => (target: AppProcess) =>
      callApp(target.url, `/api/coupons/${coupon.id}/photos`, { jar: account.jar, json: { key: ticket.key, regions } });
    let duration = 0;
    const upload = async () => {
      const ticket = await presign(account.jar, 'coupon.jpg', 'image/jpeg', photo.length);
      await putToStorage(ticket, photo);
      return ticket;
    };

    // How long one attach takes here (the second: the first loads the photo code), to time kills by.
    for (const round of [1, 2]) {
      const ticket = await upload();
      const started = Date.now();
      expect((await attachOn(ticket)(app!)).status).toBe(201);
      duration = Date.now() - started;
      console.log(`attach ${round} took ${duration} ms`);
    }

    // Kills at moments of the walk, seen from outside: the upload claimed (its ledger entry's expiry
    // moved on), the first derived file in storage, the photo row committed; and at times.
    const folderOf = (ticket: UploadTicket) => ticket.key.slice(0, ticket.key.lastIndexOf('/') + 1);
    const claimed = (ticket: UploadTicket) => async () => {
      const [entry] = await db.select({ expiresAt: uploads.expiresAt }).from(uploads).where(eq(uploads.key, ticket.key));
      return !entry || entry.expiresAt.getTime() > Date.parse(ticket.expiresAt) + 1000;
    };
    const derived = (ticket: UploadTicket) => async () =>
      (await keysUnder(folderOf(ticket))).some((key) => /-(display|thumb)\.webp$|-analysis\.png$/.test(key));
    const recorded = (ticket: UploadTicket) => async () =>
      (await db.select({ id: photos.id }).from(photos).where(eq(photos.originalKey, ticket.key))).length > 0;
    const moments: [string, (ticket: UploadTicket) => () => Promise<boolean>][] = [
      ['claimed', claimed],
      ['first derived file stored', derived],
      ['first derived file stored', derived],
      ['photo row committed', recorded],
    ];
    const cut: UploadTicket[] = [];
    const note = (what: string, outcome: number | 'killed', ticket: UploadTicket) => {
      console.log(`attach killed at ${what}: ${outcome}`);
      if (outcome === 'killed') cut.push(ticket);
      else expect(outcome).toBe(201);
    };
    for (const [what, when] of moments) {
      const ticket = await upload();
      // The claim moves the entry's expiry to ten minutes from the attach: wait, so that differs from the URL's.
      if (when === claimed) await sleep(1500);
      note(what, await killWhen(attachOn(ticket), when(ticket)), ticket);
      await restart();
      await checkInvariants(account.id);
    }
    for (const fraction of [0.1, 0.5, 0.9]) {
      const ticket = await upload();
      note(`${Math.round(duration * fraction)} ms`, await killDuring(attachOn(ticket), Math.round(duration * fraction)), ticket);
      await restart();
      await checkInvariants(account.id);
    }
    expect(cut.length, `kills that landed inside an attach of ${duration} ms`).toBeGreaterThan(2);

    // Each upload cut short is either attached (the kill came after the commit) or can be attached now.
    for (const ticket of cut) {
      const retry = await attachOn(ticket)(app!);
      expect([201, 404], await retry.clone().text()).toContain(retry.status);
    }
    // One photo per upload: the two timed ones and the seven of the kills, none twice.
    const { rows } = await checkInvariants(account.id);
    expect(rows).toHaveLength(9);

    // Once every entry is stale and its URL can no longer be used, the sweep leaves only the photos' files.
    const longAgo = new Date(Date.now() - 3 * 3600_000);
    await db.update(uploads).set({ expiresAt: longAgo, createdAt: longAgo }).where(eq(uploads.ownerId, account.id));
    const sweep = spawnSync(process.execPath, ['node_modules/tsx/dist/cli.mjs', 'tests/support/sweep-process.ts', 'now'], {
      encoding: 'utf8',
      // The sweep process waits for a line before it sweeps.
      input: 'go\n',
      timeout: 120_000,
    });
    expect(sweep.status, sweep.stderr).toBe(0);
    const after = await checkInvariants(account.id);
    expect(after.ledger.size).toBe(0);
    const { keys } = await photoKeys(account.id);
    expect([...after.stored].sort()).toEqual([...keys].sort());
  }, 600_000);
});

describe('SIGKILL during a coupon save', () => {
  const aCoupon = {
    title: 'Crash test coupon',
    layers: ['ti-grade-2', 'ti-grade-5', 'steel-1084'],
    surfacePrep: 'ground',
    process: 'oven',
    temperatureC: 540,
    holdSeconds: 1800,
    atmosphere: 'air',
    cooling: 'still-air',
    visibility: 'private',
  };

  it('leaves every coupon whole: its record and all its layers, or nothing', async () => {
    const create = (target: AppProcess) => callApp(target.url, '/api/coupons', { jar: account.jar, json: aCoupon });
    const edit = (id: number) => (target: AppProcess) =>
      callApp(target.url, `/api/coupons/${id}`, { jar: account.jar, method: 'PATCH', json: { layers: ['steel-1084', 'ti-grade-5'], temperatureC: 600 } });
    const outcomes: (number | 'killed')[] = [];
    for (const delayMs of [0, 2, 5, 10, 20, 40]) {
      outcomes.push(await killDuring(create, delayMs));
      await restart();
    }
    const mine = await db.select().from(coupons).where(eq(coupons.ownerId, account.id));
    const created = mine.filter((row) => row.title === aCoupon.title);
    for (const delayMs of [0, 2, 5, 10, 20]) {
      outcomes.push(await killDuring(edit(created[0]?.id ?? coupon.id), delayMs));
      await restart();
    }
    expect(outcomes.filter((outcome) => outcome === 'killed').length).toBeGreaterThan(0);

    // Whole: a coupon's layer_key names exactly its layers' alloys; an edit is all in or all out.
    const rows = await db.select().from(coupons).where(eq(coupons.ownerId, account.id));
    const layers = await db
      .select({ couponId: couponLayers.couponId, position: couponLayers.position, alloyId: couponLayers.alloyId })
      .from(couponLayers)
      .where(
        inArray(
          couponLayers.couponId,
          rows.map((row) => row.id),
        ),
      );
    const { alloys } = await import('../../db/schema');
    const slugs = new Map((await db.select({ id: alloys.id, slug: alloys.slug }).from(alloys)).map((row) => [row.id, row.slug]));
    for (const row of rows) {
      const own = layers.filter((layer) => layer.couponId === row.id).sort((a, b) => a.position - b.position);
      expect(own.length, `coupon ${row.id} has layers`).toBeGreaterThan(0);
      expect(own.map((layer) => layer.position)).toEqual(own.map((_, index) => index));
      expect(row.layerKey, `coupon ${row.id}`).toBe(
        own
          .map((layer) => slugs.get(layer.alloyId))
          .sort()
          .join('+'),
      );
      if (row.title === aCoupon.title && row.temperatureC === 600) expect(own.map((layer) => slugs.get(layer.alloyId))).toEqual(['steel-1084', 'ti-grade-5']);
    }
  }, 300_000);
});
