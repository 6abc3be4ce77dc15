import { asc, eq, inArray } from 'drizzle-orm';
import { alloys, couponLayers, coupons, photos, swatches, uploads, users } from '../../../db/schema';
import { db } from './db';
import { alloysOfOwner, bumpLibraryVersions } from './library-versions';
import { userPrefix } from './photos/keys';
import { deleteObjects, listKeys, presignDownload } from './storage';
import { findUserById } from './users';

/** Everything we hold about one person, as one JSON document ("download my data"). */
export async function exportAccount(userId: string) {
  const user = await findUserById(userId);
  if (!user) return undefined;
  const ownCoupons = await db().select().from(coupons).where(eq(coupons.ownerId, userId)).orderBy(asc(coupons.id));
  const couponIds = ownCoupons.map((coupon) => coupon.id);
  const layers = couponIds.length
    ? await db()
        .select({ couponId: couponLayers.couponId, position: couponLayers.position, alloy: alloys.slug })
        .from(couponLayers)
        .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
        .where(inArray(couponLayers.couponId, couponIds))
        .orderBy(asc(couponLayers.couponId), asc(couponLayers.position))
    : [];
  const ownPhotos = await db().select().from(photos).where(eq(photos.ownerId, userId)).orderBy(asc(photos.id));
  const ownSwatches = couponIds.length ? await db().select().from(swatches).where(inArray(swatches.couponId, couponIds)).orderBy(asc(swatches.id)) : [];

  return {
    exportedAt: new Date().toISOString(),
    account: { id: user.id, name: user.name, email: user.email, role: user.role, emailVerified: user.emailVerified, createdAt: user.createdAt },
    coupons: ownCoupons.map(({ ownerId: _owner, ...coupon }) => ({
      ...coupon,
      layers: layers.filter((layer) => layer.couponId === coupon.id).map(({ position, alloy }) => ({ position, alloy })),
    })),
    photos: await Promise.all(
      ownPhotos.map(async ({ ownerId: _owner, ...photo }) => ({
        ...photo,
        originalUrl: await presignDownload(photo.originalKey, photo.contentType, 24 * 3600),
      })),
    ),
    swatches: ownSwatches,
  };
}

/**
 * Deletes an account and with it coupons, photos, swatches and memberships (the database
 * cascades; the library versions of their alloys go up), then the person's objects in storage. Published colour sheets stay, without the
 * person's swatches.
 */
export async function deleteAccount(userId: string): Promise<void> {
  const photoKeys = await db()
    .select({ originalKey: photos.originalKey, displayKey: photos.displayKey, thumbKey: photos.thumbKey })
    .from(photos)
    .where(eq(photos.ownerId, userId));
  const uploadKeys = await db().select({ key: uploads.key }).from(uploads).where(eq(uploads.ownerId, userId));
  await db().transaction(async (tx) => {
    const alloysHeld = await alloysOfOwner(tx, userId);
    await tx.delete(users).where(eq(users.id, userId));
    await bumpLibraryVersions(tx, alloysHeld);
  });
  const keys = new Set([
    ...photoKeys.flatMap((photo) => [photo.originalKey, photo.displayKey, photo.thumbKey]),
    ...uploadKeys.map((upload) => upload.key),
    ...(await listKeys(userPrefix(userId))),
  ]);
  await deleteObjects([...keys]);
}
