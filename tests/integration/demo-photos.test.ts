// The demo's synthetic photos (invented data): stored in S3 like uploads, measured with a region
// per layer and the grey card, spread so every demo member has photos in every visibility, and
// covering the test series so the library's alloy-pair views have something to show.
import { afterAll, describe, expect, it } from 'vitest';
import { and, asc, eq, inArray, lt, sql } from 'drizzle-orm';
import { appSettings, couponLayers, coupons, photos, regions, swatches, users } from '../../db/schema';
import { demoPeople } from '../../scripts/seed/people';
import { objectSize, s3 } from '~/lib/server/storage';
import { testDatabase } from '../support/database';

const { db, pool } = testDatabase();
afterAll(async () => {
  await pool.end();
  s3().destroy();
});

const owners = demoPeople.filter((person) => person.role !== 'admin').map((person) => person.email);

describe('the demo photos', () => {
  it('give every demo member photos on coupons of every visibility, at most 100 in all (the seed stays quick)', async () => {
    // Only the demo's coupons (dated before the seed's marker): other test files add photos meanwhile.
    const [marker] = await db.select().from(appSettings).where(eq(appSettings.key, 'demo-seeded'));
    const rows = await db
      .select({ email: users.email, visibility: coupons.visibility, photos: sql<number>`count(${photos.id})` })
      .from(photos)
      .innerJoin(coupons, eq(coupons.id, photos.couponId))
      .innerJoin(users, eq(users.id, coupons.ownerId))
      .where(and(inArray(users.email, owners), lt(coupons.createdAt, marker.createdAt)))
      .groupBy(users.email, coupons.visibility);
    for (const email of owners) {
      for (const visibility of ['private', 'members', 'public']) {
        expect(rows.find((row) => row.email === email && row.visibility === visibility)?.photos, `${email} ${visibility}`).toBeGreaterThan(0);
      }
    }
    const total = rows.reduce((sum, row) => sum + Number(row.photos), 0);
    expect(total).toBeLessThanOrEqual(100);
  });

  it('are stored like uploads and measured per layer with a grey card', async () => {
    const [marker] = await db.select().from(appSettings).where(eq(appSettings.key, 'demo-seeded'));
    const demoPhotos = (
      await db.select().from(photos).innerJoin(coupons, eq(coupons.id, photos.couponId)).where(lt(coupons.createdAt, marker.createdAt)).orderBy(asc(photos.id))
    ).map((row) => row.photos);
    expect(demoPhotos.length).toBeGreaterThan(0);
    // The first are the general demo's, the last the test series' (smaller photos, laminates among them).
    for (const photo of [...demoPhotos.slice(0, 4), ...demoPhotos.slice(-4)]) {
      for (const key of [photo.originalKey, photo.displayKey, photo.thumbKey, photo.analysisKey!]) expect(await objectSize(key), key).toBeGreaterThan(0);
      const layers = await db.select({ id: couponLayers.id }).from(couponLayers).where(eq(couponLayers.couponId, photo.couponId));
      const drawn = await db.select().from(regions).where(eq(regions.photoId, photo.id));
      expect(
        drawn
          .filter((region) => region.kind === 'layer')
          .map((region) => region.layerId)
          .sort(),
      ).toEqual(layers.map((layer) => layer.id).sort());
      expect(drawn.filter((region) => region.kind === 'grey')).toHaveLength(1);
      const means = await db.select().from(swatches).where(eq(swatches.photoId, photo.id));
      for (const layer of layers) expect(means.some((swatch) => swatch.layerId === layer.id && swatch.isMean && swatch.alloyId !== null)).toBe(true);
    }
  });
});
