import { and, asc, count, desc, eq, inArray, sql } from 'drizzle-orm';
import { alloys, couponLayers, coupons, photos, swatches, users } from '../../../db/schema';
import { layerKeyOf } from '~/lib/alloys';
import type { APIContext } from 'astro';
import type { Coupon, Visibility } from '~/lib/coupons';
import { checkAccess, isResponse, requireCurrentUser } from './authorise';
import { db } from './db';
import { problem } from './http';
import { routeId } from './route-params';
import { mayChange, visibleCoupons, type Viewer } from './visibility';
import { forgetCouponPhotos, removePhotoFiles } from './photos/deletion';
import { findPhoto, lockCoupon, photoTransaction, type PhotoWithCoupon } from './photos/records';
import { alloysOfCoupons, bumpLibraryVersions, refreshCouponLightness } from './library-versions';

export interface CouponLayer {
  id: number;
  position: number;
  alloy: string;
  alloyName: string;
}

export type CouponRecord = Coupon & {
  id: number;
  ownerId: string;
  ownerName: string | null;
  layerKey: string;
  createdAt: Date;
  updatedAt: Date;
  layerDetails: CouponLayer[];
};

const couponColumns = {
  id: coupons.id,
  ownerId: coupons.ownerId,
  ownerName: users.name,
  title: coupons.title,
  layerKey: coupons.layerKey,
  surfacePrep: coupons.surfacePrep,
  surfaceGrit: coupons.surfaceGrit,
  process: coupons.process,
  temperatureC: coupons.temperatureC,
  temperatureMethod: coupons.temperatureMethod,
  holdSeconds: coupons.holdSeconds,
  volts: coupons.volts,
  atmosphere: coupons.atmosphere,
  argonFlowLpm: coupons.argonFlowLpm,
  atmosphereNote: coupons.atmosphereNote,
  cooling: coupons.cooling,
  notes: coupons.notes,
  visibility: coupons.visibility,
  createdAt: coupons.createdAt,
  updatedAt: coupons.updatedAt,
};

/** Each coupon's layers in order, for many coupons at once. */
export async function layersOf(couponIds: number[]): Promise<Map<number, CouponLayer[]>> {
  const byCoupon = new Map<number, CouponLayer[]>();
  if (couponIds.length === 0) return byCoupon;
  const rows = await db()
    .select({ couponId: couponLayers.couponId, id: couponLayers.id, position: couponLayers.position, alloy: alloys.slug, alloyName: alloys.name })
    .from(couponLayers)
    .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
    .where(inArray(couponLayers.couponId, couponIds))
    .orderBy(asc(couponLayers.couponId), asc(couponLayers.position));
  for (const { couponId, ...layer } of rows) byCoupon.set(couponId, [...(byCoupon.get(couponId) ?? []), layer]);
  return byCoupon;
}

export function withLayers(row: Omit<CouponRecord, 'layers' | 'layerDetails'>, layers: CouponLayer[] = []): CouponRecord {
  return { ...row, layers: layers.map((layer) => layer.alloy), layerDetails: layers };
}

type RouteParams = Record<string, string | undefined>;

/** What a route's `[id]` names, or a 404 naming what was looked for (callers check access). */
async function fromRoute<T>(params: RouteParams, what: string, find: (id: number) => Promise<T | undefined>): Promise<T | Response> {
  const id = routeId(params, what);
  if (typeof id !== 'number') return id;
  return (await find(id)) ?? problem(404, `${what} was not found.`);
}

/** The coupon a route's `[id]` names, or a 404 (callers check access). */
export const couponFromRoute = (params: RouteParams): Promise<CouponRecord | Response> => fromRoute(params, 'That coupon', findCoupon);

/** The photo a route's `[id]` names, with its coupon's owner and visibility, or a 404 (callers check access). */
export const photoFromRoute = (params: RouteParams): Promise<PhotoWithCoupon | Response> => fromRoute(params, 'That photo', findPhoto);

/** The photo a route's `[id]` names, for a member (as the database has them now) who may change it; or the refusal. */
export async function photoToChange(context: Pick<APIContext, 'locals' | 'params'>): Promise<PhotoWithCoupon | Response> {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  const found = await photoFromRoute(context.params);
  if (isResponse(found)) return found;
  return checkAccess(user, found.coupon, 'change', 'That photo') ?? found;
}

/** One coupon with its layers, whoever owns it (callers check access). */
export async function findCoupon(id: number): Promise<CouponRecord | undefined> {
  const [row] = await db().select(couponColumns).from(coupons).innerJoin(users, eq(users.id, coupons.ownerId)).where(eq(coupons.id, id));
  if (!row) return undefined;
  return withLayers(row, (await layersOf([id])).get(id));
}

export interface CouponListOptions {
  ownerId?: string;
  limit: number;
  offset: number;
}

/** Coupons the viewer may see, newest first, with the total for paging. */
export async function listCoupons(viewer: Viewer | null, options: CouponListOptions): Promise<{ coupons: CouponRecord[]; total: number }> {
  const where = and(visibleCoupons(viewer), options.ownerId ? eq(coupons.ownerId, options.ownerId) : undefined);
  const rows = await db()
    .select(couponColumns)
    .from(coupons)
    .innerJoin(users, eq(users.id, coupons.ownerId))
    .where(where)
    .orderBy(desc(coupons.createdAt), desc(coupons.id))
    .limit(options.limit)
    .offset(options.offset);
  const [{ total }] = await db().select({ total: count() }).from(coupons).where(where);
  const layers = await layersOf(rows.map((row) => row.id));
  return { coupons: rows.map((row) => withLayers(row, layers.get(row.id))), total };
}

