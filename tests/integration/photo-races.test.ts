// Deleting a coupon while its photos are being attached, measured again or deleted: many rounds
// at once over HTTP against the built app. No answer may be a 500, and no object may stay in
// storage that neither a photo row nor a ledger entry (the `uploads` table) accounts for: the sweep
// removes only what the ledger names, so such an object would stay for ever.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, inArray } from 'drizzle-orm';
import { coupons, photos, uploads } from '../../db/schema';
import type { RegionInput } from '~/lib/photos';
import { api, type Jar } from '../support/app';
import { signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { attach, insertCoupon, presign, putToStorage, storedPhoto, userIdOf, type TestCoupon } from '../support/photos';
import { deleteTestObjects, keysUnder } from '../support/storage';
import { couponScene, encodeJpeg, renderScene, TINTS } from '../fixtures/synthetic-photos';

/** A demo member no other test file uploads as, so their folder in storage is this file's alone. */
const racer = 'wren@oxbloom.test';

const { db, pool } = testDatabase();
let jar: Jar;
let racerId: string;
const scene = couponScene(600, 400, [TINTS.blue, TINTS.straw], { noise: { sigma: 4, seed: 17 } });
let jpeg: Buffer;
/** Every folder this file uploaded into, for tidying up. */
const folders = new Set<string>();

// Everything one upload makes lives in its own folder, users/<id>/photos/<uuid>/ (DEVELOPERS.md).
const folderOf = (key: string) => key.slice(0, key.lastIndexOf('/') + 1);
const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

beforeAll(async () => {
  jar = await signedIn(racer);
  racerId = await userIdOf(db, racer);
  jpeg = await encodeJpeg(renderScene(scene.scene));
});

afterAll(async () => {
  const leftovers = (await keysUnder(`users/${racerId}/`)).filter((key) => folders.has(folderOf(key)));
  await deleteTestObjects(leftovers);
  await db.delete(uploads).where(eq(uploads.ownerId, racerId));
  await pool.end();
});

/**
 * The racer's objects in storage that nothing accounts for. The ledger's rule (photos/uploads-ledger.ts): an
 * object is accounted for when a photo row names it, when a ledger entry names it, or when a
 * ledger entry names another object in its folder and no photo owns that folder (the sweep then
 * clears the whole folder).
 */
async function unaccounted(): Promise<string[]> {
  const rows = await db.select().from(photos).where(eq(photos.ownerId, racerId));
  const owned = new Set(rows.flatMap((row) => [row.originalKey, row.displayKey, row.thumbKey, row.analysisKey]));
  const ownedFolders = new Set(rows.map((row) => folderOf(row.originalKey)));
  const entries = (await db.select({ key: uploads.key }).from(uploads).where(eq(uploads.ownerId, racerId))).map((entry) => entry.key);
  const sweptFolders = new Set(entries.map(folderOf).filter((folder) => !ownedFolders.has(folder)));
  return (await keysUnder(`users/${racerId}/`)).filter((key) => !owned.has(key) && !entries.includes(key) && !sweptFolders.has(folderOf(key)));
}

const deleteCoupon = (id: number) => api(`/api/coupons/${id}`, { jar, method: 'DELETE' });

/** Status and body of a response, for messages that say what went wrong. */
const outcome = async (response: Response) => `${response.status} ${await response.text()}`;

/**
 * Resolves when the attach of this upload has written its derived files beside the original, that
 * is just before it writes the photo's rows (or when the attach has answered, whichever is first).
 */
async function derivedFilesWritten(folder: string, answered: () => boolean): Promise<void> {
  while (!answered() && (await keysUnder(folder)).length < 2) await pause(2);
}

describe('deleting a coupon while a photo is attached to it', () => {
  it('answers 201 or 404 to the attach, never a 500, and leaves no object unaccounted for (30 rounds)', { timeout: 180_000 }, async () => {
    const ROUNDS = 30;
    const AT_ONCE = 3;
    const attaches: string[] = [];
    const deletions: string[] = [];
    const couponIds: number[] = [];
    for (let first = 0; first < ROUNDS; first += AT_ONCE) {
      const batch = await Promise.all(
        Array.from({ length: AT_ONCE }, async () => {
          const coupon = await insertCoupon(db, racer, ['ti-grade-2'], 'private');
          const ticket = await presign(jar, 'coupon.jpg', 'image/jpeg', jpeg.length);
          folders.add(folderOf(ticket.key));
          await putToStorage(ticket, jpeg);
          couponIds.push(coupon.id);
          return { coupon, key: ticket.key };
        }),
      );
      await Promise.all(
        batch.map(async ({ coupon, key }, index) => {
          const round = first + index;
          let answered = false;
          const attached = attach(jar, coupon.id, { key }).finally(() => {
            answered = true;
          });
          // A third of the deletions come while the photo is decoded; the rest the moment its
          // derived files are in storage, 0–24 ms on: while its rows are written, or just after.
          const deleted = (round % 3 === 0 ? Promise.resolve() : derivedFilesWritten(folderOf(key), () => answered).then(() => pause((round * 7) % 25))).then(
            () => deleteCoupon(coupon.id),
          );
          attaches.push(await outcome(await attached));
          deletions.push(await outcome(await deleted));
        }),
      );
    }

    expect.soft(attaches.filter((answer) => !/^(201|404) /.test(answer))).toEqual([]);
    expect.soft(deletions.filter((answer) => !answer.startsWith('204 '))).toEqual([]);
    expect.soft(await db.select({ id: coupons.id }).from(coupons).where(inArray(coupons.id, couponIds))).toEqual([]);
    expect(await unaccounted()).toEqual([]);
  });
});

describe('deleting a coupon while its photo is measured again or deleted', () => {
  const regionsOf = (target: TestCoupon, swapped: boolean): RegionInput[] =>
    scene.layers.map((layer, index) => ({ kind: 'layer', layerId: target.layerIds[swapped ? 1 - index : index], ...layer.region }));

  it('answers each request with a 2xx or 404, never a 500, and leaves no object unaccounted for (12 rounds)', { timeout: 180_000 }, async () => {
    const ROUNDS = 12;
    const answers: string[] = [];
    for (let round = 0; round < ROUNDS; round += 1) {
      const target = await insertCoupon(db, racer, ['ti-grade-2', 'ti-grade-5'], 'private');
      const photo = await storedPhoto(jar, target.id, jpeg, { regions: regionsOf(target, false) });
      const [row] = await db.select({ key: photos.originalKey }).from(photos).where(eq(photos.id, photo.id));
      folders.add(folderOf(row.key));
      // The three requests in a different order each round: 0–11 ms apart.
      const [edited, removed, deleted] = await Promise.all([
        pause(round % 3).then(() => api(`/api/photos/${photo.id}/regions`, { jar, method: 'PUT', json: { regions: regionsOf(target, true) } })),
        pause((round * 5) % 12).then(() => api(`/api/photos/${photo.id}`, { jar, method: 'DELETE' })),
        pause((round * 7) % 12).then(() => deleteCoupon(target.id)),
      ]);
      const editAnswer = await outcome(edited);
      answers.push(`edit ${editAnswer}`, `photo deletion ${await outcome(removed)}`, `coupon deletion ${await outcome(deleted)}`);
      if (edited.status === 200) expect.soft(JSON.parse(editAnswer.slice(4))).toMatchObject({ id: photo.id });
    }
    const wrong = answers.filter((answer) => !/^(edit (200|404)|photo deletion (204|404)|coupon deletion 204) /.test(answer));
    expect.soft(wrong).toEqual([]);
    expect(await unaccounted()).toEqual([]);
  });
});
