// The upload path through HTTP against the built app, MariaDB and the S3 fake: presign, PUT the
// bytes straight to storage, attach; every bad input with its exact status and message; the
// ledger of uploads and its sweep.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { crc32 } from 'node:zlib';
import { eq, sql } from 'drizzle-orm';
import sharp from 'sharp';
import { photos, uploads } from '../../db/schema';
import { TOO_BIG, UNACCEPTED_TYPE } from '~/lib/photo-requests';
import { MAX_UPLOAD_BYTES, type UploadTicket } from '~/lib/photos';
import { db as appDb } from '~/lib/server/db';
import { objectSize, putObject, s3 } from '~/lib/server/storage';
import { STALE_AFTER_MINUTES, sweepIfDue, sweepStaleUploads } from '~/lib/server/photos/uploads-ledger';
import { api, newJar, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import {
  attach,
  deleteTestCoupons,
  insertCoupon,
  presign,
  putToStorage,
  requestUpload,
  storedPhoto,
  uploadPhoto,
  urlExpiry,
  userIdOf,
  type TestCoupon,
} from '../support/photos';
import { presignedSignature } from '../support/sigv4';
import { deleteTestObjects, keysUnder } from '../support/storage';
import { couponScene, encodeJpeg, encodePng, renderScene, TINTS } from '../fixtures/synthetic-photos';

const { db, pool } = testDatabase();
let member: Jar;
let member2: Jar;
let memberId: string;
let coupon: TestCoupon;
let jpeg: Buffer;

beforeAll(async () => {
  member = await signedIn(demo.member);
  member2 = await signedIn(demo.member2);
  memberId = await userIdOf(db, demo.member);
  coupon = await insertCoupon(db, demo.member, ['ti-grade-2', 'ti-grade-5'], 'private');
  jpeg = await encodeJpeg(renderScene(couponScene(600, 400, [TINTS.blue, TINTS.straw], { noise: { sigma: 4, seed: 7 } }).scene));
});

afterAll(async () => {
  await deleteTestCoupons(db, [coupon.id]);
  await pool.end();
  await appDb().$client.end();
  s3().destroy();
});

const photoCount = async () =>
  Number(
    (
      await db
        .select({ count: sql<number>`count(*)` })
        .from(photos)
        .where(eq(photos.couponId, coupon.id))
    )[0].count,
  );
const entry = async (key: string) => (await db.select().from(uploads).where(eq(uploads.key, key)))[0];

/**
 * A refused upload is over: it can no longer be attached (so it no longer counts as open), but
 * its entry stays for the sweep, in case a file is sent to its URL again.
 */
async function expectRetired(ticket: UploadTicket) {
  expect(await entry(ticket.key)).toBeDefined();
  const again = await attach(member, coupon.id, { key: ticket.key });
  expect(again.status).toBe(410);
}

describe('asking for an upload URL', () => {
  it('gives a presigned PUT under the caller’s own prefix, valid for 10 minutes, and records it', async () => {
    const before = Date.now();
    const ticket = await presign(member, 'coupon 12.jpg', 'image/jpeg', 123_456);
    expect(ticket.key).toMatch(new RegExp(`^users/${memberId}/photos/[0-9a-f-]{36}/original\\.jpg$`));
    expect(ticket.headers).toEqual({ 'content-type': 'image/jpeg' });
    expect(new URL(ticket.url).searchParams.get('X-Amz-Expires')).toBe('600');
    expect(Date.parse(ticket.expiresAt) - before).toBeGreaterThan(590_000);
    expect(Date.parse(ticket.expiresAt) - before).toBeLessThan(610_000);
    expect(await entry(ticket.key)).toMatchObject({ ownerId: memberId, contentType: 'image/jpeg', byteSize: 123_456 });
  });

  it.each([
    ['image/png', 'png'],
    ['image/webp', 'webp'],
    ['image/heic', 'heic'],
    ['image/heif', 'heif'],
    ['IMAGE/JPEG', 'jpg'],
  ])('accepts %s', async (contentType, extension) => {
    const ticket = await presign(member, `coupon.${extension}`, contentType, 1000);
    expect(ticket.key.endsWith(`/original.${extension}`)).toBe(true);
  });

  // Each refusal with its exact status and message (the limits are the issue's: four formats, 30 MB).
  it.each([
    ['a visitor', undefined, { filename: 'a.jpg', contentType: 'image/jpeg', size: 10 }, 401, 'Sign in first.'],
    ['a text file', 'member', { filename: 'notes.txt', contentType: 'text/plain', size: 10 }, 415, UNACCEPTED_TYPE],
    ['a GIF', 'member', { filename: 'a.gif', contentType: 'image/gif', size: 10 }, 415, UNACCEPTED_TYPE],
    ['an SVG', 'member', { filename: 'a.svg', contentType: 'image/svg+xml', size: 10 }, 415, UNACCEPTED_TYPE],
    ['a photo over 30 MB', 'member', { filename: 'big.jpg', contentType: 'image/jpeg', size: MAX_UPLOAD_BYTES + 1 }, 413, TOO_BIG],
    ['an empty file', 'member', { filename: 'empty.jpg', contentType: 'image/jpeg', size: 0 }, 400, 'size: The file is empty.'],
    ['no file name', 'member', { contentType: 'image/jpeg', size: 10 }, 400, 'filename: Give the file name.'],
    ['a size that is not a number', 'member', { filename: 'a.jpg', contentType: 'image/jpeg', size: 'big' }, 400, 'size: Give the size of the photo in bytes.'],
  ] as const)('refuses %s', async (_label, who, body, status, message) => {
    const response = await requestUpload(who ? member : undefined, body);
    expect(response.status).toBe(status);
    expect((await response.json()).error).toBe(message);
  });

  it('refuses a body that is not JSON, and a request from another site', async () => {
    const notJson = await api('/api/uploads', { jar: member, method: 'POST', body: 'filename=a.jpg', headers: { 'content-type': 'application/json' } });
    expect(notJson.status).toBe(400);
    expect((await notJson.json()).error).toBe('The request body must be JSON.');
    const crossSite = await api('/api/uploads', {
      jar: member,
      json: { filename: 'a.jpg', contentType: 'image/jpeg', size: 10 },
      headers: { origin: 'https://elsewhere.example' },
    });
    expect(crossSite.status).toBe(403);
  });
});

describe('the whole path: presign, PUT to storage, attach', () => {
  it('stores the photo with derived files and swatches, and ends the upload’s entry', async () => {
    const ticket = await presign(member, 'coupon.jpg', 'image/jpeg', jpeg.length);
    await putToStorage(ticket, jpeg);
    expect(await objectSize(ticket.key)).toBe(jpeg.length);
    const response = await attach(member, coupon.id, { key: ticket.key });
    expect(response.status).toBe(201);
    const photo = await response.json();
    expect(photo).toMatchObject({ couponId: coupon.id, width: 600, height: 400, contentType: 'image/jpeg', byteSize: jpeg.length, regions: [] });
    expect(response.headers.get('location')).toBe(`/api/photos/${photo.id}`);
    // No regions drawn: the whole photo is measured, and its swatches belong to no layer.
    expect(photo.groups).toHaveLength(1);
    expect(photo.groups[0]).toMatchObject({ regionId: null, layerId: null });
    expect(photo.groups[0].swatches.length).toBeGreaterThan(0);
    expect(await entry(ticket.key)).toBeUndefined();

    const [row] = await db.select().from(photos).where(eq(photos.id, photo.id));
    expect(row.originalKey).toBe(ticket.key);
    for (const key of [row.displayKey, row.thumbKey, row.analysisKey!]) expect(key.startsWith(ticket.key.replace('original.jpg', ''))).toBe(true);
    const display = await fetch(photo.displayUrl);
    expect(display.status).toBe(200);
    expect(display.headers.get('content-type')).toBe('image/webp');
    expect(await sharp(Buffer.from(await display.arrayBuffer())).metadata()).toMatchObject({ format: 'webp', width: 600, height: 400 });
    const thumb = await sharp(Buffer.from(await (await fetch(photo.thumbUrl)).arrayBuffer())).metadata();
    expect(Math.max(thumb.width!, thumb.height!)).toBeLessThanOrEqual(400);
  });

  it('attaches several photos at once (the uploader sends two at a time)', async () => {
    const before = await photoCount();
    const responses = await Promise.all([0, 1, 2, 3].map(() => uploadPhoto(member, coupon.id, jpeg)));
    expect(responses.map(({ response }) => response.status)).toEqual([201, 201, 201, 201]);
    expect(await photoCount()).toBe(before + 4);
  });

  it('refuses to attach the same upload twice', async () => {
    const { ticket, response } = await uploadPhoto(member, coupon.id, jpeg);
    expect(response.status).toBe(201);
    const again = await attach(member, coupon.id, { key: ticket.key });
    expect(again.status).toBe(404);
    expect((await again.json()).error).toBe('There is no upload with that key. Ask for an upload URL first, or the photo was attached already.');
  });
});

/** A PNG whose header claims 12000×10000 (120 MP): PNG (ISO/IEC 15948) IHDR width and height, then a CRC-32. */
async function overPixelLimit(): Promise<Buffer> {
  const png = Buffer.from(
    await sharp({ create: { width: 1, height: 1, channels: 3, background: '#000' } })
      .png()
      .toBuffer(),
  );
  png.writeUInt32BE(12_000, 16);
  png.writeUInt32BE(10_000, 20);
  png.writeUInt32BE(crc32(png.subarray(12, 29)), 29);
  return png;
}

describe('files that are not usable photos are refused at attach, and deleted', () => {
  const cases: [string, () => Promise<Uint8Array>, string, number, string][] = [
    [
      'a text file named .jpg',
      async () => Buffer.from('heat 1: 540 °C, 20 min, air\n'.repeat(20)),
      'image/jpeg',
      422,
      'The file is not an image. Upload a JPEG, PNG, WebP or HEIC photo.',
    ],
    [
      'a truncated JPEG',
      async () => jpeg.subarray(0, Math.floor(jpeg.length / 2)),
      'image/jpeg',
      422,
      'The image is cut short or damaged. Upload the original file again.',
    ],
    ['a zero-byte file', async () => new Uint8Array(0), 'image/jpeg', 422, 'The file is empty.'],
    ['an image over the pixel limit', overPixelLimit, 'image/png', 422, 'The image has more than 100 megapixels. Upload a smaller copy.'],
    [
      'a GIF declared as PNG',
      () =>
        sharp({ create: { width: 8, height: 8, channels: 3, background: '#000' } })
          .gif()
          .toBuffer(),
      'image/png',
      422,
      'This kind of image is not accepted. Upload a JPEG, PNG, WebP or HEIC photo.',
    ],
  ];
  it.each(cases)('%s', async (_label, make, contentType, status, message) => {
    const bytes = await make();
    const before = await photoCount();
    const ticket = await presign(member, 'photo.jpg', contentType, Math.max(1, bytes.length));
    await putToStorage(ticket, bytes);
    const response = await attach(member, coupon.id, { key: ticket.key });
    expect(response.status).toBe(status);
    expect(await response.json()).toEqual({ error: message, field: 'key' });
    expect(await photoCount()).toBe(before);
    expect(await objectSize(ticket.key)).toBeUndefined();
    await expectRetired(ticket);
  });

  it('a file larger than 30 MB, whatever size was declared', async () => {
    const ticket = await presign(member, 'photo.jpg', 'image/jpeg', 1000);
    await putToStorage(ticket, new Uint8Array(MAX_UPLOAD_BYTES + 1));
    const response = await attach(member, coupon.id, { key: ticket.key });
    expect(response.status).toBe(413);
    expect((await response.json()).error).toBe(TOO_BIG);
    expect(await objectSize(ticket.key)).toBeUndefined();
    await expectRetired(ticket);
  });
});

describe('keys that are not the caller’s usable upload', () => {
  it('someone else’s upload: refused, and their file is left alone', async () => {
    const theirs = await presign(member2, 'theirs.jpg', 'image/jpeg', jpeg.length);
    await putToStorage(theirs, jpeg);
    const response = await attach(member, coupon.id, { key: theirs.key });
    expect(response.status).toBe(403);
    expect(await response.json()).toEqual({ error: 'That upload belongs to someone else.', field: 'key' });
    expect(await objectSize(theirs.key)).toBe(jpeg.length);
    expect(await entry(theirs.key)).toBeDefined();
  });

  it('a key that was never given out', async () => {
    const response = await attach(member, coupon.id, { key: `users/${memberId}/photos/00000000-0000-4000-8000-000000000000/original.jpg` });
    expect(response.status).toBe(404);
    expect((await response.json()).error).toBe('There is no upload with that key. Ask for an upload URL first, or the photo was attached already.');
  });

  it('a key given out but never uploaded to (the entry stays for a retry)', async () => {
    const ticket = await presign(member, 'later.jpg', 'image/jpeg', jpeg.length);
    const response = await attach(member, coupon.id, { key: ticket.key });
    expect(response.status).toBe(409);
    expect((await response.json()).error).toBe('The photo has not arrived in storage. Upload it to the URL you were given, then attach it.');
    await putToStorage(ticket, jpeg);
    expect((await attach(member, coupon.id, { key: ticket.key })).status).toBe(201);
  });

  it('an upload gone stale', async () => {
    const ticket = await presign(member, 'old.jpg', 'image/jpeg', jpeg.length);
    await putToStorage(ticket, jpeg);
    await db
      .update(uploads)
      .set({ expiresAt: new Date(Date.now() - (STALE_AFTER_MINUTES + 5) * 60_000) })
      .where(eq(uploads.key, ticket.key));
    const response = await attach(member, coupon.id, { key: ticket.key });
    expect(response.status).toBe(410);
    expect((await response.json()).error).toBe('That upload has expired. Upload the photo again.');
  });

  it('a key with a path trick', async () => {
    const response = await attach(member, coupon.id, { key: `users/${memberId}/../other/photos/x/original.jpg` });
    expect(response.status).toBe(403);
  });

  it('a missing or malformed key', async () => {
    for (const body of [{}, { key: '' }, { key: 5 }]) {
      const response = await attach(member, coupon.id, body);
      expect(response.status).toBe(400);
      expect((await response.json()).field).toBe('key');
    }
  });
});

describe('coupons that are not the caller’s', () => {
  it('another member’s private coupon is not found; a members-only one is refused; a visitor must sign in', async () => {
    const privateOne = await insertCoupon(db, demo.member2, ['steel-1084'], 'private');
    const membersOne = await insertCoupon(db, demo.member2, ['steel-1084'], 'members');
    try {
      const ticket = await presign(member, 'mine.jpg', 'image/jpeg', jpeg.length);
      await putToStorage(ticket, jpeg);
      const hidden = await attach(member, privateOne.id, { key: ticket.key });
      expect(hidden.status).toBe(404);
      expect((await hidden.json()).error).toBe('That coupon was not found.');
      const seen = await attach(member, membersOne.id, { key: ticket.key });
      expect(seen.status).toBe(403);
      expect((await seen.json()).error).toBe('You may not do that.');
      expect((await attach(newJar(), membersOne.id, { key: ticket.key })).status).toBe(401);
      expect((await attach(member, 99_999_999, { key: ticket.key })).status).toBe(404);
      expect((await attach(member, 'twelve' as unknown as number, { key: ticket.key })).status).toBe(404);
      // None of those touched the upload: it still attaches to the member's own coupon.
      expect((await attach(member, coupon.id, { key: ticket.key })).status).toBe(201);
    } finally {
      await deleteTestCoupons(db, [privateOne.id, membersOne.id]);
    }
  });
});

describe('the sweep of stale uploads', () => {
  /** An entry whose URL expired `minutes` ago, and so was issued 10 minutes before that. */
  const age = (key: string, minutes: number) =>
    db
      .update(uploads)
      .set({ expiresAt: new Date(Date.now() - minutes * 60_000), createdAt: new Date(Date.now() - (minutes + 10) * 60_000) })
      .where(eq(uploads.key, key));

  it('deletes the files of uploads never attached once stale, and leaves fresh ones and attached photos alone', async () => {
    const stale = await presign(member, 'stale.jpg', 'image/jpeg', jpeg.length);
    await putToStorage(stale, jpeg);
    // What a crash half-way through an attach leaves: a derived file beside the original.
    const leftover = stale.key.replace('original.jpg', 'abcd1234-display.webp');
    await putObject(leftover, new Uint8Array([1, 2, 3]), 'image/webp');
    const fresh = await presign(member, 'fresh.jpg', 'image/jpeg', jpeg.length);
    await putToStorage(fresh, jpeg);
    const photo = await storedPhoto(member, coupon.id, jpeg);
    const [row] = await db.select().from(photos).where(eq(photos.id, photo.id));

    await age(stale.key, STALE_AFTER_MINUTES + 1);
    const result = await sweepStaleUploads();
    expect(result.entries).toBeGreaterThanOrEqual(1);
    expect(await objectSize(stale.key)).toBeUndefined();
    expect(await objectSize(leftover)).toBeUndefined();
    expect(await entry(stale.key)).toBeUndefined();
    expect(await objectSize(fresh.key)).toBe(jpeg.length);
    expect(await entry(fresh.key)).toBeDefined();
    for (const key of [row.originalKey, row.displayKey, row.thumbKey]) expect(await objectSize(key)).toBeGreaterThan(0);
  });

  it('keeps an expired upload until it is stale, so a slow upload can still be attached', async () => {
    const slow = await presign(member, 'slow.jpg', 'image/jpeg', jpeg.length);
    await putToStorage(slow, jpeg);
    await age(slow.key, STALE_AFTER_MINUTES - 5);
    await sweepStaleUploads();
    expect(await objectSize(slow.key)).toBe(jpeg.length);
    expect((await attach(member, coupon.id, { key: slow.key })).status).toBe(201);
  });

  it('sweeps a file sent again to the URL of a refused upload, and keeps the entry until that URL has expired', async () => {
    const ticket = await presign(member, 'coupon.jpg', 'image/jpeg', 100);
    await putToStorage(ticket, new Uint8Array(100));
    expect((await attach(member, coupon.id, { key: ticket.key })).status).toBe(422);
    expect(await objectSize(ticket.key)).toBeUndefined();
    // The URL still works (and S3 would take the same size and type again).
    await putToStorage(ticket, new Uint8Array(100));
    await sweepStaleUploads();
    expect(await objectSize(ticket.key)).toBeUndefined();
    expect(await entry(ticket.key)).toBeDefined();
    // Once the URL has expired nothing more can arrive: the entry goes.
    await db
      .update(uploads)
      .set({ createdAt: new Date(urlExpiry(ticket) - 3 * 60 * 60_000) })
      .where(eq(uploads.key, ticket.key));
    await sweepStaleUploads();
    expect(await entry(ticket.key)).toBeUndefined();
  });

  it('runs in one process per period however many try at once', async () => {
    await db.execute(sql`update app_settings set value = '1970-01-01T00:00:00.000Z' where setting_key = 'uploads-swept-at'`);
    const runs = await Promise.all([sweepIfDue(), sweepIfDue(), sweepIfDue()]);
    expect(runs.filter((run) => run !== null)).toHaveLength(1);
    expect(await sweepIfDue()).toBeNull();
  });
});

/** PUTs bytes to a presigned URL with these headers instead of the ticket's (the S3 fake checks no signature). */
async function putAnyway(ticket: UploadTicket, bytes: Uint8Array, headers: Record<string, string>) {
  const response = await fetch(ticket.url, { method: 'PUT', headers, body: new Uint8Array(bytes) });
  expect(response.status).toBe(200);
}

describe('an upload URL binds the declared type and size', () => {
  // The S3 fake (s3rver) accepts any PUT to a presigned URL without checking its signature; real
  // S3 refuses a request whose signed headers differ. So these tests check what the app signs,
  // and that attaching refuses and removes whatever does not match what was declared.
  const secret = process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER';

  it('signs content-type and content-length as declared, and the signature holds for nothing else', async () => {
    const ticket = await presign(member, 'coupon.jpg', 'IMAGE/JPEG', 123_457);
    const url = new URL(ticket.url);
    expect(url.searchParams.get('X-Amz-SignedHeaders')).toBe('content-length;content-type;host');
    // The client sends exactly these headers; Content-Length is the file's own (browsers set it).
    expect(ticket.headers).toEqual({ 'content-type': 'image/jpeg' });
    const declared = { host: url.host, 'content-type': 'image/jpeg', 'content-length': '123457' };
    expect(presignedSignature('PUT', url, declared, secret)).toBe(url.searchParams.get('X-Amz-Signature'));
    for (const other of [{ 'content-type': 'text/html' }, { 'content-length': String(5 * 123_457) }, { 'content-length': '123456' }]) {
      expect(presignedSignature('PUT', url, { ...declared, ...other }, secret)).not.toBe(url.searchParams.get('X-Amz-Signature'));
    }
  });

  it('refuses at attach a file five times the declared size, and removes it', async () => {
    const before = await photoCount();
    const ticket = await presign(member, 'coupon.jpg', 'image/jpeg', jpeg.length);
    // Still a JPEG a decoder reads: the first copy, with more bytes after it.
    const fiveTimes = Buffer.concat([jpeg, jpeg, jpeg, jpeg, jpeg]);
    await putAnyway(ticket, fiveTimes, ticket.headers);
    const response = await attach(member, coupon.id, { key: ticket.key });
    expect(response.status).toBe(422);
    expect(await response.json()).toEqual({
      error: `The file in storage has ${fiveTimes.length} bytes, not the ${jpeg.length} bytes declared. Upload the photo again.`,
      field: 'key',
    });
    expect(await photoCount()).toBe(before);
    expect(await objectSize(ticket.key)).toBeUndefined();
    await expectRetired(ticket);
  });

  it('refuses at attach a file stored as text/html, and removes it', async () => {
    const before = await photoCount();
    const ticket = await presign(member, 'coupon.jpg', 'image/jpeg', jpeg.length);
    await putAnyway(ticket, jpeg, { 'content-type': 'text/html' });
    const response = await attach(member, coupon.id, { key: ticket.key });
    expect(response.status).toBe(422);
    expect(await response.json()).toEqual({ error: 'The file was stored as text/html, not as the image/jpeg declared. Upload the photo again.', field: 'key' });
    expect(await photoCount()).toBe(before);
    expect(await objectSize(ticket.key)).toBeUndefined();
    await expectRetired(ticket);
  });

  it('refuses at attach a PNG declared as a JPEG (the decoder, not the browser, says what it is), and removes it', async () => {
    const before = await photoCount();
    const png = await encodePng(renderScene(couponScene(300, 200, [TINTS.blue, TINTS.straw]).scene));
    const ticket = await presign(member, 'coupon.jpg', 'image/jpeg', png.length);
    await putToStorage(ticket, png);
    const response = await attach(member, coupon.id, { key: ticket.key });
    expect(response.status).toBe(422);
    expect(await response.json()).toEqual({
      error: 'This file is a PNG image, but it was declared as JPEG. Give it the right file name (.png) and upload it again.',
      field: 'key',
    });
    expect(await photoCount()).toBe(before);
    expect(await objectSize(ticket.key)).toBeUndefined();
    await expectRetired(ticket);
  });

  it('serves an attached original as the photo’s decoded type, even when the stored object says text/html', async () => {
    const { ticket, response } = await uploadPhoto(member, coupon.id, jpeg);
    expect(response.status).toBe(201);
    const { id } = await response.json();
    // The URL is still valid after attaching: the file is sent again with another type (S3 would refuse it; the fake does not).
    await putAnyway(ticket, jpeg, { 'content-type': 'text/html' });
    const exported = await (await api('/api/account/export', { jar: member })).json();
    const photo = exported.photos.find((candidate: { id: number }) => candidate.id === id);
    const served = await fetch(photo.originalUrl);
    expect(served.status).toBe(200);
    expect(served.headers.get('content-type')).toBe('image/jpeg');
    expect(served.headers.get('content-disposition')).toMatch(/^attachment/);
  });
});

describe('open uploads per person', () => {
  // The limit: at most 20 uploads a person has asked for and not attached, while they are still
  // attachable (until 30 minutes after their URL expired). A demo member no other file uploads as.
  const LIMIT = 20;
  const uploader = 'jory@oxbloom.test';
  let jar: Jar;
  let uploaderId: string;
  const given: string[] = [];
  const openEntries = async () =>
    (await db.select().from(uploads).where(eq(uploads.ownerId, uploaderId))).filter(
      (row) => row.expiresAt.getTime() > Date.now() - STALE_AFTER_MINUTES * 60_000,
    );
  async function ask(): Promise<Response> {
    const response = await requestUpload(jar, { filename: 'coupon.jpg', contentType: 'image/jpeg', size: jpeg.length });
    if (response.status === 201) given.push((await response.clone().json()).key);
    return response;
  }

  beforeAll(async () => {
    jar = await signedIn(uploader);
    uploaderId = await userIdOf(db, uploader);
  });

  afterAll(async () => {
    await db.delete(uploads).where(eq(uploads.ownerId, uploaderId));
    const folders = new Set(given.map((key) => key.slice(0, key.lastIndexOf('/') + 1)));
    await deleteTestObjects((await keysUnder(`users/${uploaderId}/photos/`)).filter((key) => folders.has(key.slice(0, key.lastIndexOf('/') + 1))));
  });

  it('refuses the 21st with a 429, Retry-After and a clear message; an attach or a stale entry frees a place', async () => {
    const tickets: UploadTicket[] = [];
    for (let index = 0; index < LIMIT; index += 1) {
      const response = await ask();
      expect(response.status).toBe(201);
      tickets.push(await response.json());
    }
    const refused = await ask();
    expect(refused.status).toBe(429);
    const retryAfter = Number(refused.headers.get('retry-after'));
    // The oldest open upload stops counting when it goes stale: its URL's 10 minutes plus 30.
    expect(retryAfter).toBeGreaterThan(38 * 60);
    expect(retryAfter).toBeLessThanOrEqual(40 * 60);
    expect(await refused.json()).toEqual({
      error: `You have ${LIMIT} uploads not yet added to a coupon. Add those photos, or try again in ${Math.ceil(retryAfter / 60)} minutes, when unfinished ones have expired.`,
    });
    expect(await openEntries()).toHaveLength(LIMIT);

    const own = await insertCoupon(db, uploader, ['steel-1084'], 'private');
    try {
      await putToStorage(tickets[0], jpeg);
      expect((await attach(jar, own.id, { key: tickets[0].key })).status).toBe(201);
      expect((await ask()).status).toBe(201);
      expect((await ask()).status).toBe(429);
      await db
        .update(uploads)
        .set({ expiresAt: new Date(Date.now() - (STALE_AFTER_MINUTES + 1) * 60_000) })
        .where(eq(uploads.key, tickets[1].key));
      expect((await ask()).status).toBe(201);
    } finally {
      await deleteTestCoupons(db, [own.id]);
    }
  });

  it('never lets more than 20 be open, however many are asked for at once', async () => {
    await db.delete(uploads).where(eq(uploads.ownerId, uploaderId));
    const answers = await Promise.all(Array.from({ length: 30 }, () => ask()));
    const statuses = answers.map((response) => response.status);
    expect(statuses.filter((status) => status !== 201 && status !== 429)).toEqual([]);
    expect(statuses.filter((status) => status === 201).length).toBeLessThanOrEqual(LIMIT);
    expect((await openEntries()).length).toBe(statuses.filter((status) => status === 201).length);
  });
});