async function alloyIds(slugs: string[]): Promise<Map<string, number>> {
  const rows = await db().select({ id: alloys.id, slug: alloys.slug }).from(alloys).where(inArray(alloys.slug, slugs));
  return new Map(rows.map((row) => [row.slug, row.id]));
}

const recordOf = ({ layers, ...coupon }: Coupon) => ({ ...coupon, layerKey: layerKeyOf(layers) });

export async function createCoupon(ownerId: string, input: Coupon): Promise<number> {
  const ids = await alloyIds(input.layers);
  return db().transaction(async (tx) => {
    const [{ id }] = await tx
      .insert(coupons)
      .values({ ...recordOf(input), ownerId })
      .$returningId();
    await tx.insert(couponLayers).values(input.layers.map((slug, position) => ({ couponId: id, position, alloyId: ids.get(slug)! })));
    return id;
  });
}

/**
 * Saves an edited coupon. Layers are changed in place by position, so a layer keeps its regions
 * and swatches when only its alloy changes; removed positions take theirs with them. The library
 * versions of its alloys before and after go up (its heat record or layers changed what they hold).
 */
export async function updateCoupon(id: number, input: Coupon): Promise<void> {
  const ids = await alloyIds(input.layers);
  await db().transaction(async (tx) => {
    await tx.update(coupons).set(recordOf(input)).where(eq(coupons.id, id));
    const existing = await tx
      .select({ id: couponLayers.id, position: couponLayers.position, alloyId: couponLayers.alloyId })
      .from(couponLayers)
      .where(eq(couponLayers.couponId, id));
    for (const [position, slug] of input.layers.entries()) {
      const layer = existing.find((row) => row.position === position);
      if (layer) {
        await tx
          .update(couponLayers)
          .set({ alloyId: ids.get(slug)! })
          .where(eq(couponLayers.id, layer.id));
        // Swatches carry their layer's alloy for the library fit and colour search.
        await tx
          .update(swatches)
          .set({ alloyId: ids.get(slug)! })
          .where(eq(swatches.layerId, layer.id));
      } else await tx.insert(couponLayers).values({ couponId: id, position, alloyId: ids.get(slug)! });
    }
    const removed = existing.filter((row) => row.position >= input.layers.length).map((row) => row.id);
    if (removed.length) await tx.delete(couponLayers).where(inArray(couponLayers.id, removed));
    await refreshCouponLightness(tx, id);
    await bumpLibraryVersions(tx, [...existing.map((layer) => layer.alloyId), ...ids.values()]);
  });
}

/** Shares or unshares a coupon: who sees its alloys' swatches changes, so their versions go up. */
export async function setVisibility(id: number, visibility: Visibility): Promise<void> {
  await db().transaction(async (tx) => {
    await tx.update(coupons).set({ visibility }).where(eq(coupons.id, id));
    await bumpLibraryVersions(tx, await alloysOfCoupons(tx, [id]));
  });
}

/**
 * Deletes a coupon (photos, regions and swatches cascade) and then its photos' files. The
 * transaction locks the coupon's row, so a photo being attached either is in before its photos
 * are read or finds the coupon gone, and records a ledger entry for each photo's folder, so the
 * sweep removes whatever deleting the files (best effort, after commit) leaves. False when the
 * coupon was gone already.
 */
export async function deleteCoupon(id: number): Promise<boolean> {
  const photosGone = await photoTransaction(db(), async (tx) => {
    if (!(await lockCoupon(tx, id))) return undefined;
    const owned = await forgetCouponPhotos(tx, id);
    const alloysHeld = await alloysOfCoupons(tx, [id]);
    await tx.delete(coupons).where(eq(coupons.id, id));
    await bumpLibraryVersions(tx, alloysHeld);
    return owned;
  });
  if (!photosGone) return false;
  for (const photo of photosGone) await removePhotoFiles(photo);
  return true;
}

export async function photoCounts(couponIds: number[]): Promise<Map<number, number>> {
  if (couponIds.length === 0) return new Map();
  const rows = await db()
    .select({ couponId: photos.couponId, photos: sql<number>`count(*)` })
    .from(photos)
    .where(inArray(photos.couponId, couponIds))
    .groupBy(photos.couponId);
  return new Map(rows.map((row) => [row.couponId, Number(row.photos)]));
}

/** The heat record alone, as the form and the API's input schema know it. */
export function heatRecordOf(coupon: CouponRecord): Coupon {
  const { layerDetails: _details, id: _id, ownerId: _owner, ownerName: _name, layerKey: _key, createdAt: _created, updatedAt: _updated, ...record } = coupon;
  return record;
}

/** A coupon as the API answers it: no owner id, but whether the viewer may change it. */
export function couponView(coupon: CouponRecord, viewer: Viewer | null) {
  const { ownerId, layerDetails, ...rest } = coupon;
  return {
    ...rest,
    layers: layerDetails.map(({ position, alloy, alloyName }) => ({ position, alloy, alloyName })),
    canEdit: mayChange(viewer, { ownerId }),
  };
}
