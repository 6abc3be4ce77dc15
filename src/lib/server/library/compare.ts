import { and, asc, inArray } from 'drizzle-orm';
import { coupons, photos } from '../../../../db/schema';
import { layerDifferences, type ComparedLayer, type LayerDifference } from '~/lib/library/compare';
import { heatRecordOf, type CouponRecord } from '~/lib/server/coupons';
import { db } from '~/lib/server/db';
import { viewUrl } from '~/lib/server/photos/store';
import { visibleCoupons, type Viewer } from '~/lib/server/visibility';
import { listCouponRows } from './coupon-rows';
import { dominantSwatches } from './list';

export interface ComparedPhoto {
  id: number;
  width: number;
  height: number;
  displayUrl: string;
  thumbUrl: string;
}

/** One column of a comparison: the coupon, its first photo, its layers' dominant swatches and ΔE00 to the first column. */
export interface ComparedCoupon {
  id: number;
  title: string;
  ownerName: string | null;
  visibility: CouponRecord['visibility'];
  createdAt: Date;
  record: CouponRecord;
  photo: ComparedPhoto | null;
  layers: ComparedLayer[];
  /** Against the first column's layers; empty for the first column itself. */
  differences: LayerDifference[];
}

export interface Comparison {
  coupons: ComparedCoupon[];
  /** Asked-for ids left out: no such coupon, or one the caller may not see (never told apart). */
  notShown: number;
}

/** The first photo of each coupon (oldest first, as the coupon page lists them). */
async function firstPhotos(couponIds: number[]): Promise<Map<number, ComparedPhoto>> {
  const rows = await db()
    .select({ id: photos.id, couponId: photos.couponId, width: photos.width, height: photos.height, displayKey: photos.displayKey, thumbKey: photos.thumbKey })
    .from(photos)
    .where(inArray(photos.couponId, couponIds))
    .orderBy(asc(photos.createdAt), asc(photos.id));
  const first = new Map<number, ComparedPhoto>();
  for (const row of rows) {
    if (first.has(row.couponId)) continue;
    first.set(row.couponId, {
      id: row.id,
      width: row.width,
      height: row.height,
      displayUrl: await viewUrl(row.displayKey),
      thumbUrl: await viewUrl(row.thumbKey),
    });
  }
  return first;
}

/**
 * The coupons named by `ids` that the viewer may see (visibility in SQL), in the order asked,
 * each with its first photo and its layers' dominant swatches, and each after the first with the
 * ΔE00 between its layers and the first coupon's corresponding layers.
 */
export async function loadComparison(viewer: Viewer | null, ids: readonly number[]): Promise<Comparison> {
  const rows = await listCouponRows(and(inArray(coupons.id, [...ids]), visibleCoupons(viewer)), [asc(coupons.id)], ids.length);
  const found = ids.flatMap((id) => rows.filter((row) => row.id === id));
  const swatches = await dominantSwatches(found.flatMap((coupon) => coupon.layerDetails.map((layer) => layer.id)));
  const photosOf = found.length ? await firstPhotos(found.map((coupon) => coupon.id)) : new Map<number, ComparedPhoto>();
  const columns = found.map((coupon) => ({
    id: coupon.id,
    title: coupon.title,
    ownerName: coupon.ownerName,
    visibility: coupon.visibility,
    createdAt: coupon.createdAt,
    record: coupon,
    photo: photosOf.get(coupon.id) ?? null,
    layers: coupon.layerDetails.map(({ id, position, alloy, alloyName }) => {
      const swatch = swatches.get(id);
      return { position, alloy, alloyName, swatch: swatch ? { hex: swatch.hex, lab: swatch.lab } : null };
    }),
  }));
  const [reference] = columns;
  return {
    coupons: columns.map((column, index) => ({ ...column, differences: index === 0 ? [] : layerDifferences(reference.layers, column.layers) })),
    notShown: ids.length - found.length,
  };
}

/** A comparison as the API answers it: plain JSON, the heat record as the coupon API gives it, no owner id. */
export function comparisonView(comparison: Comparison) {
  return {
    coupons: comparison.coupons.map(({ record, createdAt, ...column }) => ({
      ...column,
      createdAt: createdAt.toISOString(),
      heat: heatRecordOf(record),
    })),
    notShown: comparison.notShown,
  };
}
