import { and, asc, count, desc, eq, gte, inArray, isNotNull, isNull, lte, or, sql, type SQL } from 'drizzle-orm';
import { alloys, couponLayers, coupons, photos, swatches } from '../../../../db/schema';
import { decodeCursor, encodeCursor, type LibraryCursor, type LibraryQuery } from '~/lib/library/query';
import type { SessionUser } from '~/lib/server/authorise';
import { visibleCoupons } from '~/lib/server/visibility';
import { db } from '~/lib/server/db';
import { listCouponRows, type LibraryRecord } from './coupon-rows';

type Viewer = Pick<SessionUser, 'id' | 'role'> | null;

export interface DominantSwatch {
  /** The swatch row, so a colour sheet can place it. */
  swatchId: number;
  position: number;
  alloy: string;
  hex: string;
  lab: { l: number; a: number; b: number };
  share: number;
}

export type LibraryCoupon = LibraryRecord & { dominantSwatches: DominantSwatch[] };

export interface LibraryPage {
  coupons: LibraryCoupon[];
  /** How many coupons match, counted up to TOTAL_CAP: past it, `totalExact` is false and `total` is the cap. */
  total: number;
  totalExact: boolean;
  nextCursor: string | null;
}

/** Counting stops here: an exact total of a hundred thousand rows would cost a scan on every page. */
export const TOTAL_CAP = 1000;

export class BadCursor extends Error {}

const sortColumn = { date: coupons.createdAt, temperature: coupons.temperatureC, hold: coupons.holdSeconds, lightness: coupons.dominantLabL } as const;

/**
 * The filters of a library query, as SQL, with the viewer's visibility rule. `walk` shapes the
 * alloy filter for a page read along a sort index (tested per coupon as the walk goes); without
 * it, for a count, MariaDB may materialise the alloy's coupons, which is cheaper for a rare alloy.
 */
export function libraryWhere(viewer: Viewer, query: LibraryQuery, alloyId?: number, walk = false): SQL | undefined {
  const layerOfAlloy = sql`select 1 from ${couponLayers} where ${couponLayers.couponId} = ${coupons.id} and ${couponLayers.alloyId} = ${alloyId ?? -1}`;
  return and(
    visibleCoupons(viewer),
    query.mineOnly && viewer ? eq(coupons.ownerId, viewer.id) : undefined,
    alloyId === undefined ? undefined : walk ? sql`(${layerOfAlloy} limit 1) is not null` : sql`exists (${layerOfAlloy})`,
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
    // A scalar subquery read per coupon as the sort index is walked: written as EXISTS, MariaDB
    // makes it a semi-join that first materialises every photo's coupon.
    query.hasPhotos ? sql`(select 1 from ${photos} where ${photos.couponId} = ${coupons.id} limit 1) is not null` : undefined,
  );
}

const cursorValue = (row: LibraryRecord, sort: LibraryCursor['sort']): number | null =>
  sort === 'date' ? row.createdAt.getTime() : sort === 'temperature' ? row.temperatureC : sort === 'hold' ? row.holdSeconds : row.dominantLabL;

async function alloyIdOf(slug: string): Promise<number> {
  const [row] = await db().select({ id: alloys.id }).from(alloys).where(eq(alloys.slug, slug));
  return row?.id ?? -1;
}

/**
 * The rows of one page, in the order (sort key, id), rows lacking the sort key (an anodized
 * coupon has no temperature, an unmeasured one no lightness) last in either direction. Read in
 * two steps, each an ordered walk of the sort column's index that stops at the page's end: the
 * rows with a value after the cursor, then, if the page is not full, those without one.
 */
