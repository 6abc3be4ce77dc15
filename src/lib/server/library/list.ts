import { and, asc, count, desc, eq, gte, inArray, isNull, lte, or, sql, type SQL } from 'drizzle-orm';
import { alloys, couponLayers, coupons, photos, swatches } from '../../../../db/schema';
import { decodeCursor, encodeCursor, type LibraryCursor, type LibraryQuery } from '~/lib/library/query';
import type { SessionUser } from '~/lib/server/authorise';
import { visibleCoupons } from '~/lib/server/visibility';
import { db } from '~/lib/server/db';
import { listCouponRows, type CouponRecord } from './coupon-rows';

type Viewer = Pick<SessionUser, 'id' | 'role'> | null;

export interface DominantSwatch {
  position: number;
  alloy: string;
  hex: string;
  lab: { l: number; a: number; b: number };
  share: number;
}

export type LibraryCoupon = CouponRecord & { dominantSwatches: DominantSwatch[] };

export interface LibraryPage {
  coupons: LibraryCoupon[];
  total: number;
  nextCursor: string | null;
}

export class BadCursor extends Error {}

const sortColumn = { date: coupons.createdAt, temperature: coupons.temperatureC, hold: coupons.holdSeconds } as const;

/** The filters of a library query, as SQL, with the viewer's visibility rule. */
export function libraryWhere(viewer: Viewer, query: LibraryQuery, alloyId?: number): SQL | undefined {
  return and(
    visibleCoupons(viewer),
    query.mineOnly && viewer ? eq(coupons.ownerId, viewer.id) : undefined,
    alloyId !== undefined
      ? sql`exists (select 1 from ${couponLayers} where ${couponLayers.couponId} = ${coupons.id} and ${couponLayers.alloyId} = ${alloyId})`
      : undefined,
    query.pairKey ? eq(coupons.layerKey, query.pairKey) : undefined,
    query.process ? eq(coupons.process, query.process) : undefined,
    query.tempMinC !== undefined ? gte(coupons.temperatureC, query.tempMinC) : undefined,
    query.tempMaxC !== undefined ? lte(coupons.temperatureC, query.tempMaxC) : undefined,
    query.holdMinSeconds !== undefined ? gte(coupons.holdSeconds, query.holdMinSeconds) : undefined,
    query.holdMaxSeconds !== undefined ? lte(coupons.holdSeconds, query.holdMaxSeconds) : undefined,
    query.voltsMin !== undefined ? gte(coupons.volts, query.voltsMin) : undefined,
    query.voltsMax !== undefined ? lte(coupons.volts, query.voltsMax) : undefined,
    query.atmosphere ? eq(coupons.atmosphere, query.atmosphere) : undefined,
    query.prep ? eq(coupons.surfacePrep, query.prep) : undefined,
    query.hasPhotos ? sql`exists (select 1 from ${photos} where ${photos.couponId} = ${coupons.id})` : undefined,
  );
}

/**
 * Rows after the cursor in the order (sort key, id), with rows lacking the sort key (an anodized
 * coupon has no temperature) last in either direction.
 */
function afterCursor(cursor: LibraryCursor): SQL | undefined {
  const column = sortColumn[cursor.sort];
  const after = cursor.order === 'asc' ? sql`>` : sql`<`;
  const idAfter = sql`${coupons.id} ${after} ${cursor.id}`;
  if (cursor.value === null) return and(isNull(column), idAfter);
  const value = cursor.sort === 'date' ? new Date(cursor.value) : cursor.value;
  return or(sql`${column} ${after} ${value}`, and(eq(column, value), idAfter), isNull(column));
}

const cursorValue = (row: CouponRecord, sort: LibraryCursor['sort']): number | null =>
  sort === 'date' ? row.createdAt.getTime() : sort === 'temperature' ? row.temperatureC : row.holdSeconds;

async function alloyIdOf(slug: string): Promise<number> {
  const [row] = await db().select({ id: alloys.id }).from(alloys).where(eq(alloys.slug, slug));
  return row?.id ?? -1;
}

/**
 * One page of the library: the coupons the viewer may see that match the query, in its order,
 * paged by keyset (or by offset, for older callers), each with its layers' dominant swatches.
 * Throws BadCursor when the cursor is not one of ours for this sort.
 */
export async function listLibrary(viewer: Viewer, query: LibraryQuery): Promise<LibraryPage> {
  const cursor = query.cursor === undefined ? undefined : decodeCursor(query.cursor, query.sort, query.order);
  if (query.cursor !== undefined && !cursor) throw new BadCursor('That page link is out of date or not one of ours.');
  const alloyId = query.alloy ? await alloyIdOf(query.alloy) : undefined;
  const where = libraryWhere(viewer, query, alloyId);
  const column = sortColumn[query.sort];
  const direction = query.order === 'asc' ? asc : desc;
  const rows = await listCouponRows(
    and(where, cursor ? afterCursor(cursor) : undefined),
    [sql`${column} is null`, direction(column), direction(coupons.id)],
    query.limit + 1,
    query.offset,
  );
  const [{ total }] = await db().select({ total: count() }).from(coupons).where(where);
  const page = rows.slice(0, query.limit);
  const last = page.at(-1);
  const nextCursor =
    rows.length > query.limit && last ? encodeCursor({ sort: query.sort, order: query.order, value: cursorValue(last, query.sort), id: last.id }) : null;
  const dominant = await dominantSwatches(page.flatMap((coupon) => coupon.layerDetails.map((layer) => layer.id)));
  return {
    coupons: page.map((coupon) => ({
      ...coupon,
      dominantSwatches: coupon.layerDetails.flatMap((layer) => {
        const swatch = dominant.get(layer.id);
        return swatch ? [{ position: layer.position, alloy: layer.alloy, ...swatch }] : [];
      }),
    })),
    total,
    nextCursor,
  };
}

/** Each layer's dominant swatch: the measured cluster with the largest share over all its photos (means left out). */
export async function dominantSwatches(layerIds: number[]): Promise<Map<number, Omit<DominantSwatch, 'position' | 'alloy'>>> {
  const byLayer = new Map<number, Omit<DominantSwatch, 'position' | 'alloy'>>();
  if (layerIds.length === 0) return byLayer;
  const rows = await db()
    .select({ layerId: swatches.layerId, hex: swatches.hex, l: swatches.labL, a: swatches.labA, b: swatches.labB, share: swatches.share })
    .from(swatches)
    .where(and(inArray(swatches.layerId, layerIds), eq(swatches.isMean, false)))
    .orderBy(desc(swatches.share), asc(swatches.id));
  for (const row of rows) {
    if (row.layerId !== null && !byLayer.has(row.layerId)) byLayer.set(row.layerId, { hex: row.hex, lab: { l: row.l, a: row.a, b: row.b }, share: row.share });
  }
  return byLayer;
}
