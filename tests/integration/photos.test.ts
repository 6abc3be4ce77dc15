// Stored photos through HTTP: swatches per layer from drawn regions, who may see and change them,
// region edits measuring again, deletion removing the files, HEIC from a phone, and GPS positions
// never stored or served.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import exifr from 'exifr';
import { converter, differenceCiede2000 } from 'culori';
import { alloys, couponLayers, photos, regions, swatches, uploads } from '../../db/schema';
import type { PhotoView, RegionInput, SwatchView } from '~/lib/photos';
import { db as appDb } from '~/lib/server/db';
import { analysePhoto } from '~/lib/server/photos/measure';
import { getObject, objectSize, s3 } from '~/lib/server/storage';
import { STALE_AFTER_MINUTES } from '~/lib/server/photos/uploads-ledger';
import { api, newJar, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { deleteTestCoupons, insertCoupon, storedPhoto, uploadPhoto, urlExpiry, type TestCoupon } from '../support/photos';
import { couponScene, encodeJpeg, encodePng, illuminantACast, renderScene, TINTS } from '../fixtures/synthetic-photos';

// ΔE00 per Sharma, Wu & Dalal (2005) on CIELAB D65 per CIE 15 (checked in tests/unit/colour/delta-e.test.ts and conversions.test.ts).
const ciede2000 = differenceCiede2000();
const toLab65 = converter('lab65');
const deltaE = (swatch: SwatchView, hex: string) => ciede2000(toLab65(hex)!, { mode: 'lab65', ...swatch.lab });

const { db, pool } = testDatabase();
const jars = {} as Record<'member' | 'member2' | 'admin', Jar>;
const created: number[] = [];
let workDir: string;

/** A 1200×800 two-layer coupon (straw over purple) beside a grey card, under illuminant A, with noise. */
const warm = couponScene(1200, 800, [TINTS.straw, TINTS.purple], { cast: illuminantACast(), noise: { sigma: 5, seed: 41 } });
let warmJpeg: Buffer;

async function coupon(owner: keyof typeof demo, visibility: 'private' | 'members' | 'public', layers = ['ti-grade-2', 'ti-grade-5']): Promise<TestCoupon> {
  const made = await insertCoupon(db, demo[owner], layers, visibility);
  created.push(made.id);
  return made;
}

const layerRegions = (target: TestCoupon, withGrey = true): RegionInput[] => [
  { kind: 'layer', layerId: target.layerIds[0], ...warm.layers[0].region },
  { kind: 'layer', layerId: target.layerIds[1], ...warm.layers[1].region },
  ...(withGrey ? [{ kind: 'grey' as const, ...warm.grey }] : []),
];

const groupOf = (photo: PhotoView, layerId: number) => photo.groups.find((group) => group.layerId === layerId)!;

beforeAll(async () => {
  workDir = mkdtempSync(path.join(tmpdir(), 'oxbloom-photos-'));
  jars.member = await signedIn(demo.member);
  jars.member2 = await signedIn(demo.member2);
  jars.admin = await signedIn(demo.admin);
  warmJpeg = await encodeJpeg(renderScene(warm.scene));
});

afterAll(async () => {
  await deleteTestCoupons(db, created);
  rmSync(workDir, { recursive: true, force: true });
  await pool.end();
  await appDb().$client.end();
  s3().destroy();
});

describe('swatches per layer from drawn regions', () => {
  // Source: the known layer colours of the synthetic scene; the warm cast is CIE illuminant A's
  // white point relative to D65 (CIE 15:2004 Table T.3), removed through the grey card.
  it('gives each layer its known colour within ΔE00 2, white-balanced by the grey card', async () => {
    const target = await coupon('member', 'private');
    const photo = await storedPhoto(jars.member, target.id, warmJpeg, { regions: layerRegions(target) });
    expect(photo.whiteBalanced).toBe(true);
    expect(photo.regions.map((region) => [region.kind, region.layerId])).toEqual([
      ['layer', target.layerIds[0]],
      ['layer', target.layerIds[1]],
      ['grey', null],
    ]);
    expect(photo.groups.map((group) => group.layerId)).toEqual(target.layerIds);
    target.layerIds.forEach((layerId, index) => {
      const group = groupOf(photo, layerId);
      expect(deltaE(group.swatches[0], warm.layers[index].colour)).toBeLessThan(2);
      expect(deltaE(group.mean!, warm.layers[index].colour)).toBeLessThan(2);
      expect(group.swatches[0].hex).toMatch(/^#[0-9a-f]{6}$/);
      expect(group.swatches.reduce((sum, swatch) => sum + swatch.share, 0)).toBeCloseTo(1, 2);
      expect(group.swatches.length).toBeLessThanOrEqual(5);
    });
    // Stored per photo and layer, with the layer's alloy copied for colour search.
    const rows = await db
      .select({ layerId: swatches.layerId, alloy: alloys.slug, isMean: swatches.isMean, rank: swatches.rank })
      .from(swatches)
      .innerJoin(alloys, eq(alloys.id, swatches.alloyId))
      .where(eq(swatches.photoId, photo.id));
    expect(rows.filter((row) => row.layerId === target.layerIds[0]).every((row) => row.alloy === 'ti-grade-2')).toBe(true);
    expect(rows.filter((row) => row.isMean).map((row) => row.rank)).toEqual([0, 0]);
  });

  it('gives the same numbers as the command line (npm run analyze) on the same file', async () => {
    const target = await coupon('member', 'private');
    const photo = await storedPhoto(jars.member, target.id, warmJpeg, { regions: layerRegions(target) });
    const cli = await analysePhoto(warmJpeg, { regions: warm.layers.map((layer) => layer.region), grey: warm.grey });
    cli.regions.forEach((region, index) => {
      const group = groupOf(photo, target.layerIds[index]);
      expect(group.swatches.map(({ hex, lab, share }) => ({ hex, lab, share }))).toEqual(region.swatches.map(({ hex, lab, share }) => ({ hex, lab, share })));
    });
  });

  it('without the grey card, the warm cast stays in the colours', async () => {
    const target = await coupon('member', 'private');
    const photo = await storedPhoto(jars.member, target.id, warmJpeg, { regions: layerRegions(target, false) });
    expect(photo.whiteBalanced).toBe(false);
    expect(deltaE(groupOf(photo, target.layerIds[0]).swatches[0], warm.layers[0].colour)).toBeGreaterThan(4);
  });

  it.each([
    [
      'a layer of another coupon',
      (target: TestCoupon) => [{ kind: 'layer', layerId: target.layerIds[0] + 100_000, x: 0, y: 0, width: 10, height: 10 }],
      'regions.0.layerId: that layer is not part of this coupon.',
    ],
    [
      'the same layer twice',
      (target: TestCoupon) => [
        { kind: 'layer', layerId: target.layerIds[0], x: 0, y: 0, width: 10, height: 10 },
        { kind: 'layer', layerId: target.layerIds[0], x: 20, y: 0, width: 10, height: 10 },
      ],
      'regions.1.layerId: Mark each layer once.',
    ],
    [
      'two grey cards',
      () => [
        { kind: 'grey', x: 0, y: 0, width: 10, height: 10 },
        { kind: 'grey', x: 20, y: 0, width: 10, height: 10 },
      ],
      'regions.1.kind: Mark at most one grey card.',
    ],
    [
      'a rectangle reaching outside the photo',
      (target: TestCoupon) => [{ kind: 'layer', layerId: target.layerIds[0], x: 1100, y: 0, width: 200, height: 10 }],
      'regions.0: The rectangle reaches outside the photo (1200 × 800 pixels).',
    ],
    [
      'a negative corner',
      (target: TestCoupon) => [{ kind: 'layer', layerId: target.layerIds[0], x: -1, y: 0, width: 20, height: 10 }],
      'regions.0.x: x cannot be negative.',
    ],
    ['an unknown kind', () => [{ kind: 'glare', x: 0, y: 0, width: 10, height: 10 }], "regions.0.kind: A region's kind is 'layer' or 'grey'."],
  ])('refuses regions with %s when attaching (400), keeping the upload for a retry', async (_label, make, message) => {
    const target = await coupon('member', 'private');
    const { ticket, response } = await uploadPhoto(jars.member, target.id, warmJpeg, { regions: make(target) as RegionInput[] });
    expect(response.status).toBe(400);
    expect((await response.json()).error).toBe(message);
    expect(await db.select().from(photos).where(eq(photos.couponId, target.id))).toHaveLength(0);
    expect(await objectSize(ticket.key)).toBe(warmJpeg.length);
  });

  it('refuses a grey card with no usable pixels (422)', async () => {
    const target = await coupon('member', 'private');
    // A corner of a black background: every pixel is too dark to judge a colour cast by.
    const dark = await encodeJpeg(renderScene(couponScene(600, 400, [TINTS.straw, TINTS.purple], { background: '#000000' }).scene));
    const { response } = await uploadPhoto(jars.member, target.id, dark, { regions: [{ kind: 'grey', x: 0, y: 0, width: 20, height: 20 }] });
    expect(response.status).toBe(422);
    expect((await response.json()).error).toBe('The grey card region has no usable pixels (all too dark, too bright or one channel empty).');
  });
});

describe('editing regions measures the photo again', () => {
  it('replaces regions and swatches; swapping the rectangles swaps the layers’ colours', async () => {
    const target = await coupon('member', 'private');
    const photo = await storedPhoto(jars.member, target.id, warmJpeg);
    expect(photo.groups.map((group) => group.layerId)).toEqual([null]);

    const [first, second] = layerRegions(target, true);
    const swapped: RegionInput[] = [
      { ...first, ...warm.layers[1].region },
      { ...second, ...warm.layers[0].region },
      { kind: 'grey', ...warm.grey },
    ];
    const response = await api(`/api/photos/${photo.id}/regions`, { jar: jars.member, method: 'PUT', json: { regions: swapped } });
    expect(response.status).toBe(200);
    const edited: PhotoView = await response.json();
    expect(deltaE(groupOf(edited, target.layerIds[0]).swatches[0], warm.layers[1].colour)).toBeLessThan(2);
    expect(deltaE(groupOf(edited, target.layerIds[1]).swatches[0], warm.layers[0].colour)).toBeLessThan(2);
    expect(edited.groups.some((group) => group.layerId === null)).toBe(false);
    expect(await db.select().from(regions).where(eq(regions.photoId, photo.id))).toHaveLength(3);

    // From the stored analysis copy: the same numbers a fresh upload with these regions gives.
    const fresh = await storedPhoto(jars.member, target.id, warmJpeg, { regions: swapped });
    expect(edited.groups.map((group) => group.swatches)).toEqual(fresh.groups.map((group) => group.swatches));

    // Clearing the regions goes back to the whole photo.
    const cleared: PhotoView = await (await api(`/api/photos/${photo.id}/regions`, { jar: jars.member, method: 'PUT', json: { regions: [] } })).json();
    expect(cleared.regions).toEqual([]);
    expect(cleared.groups.map((group) => group.layerId)).toEqual([null]);
  });

  it('keeps a grey card’s reflectance and sets the exposure from it; refuses one out of range', async () => {
    const target = await coupon('member', 'private');
    const photo = await storedPhoto(jars.member, target.id, warmJpeg);
    const [first] = layerRegions(target, true);
    const marked = (reflectance?: unknown) => [
      { ...first, ...warm.layers[0].region },
      { kind: 'grey', ...warm.grey, ...(reflectance === undefined ? {} : { reflectance }) },
    ];
    const standard: PhotoView = await (await api(`/api/photos/${photo.id}/regions`, { jar: jars.member, method: 'PUT', json: { regions: marked() } })).json();
    expect(standard.regions.find((region) => region.kind === 'grey')!.reflectance).toBeNull();
    const response = await api(`/api/photos/${photo.id}/regions`, { jar: jars.member, method: 'PUT', json: { regions: marked(36) } });
    expect(response.status).toBe(200);
    const brighter: PhotoView = await response.json();
    expect(brighter.regions.find((region) => region.kind === 'grey')!.reflectance).toBe(36);
    // Source: CIE 15 L* = 116·Y^(1/3) − 16 — a card said to reflect twice as much doubles the film's Y.
    const lightness = (view: PhotoView) => groupOf(view, target.layerIds[0]).swatches[0].lab.l;
    const y = (l: number) => ((l + 16) / 116) ** 3;
    expect(y(lightness(brighter)) / y(lightness(standard))).toBeCloseTo(2, 1);

    const refused = await api(`/api/photos/${photo.id}/regions`, { jar: jars.member, method: 'PUT', json: { regions: marked(120) } });
    expect(refused.status).toBe(400);
    expect((await refused.json()).field).toBe('regions.1.reflectance');
    expect(await db.select().from(regions).where(eq(regions.photoId, photo.id))).toHaveLength(2);
  });

  it('refuses bad regions with a 400 and keeps the saved ones', async () => {
    const target = await coupon('member', 'private');
    const photo = await storedPhoto(jars.member, target.id, warmJpeg, { regions: layerRegions(target) });
    const put = (json: unknown) => api(`/api/photos/${photo.id}/regions`, { jar: jars.member, method: 'PUT', json });
    for (const [body, message] of [
      [{}, 'regions: regions is a list of rectangles.'],
      [
        { regions: [{ kind: 'layer', layerId: target.layerIds[0], x: 0, y: 0, width: 5000, height: 10 }] },
        'regions.0: The rectangle reaches outside the photo (1200 × 800 pixels).',
      ],
      [{ regions: [{ kind: 'layer', layerId: target.layerIds[0], x: 0.5, y: 0, width: 10, height: 10 }] }, 'regions.0.x: x is a whole number of pixels.'],
    ] as const) {
      const response = await put(body);
      expect(response.status).toBe(400);
      expect((await response.json()).error).toBe(message);
    }
    const view: PhotoView = await (await api(`/api/photos/${photo.id}`, { jar: jars.member })).json();
    expect(view.regions).toHaveLength(3);
    expect(view.groups).toEqual(photo.groups);
  });
});

describe('who may see and change photos', () => {
  let privatePhoto: PhotoView;
  let membersPhoto: PhotoView;
  let publicPhoto: PhotoView;
  let membersCoupon: TestCoupon;

  beforeAll(async () => {
    const privateCoupon = await coupon('member', 'private');
    membersCoupon = await coupon('member', 'members');
    const publicCoupon = await coupon('member', 'public');
    privatePhoto = await storedPhoto(jars.member, privateCoupon.id, warmJpeg);
    membersPhoto = await storedPhoto(jars.member, membersCoupon.id, warmJpeg, { regions: layerRegions(membersCoupon) });
    publicPhoto = await storedPhoto(jars.member, publicCoupon.id, warmJpeg);
  });

  const status = async (jar: Jar, path: string, init: { method?: string; json?: unknown } = {}) => (await api(path, { jar, ...init })).status;

  it('lists and shows photos to whoever may see the coupon', async () => {
    const visitor = newJar();
    expect(await status(visitor, `/api/coupons/${publicPhoto.couponId}/photos`)).toBe(200);
    expect(await status(visitor, `/api/coupons/${membersPhoto.couponId}/photos`)).toBe(404);
    expect(await status(jars.member2, `/api/coupons/${membersPhoto.couponId}/photos`)).toBe(200);
    expect(await status(jars.member2, `/api/coupons/${privatePhoto.couponId}/photos`)).toBe(404);
    expect(await status(jars.admin, `/api/coupons/${privatePhoto.couponId}/photos`)).toBe(200);
    expect(await status(jars.member2, `/api/photos/${privatePhoto.id}`)).toBe(404);
    expect(await status(visitor, `/api/photos/${publicPhoto.id}`)).toBe(200);
    const listed = await (await api(`/api/coupons/${membersPhoto.couponId}/photos`, { jar: jars.member2 })).json();
    expect(listed.photos.map((photo: PhotoView) => photo.id)).toEqual([membersPhoto.id]);
    expect(listed.photos[0].groups).toEqual(membersPhoto.groups);
  });

  it('lets only the owner or an admin edit regions or delete', async () => {
    const regionsOf = (photo: PhotoView) => `/api/photos/${photo.id}/regions`;
    const body = { json: { regions: [] }, method: 'PUT' };
    expect(await status(newJar(), regionsOf(membersPhoto), body)).toBe(401);
    expect(await status(jars.member2, regionsOf(membersPhoto), body)).toBe(403);
    expect(await status(jars.member2, regionsOf(privatePhoto), body)).toBe(404);
    expect(await status(jars.member2, `/api/photos/${membersPhoto.id}`, { method: 'DELETE' })).toBe(403);
    expect(await status(jars.member2, `/api/photos/${privatePhoto.id}`, { method: 'DELETE' })).toBe(404);
    expect(await status(newJar(), `/api/photos/${publicPhoto.id}`, { method: 'DELETE' })).toBe(401);
    // None of that changed anything.
    const view: PhotoView = await (await api(`/api/photos/${membersPhoto.id}`, { jar: jars.member })).json();
    expect(view.regions).toHaveLength(3);
    expect(await status(jars.admin, regionsOf(membersPhoto), { method: 'PUT', json: { regions: layerRegions(membersCoupon, false) } })).toBe(200);
  });

  it('answers 404 for photos that do not exist', async () => {
    expect(await status(jars.member, '/api/photos/99999999')).toBe(404);
    expect(await status(jars.member, '/api/photos/nope')).toBe(404);
    expect(await status(jars.member, '/api/photos/99999999', { method: 'DELETE' })).toBe(404);
    expect(await status(jars.member, '/api/photos/99999999/regions', { method: 'PUT', json: { regions: [] } })).toBe(404);
  });

  // The same answer whether the id is no number or names no photo, so ids can't be probed.
  it.each(['abc', '0', '-1', '1.5', '99999999'])('answers “That photo was not found.” for photo id %s, to every photo route', async (id) => {
    const calls: [string, { method?: string; json?: unknown }][] = [
      [`/api/photos/${id}`, {}],
      [`/api/photos/${id}`, { method: 'DELETE' }],
      [`/api/photos/${id}/regions`, { method: 'PUT', json: { regions: [] } }],
    ];
    for (const [path, init] of calls) {
      const response = await api(path, { ...init, jar: jars.member });
      expect(response.status, `${init.method ?? 'GET'} ${path}`).toBe(404);
      expect(await response.json()).toEqual({ error: 'That photo was not found.' });
    }
  });
});

describe('deleting a photo', () => {
  const files = (row: typeof photos.$inferSelect) => [row.originalKey, row.displayKey, row.thumbKey, row.analysisKey!];

  it('removes its row, regions, swatches and every file; a stale ledger entry stays while its upload URL could be used', async () => {
    const target = await coupon('member', 'members');
    const { ticket, response: attached } = await uploadPhoto(jars.member, target.id, warmJpeg, { regions: layerRegions(target) });
    const photo: PhotoView = await attached.json();
    const [row] = await db.select().from(photos).where(eq(photos.id, photo.id));
    for (const key of files(row)) expect(await objectSize(key)).toBeGreaterThan(0);

    const response = await api(`/api/photos/${photo.id}`, { jar: jars.member, method: 'DELETE' });
    expect(response.status).toBe(204);
    for (const key of files(row)) expect(await objectSize(key)).toBeUndefined();
    expect(await db.select().from(photos).where(eq(photos.id, photo.id))).toHaveLength(0);
    expect(await db.select().from(regions).where(eq(regions.photoId, photo.id))).toHaveLength(0);
    expect(await db.select().from(swatches).where(eq(swatches.photoId, photo.id))).toHaveLength(0);
    // The upload URL still works for a few minutes: a file sent to it now would have no row, so a
    // stale entry stays for the sweep (it can't be attached again) until the URL has expired.
    expect(Date.now()).toBeLessThan(urlExpiry(ticket));
    const [entry] = await db.select().from(uploads).where(eq(uploads.key, row.originalKey));
    expect(entry.expiresAt.getTime()).toBeLessThan(Date.now() - STALE_AFTER_MINUTES * 60_000);
    expect((await api(`/api/photos/${photo.id}`, { jar: jars.member, method: 'DELETE' })).status).toBe(404);
  });

  it('keeps no ledger entry for a photo whose upload URL expired long ago', async () => {
    const target = await coupon('member', 'private');
    const photo = await storedPhoto(jars.member, target.id, warmJpeg);
    await db
      .update(photos)
      .set({ createdAt: new Date(Date.now() - 60 * 60_000) })
      .where(eq(photos.id, photo.id));
    const [row] = await db.select().from(photos).where(eq(photos.id, photo.id));
    expect((await api(`/api/photos/${photo.id}`, { jar: jars.member, method: 'DELETE' })).status).toBe(204);
    for (const key of files(row)) expect(await objectSize(key)).toBeUndefined();
    expect(await db.select().from(uploads).where(eq(uploads.key, row.originalKey))).toHaveLength(0);
  });

  it('goes with its layer’s regions when the coupon loses that layer', async () => {
    const target = await coupon('member', 'private');
    const photo = await storedPhoto(jars.member, target.id, warmJpeg, { regions: layerRegions(target) });
    await db.delete(couponLayers).where(eq(couponLayers.id, target.layerIds[1]));
    const view: PhotoView = await (await api(`/api/photos/${photo.id}`, { jar: jars.member })).json();
    expect(view.groups.map((group) => group.layerId)).toEqual([target.layerIds[0]]);
  });
});

describe('a GPS position is never stored or served', () => {
  const position = { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' };

  it.each([
    ['JPEG', 'image/jpeg', (image: sharp.Sharp) => image.jpeg({ quality: 92 })],
    ['PNG', 'image/png', (image: sharp.Sharp) => image.png()],
  ])('%s with a position: kept only as a copy without it', async (_label, contentType, encode) => {
    const pixels = renderScene(couponScene(600, 400, [TINTS.blue, TINTS.bronze]).scene);
    const raw = sharp(pixels.data, { raw: { width: 600, height: 400, channels: 3 } });
    const original = await encode(raw)
      .withExif({ IFD0: { Make: 'Oxbloom Test Camera', Model: 'Bench 1' }, IFD3: position })
      .toBuffer();
    expect((await exifr.gps(original))?.latitude).toBeCloseTo(51.5, 6); // the upload really carries a position

    const target = await coupon('member', 'private');
    const { ticket, response } = await uploadPhoto(jars.member, target.id, original, { contentType });
    expect(response.status).toBe(201);
    const photo: PhotoView = await response.json();
    const served = JSON.stringify(photo) + JSON.stringify(await (await api(`/api/coupons/${target.id}/photos`, { jar: jars.member })).json());
    expect(served).not.toMatch(/gps|latitude|longitude|51\.5/i);
    expect(photo.camera).toBe('Oxbloom Test Camera Bench 1');

    const [row] = await db.select().from(photos).where(eq(photos.id, photo.id));
    expect(JSON.stringify(row)).not.toMatch(/gps|latitude|longitude|51\.5/i);
    // The uploaded file with the position is gone; the original kept is a copy without any metadata.
    expect(await objectSize(ticket.key)).toBeUndefined();
    expect(row.originalKey).not.toBe(ticket.key);
    const kept = (await getObject(row.originalKey))!;
    expect(await exifr.gps(Buffer.from(kept)).catch(() => undefined)).toBeUndefined();
    expect((await sharp(kept).metadata()).exif).toBeUndefined();
    for (const url of [photo.displayUrl, photo.thumbUrl]) {
      const file = Buffer.from(await (await fetch(url)).arrayBuffer());
      const metadata = await sharp(file).metadata();
      expect(metadata.format).toBe('webp');
      expect(metadata.exif).toBeUndefined();
      expect(metadata.xmp).toBeUndefined();
    }
  });

  it('keeps an original without a position as it was uploaded', async () => {
    const target = await coupon('member', 'private');
    const { ticket, response } = await uploadPhoto(jars.member, target.id, warmJpeg);
    const [row] = await db
      .select()
      .from(photos)
      .where(eq(photos.id, (await response.json()).id));
    expect(row.originalKey).toBe(ticket.key);
    expect(Buffer.from((await getObject(row.originalKey))!).equals(warmJpeg)).toBe(true);
  });
});

const heifEncoder = spawnSync('heif-enc', ['--help']).error ? undefined : 'heif-enc';

describe('a HEIC photo from a phone', () => {
  // Source: the known layer colours; the file is real HEVC-coded HEIF made by libheif's heif-enc.
  it.skipIf(!heifEncoder)('goes the whole path and gives the known colours', async () => {
    const scene = couponScene(800, 600, [TINTS.lightBlue, TINTS.bronze], { noise: { sigma: 3, seed: 43 } });
    const pngPath = path.join(workDir, 'coupon.png');
    const heicPath = path.join(workDir, 'coupon.heic');
    writeFileSync(pngPath, await encodePng(renderScene(scene.scene)));
    execFileSync('heif-enc', ['-q', '90', '-o', heicPath, pngPath]);
    const heic = readFileSync(heicPath);
    const target = await coupon('member', 'private');
    const regionsDrawn: RegionInput[] = scene.layers.map((layer, index) => ({ kind: 'layer', layerId: target.layerIds[index], ...layer.region }));
    const photo = await storedPhoto(jars.member, target.id, heic, { contentType: 'image/heic', filename: 'IMG_0001.HEIC', regions: regionsDrawn });
    expect(photo).toMatchObject({ width: 800, height: 600, contentType: 'image/heic' });
    target.layerIds.forEach((layerId, index) => expect(deltaE(groupOf(photo, layerId).swatches[0], scene.layers[index].colour)).toBeLessThan(2));
    const display = await sharp(Buffer.from(await (await fetch(photo.displayUrl)).arrayBuffer())).metadata();
    expect(display).toMatchObject({ format: 'webp', width: 800, height: 600 });
  });
});