async function pageRows(where: SQL | undefined, query: LibraryQuery, cursor: LibraryCursor | undefined, want: number): Promise<LibraryRecord[]> {
  const column = sortColumn[query.sort];
  const direction = query.order === 'asc' ? asc : desc;
  const after = query.order === 'asc' ? sql`>` : sql`<`;
  if (query.offset > 0) {
    // Older callers' offset paging: one query, nulls last by expression.
    return listCouponRows(where, [sql`${column} is null`, direction(column), direction(coupons.id)], want, query.offset);
  }
  const rows: LibraryRecord[] = [];
  if (!cursor || cursor.value !== null) {
    const value = cursor && (query.sort === 'date' ? new Date(cursor.value!) : cursor.value!);
    const afterCursor = cursor ? or(sql`${column} ${after} ${value}`, and(eq(column, value!), sql`${coupons.id} ${after} ${cursor.id}`)) : undefined;
    rows.push(...(await listCouponRows(and(where, isNotNull(column), afterCursor), [direction(column), direction(coupons.id)], want)));
  }
  if (rows.length < want && query.sort !== 'date') {
    const afterId = cursor?.value === null ? sql`${coupons.id} ${after} ${cursor.id}` : undefined;
    rows.push(...(await listCouponRows(and(where, isNull(column), afterId), [direction(coupons.id)], want - rows.length)));
  }
  return rows;
}

/** How many coupons match, up to the cap (a count that stops at the cap's row). */
async function cappedTotal(where: SQL | undefined, cap = TOTAL_CAP): Promise<{ total: number; totalExact: boolean }> {
  const matching = db()
    .select({ one: sql`1` })
    .from(coupons)
    .where(where)
    .limit(cap + 1)
    .as('matching');
  const [{ total }] = await db().select({ total: count() }).from(matching);
  return total > cap ? { total: cap, totalExact: false } : { total, totalExact: true };
}

/** Whether more than `cap` coupons of the view match (one count that stops at the row after the cap). */
export async function matchesMoreThan(viewer: Viewer, query: LibraryQuery, cap: number): Promise<boolean> {
  const alloyId = query.alloy ? await alloyIdOf(query.alloy) : undefined;
  return !(await cappedTotal(libraryWhere(viewer, query, alloyId), cap)).totalExact;
}

export interface ListOptions {
  /** false: skip the capped count (callers that page through every row need none); `total` is then the page's rows. */
  count?: boolean;
}

/**
 * One page of the library: the coupons the viewer may see that match the query, in its order,
 * paged by keyset (or by offset, for older callers), each with its layers' dominant swatches, and
 * the number that match (exact up to TOTAL_CAP; with `count: false`, not counted). Throws BadCursor
 * when the cursor is not one of ours for this sort.
 */
export async function listLibrary(viewer: Viewer, query: LibraryQuery, options: ListOptions = {}): Promise<LibraryPage> {
  const cursor = query.cursor === undefined ? undefined : decodeCursor(query.cursor, query.sort, query.order);
  if (query.cursor !== undefined && !cursor) throw new BadCursor('That page link is out of date or not one of ours.');
  const alloyId = query.alloy ? await alloyIdOf(query.alloy) : undefined;
  const where = libraryWhere(viewer, query, alloyId);
  const rows = await pageRows(libraryWhere(viewer, query, alloyId, true), query, cursor, query.limit + 1);
  const page = rows.slice(0, query.limit);
  // A first page that holds every match needs no count.
  const { total, totalExact } =
    options.count === false
      ? { total: page.length, totalExact: false }
      : !cursor && query.offset === 0 && rows.length <= query.limit
        ? { total: rows.length, totalExact: true }
        : await cappedTotal(where);
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
    totalExact,
    nextCursor,
  };
}

/** Each layer's dominant swatch: the measured cluster with the largest share over all its photos (means left out). */
export async function dominantSwatches(layerIds: number[]): Promise<Map<number, Omit<DominantSwatch, 'position' | 'alloy'>>> {
  const byLayer = new Map<number, Omit<DominantSwatch, 'position' | 'alloy'>>();
  if (layerIds.length === 0) return byLayer;
  const rows = await db()
    .select({
      swatchId: swatches.id,
      layerId: swatches.layerId,
      hex: swatches.hex,
      l: swatches.labL,
      a: swatches.labA,
      b: swatches.labB,
      share: swatches.share,
    })
    .from(swatches)
    .where(and(inArray(swatches.layerId, layerIds), eq(swatches.isMean, false)))
    .orderBy(desc(swatches.share), asc(swatches.id));
  for (const row of rows) {
    if (row.layerId !== null && !byLayer.has(row.layerId))
      byLayer.set(row.layerId, { swatchId: row.swatchId, hex: row.hex, lab: { l: row.l, a: row.a, b: row.b }, share: row.share });
  }
  return byLayer;
}
