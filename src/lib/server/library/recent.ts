import { and, asc, desc, eq, inArray, isNotNull, lt, or, sql } from 'drizzle-orm';
import { alloys, couponLayers, coupons, libraryVersions, swatches } from '../../../../db/schema';
import { findAlloy } from '~/lib/alloys';
import { db } from '~/lib/server/db';
import { freshRead } from '~/lib/server/fresh-read';

/** One layer's dominant measured colour on a recent coupon. */
export interface RecentSwatch {
  alloy: string;
  hex: string;
}

export interface RecentCoupon {
  id: number;
  title: string;
  process: (typeof coupons.$inferSelect)['process'];
  temperatureC: number | null;
  holdSeconds: number | null;
  volts: number | null;
  createdAt: Date;
  /** One per alloy of the pair, in the pair's order; an alloy whose layer has no measured swatch is left out. */
  swatches: RecentSwatch[];
}

export interface RecentPair {
  /** The two alloy slugs, sorted (as in the coupons' layer key). */
  alloys: [RecentAlloy, RecentAlloy];
  /** The library filtered to this pair, and the pair's matrix of heats. */
  libraryHref: string;
  matrixHref: string;
  coupons: RecentCoupon[];
}

interface RecentAlloy {
  slug: string;
  name: string;
}

export interface RecentLimits {
  pairs: number;
  perPair: number;
}

/** A layer key naming exactly two alloys ("a+b"). */
const twoAlloys = sql`${coupons.layerKey} like '%+%' and ${coupons.layerKey} not like '%+%+%'`;

/**
 * A coupon with at least one measured colour on a layer (region means left out). A scalar subquery
 * with a limit, read per coupon on the swatches' coupon index as the walk goes: written as EXISTS,
 * MariaDB turns it into a semi-join that materialises every measured swatch of the library first.
 */
const measured = sql`(select 1 from ${swatches} where ${swatches.couponId} = ${coupons.id} and ${swatches.layerId} is not null and ${swatches.isMean} = false limit 1) is not null`;

/** Coupons read per step of the walk that finds the newest pairs. */
const WALK_BATCH = 200;

const recentColumns = {
  id: coupons.id,
  layerKey: coupons.layerKey,
  title: coupons.title,
  process: coupons.process,
  temperatureC: coupons.temperatureC,
  holdSeconds: coupons.holdSeconds,
  volts: coupons.volts,
  createdAt: coupons.createdAt,
};

/**
 * The layer keys of the `limit` pairs with the most recently logged measured public coupons,
 * newest first (ties by key). Walks the public coupons newest first on the (visibility, created)
 * index a batch at a time and stops once `limit` pairs are found and the walk has passed the last
 * one's newest coupon, so it reads a few hundred index entries however large the library.
 */
async function newestPairs(limit: number): Promise<string[]> {
  const latest = new Map<string, number>();
  let after: { createdAt: Date; id: number } | undefined;
  let lastFound = Infinity;
  walk: for (;;) {
    const batch = await db()
      .select({ id: coupons.id, layerKey: coupons.layerKey, createdAt: coupons.createdAt })
      .from(coupons)
      .where(
        and(
          eq(coupons.visibility, 'public'),
          twoAlloys,
          measured,
          after ? or(lt(coupons.createdAt, after.createdAt), and(eq(coupons.createdAt, after.createdAt), lt(coupons.id, after.id))) : undefined,
        ),
      )
      .orderBy(desc(coupons.createdAt), desc(coupons.id))
      .limit(WALK_BATCH);
    for (const row of batch) {
      const at = new Date(row.createdAt).getTime();
      if (latest.size >= limit && at < lastFound) break walk;
      if (!latest.has(row.layerKey)) {
        latest.set(row.layerKey, at);
        lastFound = at;
      }
    }
    if (batch.length < WALK_BATCH) break;
    after = batch.at(-1)!;
  }
  return [...latest]
    .sort(([keyA, atA], [keyB, atB]) => atB - atA || (keyA < keyB ? -1 : keyA > keyB ? 1 : 0))
    .slice(0, limit)
    .map(([key]) => key);
}

/**
 * The front page's "recent in the library": the alloy pairs with the most recently logged public
 * coupons that have measured swatches, newest pair first, each with its newest such coupons and
 * each coupon's dominant swatch per alloy. Public coupons only, whoever asks: it is the front page.
 * Each pair's coupons are an ordered walk of the (visibility, layer key, created) index that stops
 * at `perPair`.
 */
export async function recentPublicPairs(limits: RecentLimits = { pairs: 6, perPair: 6 }): Promise<RecentPair[]> {
  const keys = await newestPairs(limits.pairs);
  const perPair = await Promise.all(
    keys.map((key) =>
      db()
        .select(recentColumns)
        .from(coupons)
        .where(and(eq(coupons.visibility, 'public'), eq(coupons.layerKey, key), measured))
        .orderBy(desc(coupons.createdAt), desc(coupons.id))
        .limit(limits.perPair),
    ),
  );
  const rows = perPair.flat();
  const dominant = await dominantByCoupon(rows.map((row) => row.id));

  const pairs = new Map<string, RecentPair>();
  for (const row of rows) {
    let pair = pairs.get(row.layerKey);
    if (!pair) {
      const [a, b] = row.layerKey.split('+').map((slug) => ({ slug, name: findAlloy(slug)?.name ?? slug }));
      const key = `${a.slug}+${b.slug}`;
      pair = { alloys: [a, b], libraryHref: `/library?pair=${key}`, matrixHref: `/library/pairs/${key}`, coupons: [] };
      pairs.set(row.layerKey, pair);
    }
    const layers = dominant.get(row.id) ?? [];
    pair.coupons.push({
      id: row.id,
      title: row.title,
      process: row.process,
      temperatureC: row.temperatureC,
      holdSeconds: row.holdSeconds,
      volts: row.volts,
      createdAt: new Date(row.createdAt),
      // The first layer of each alloy with a measured colour, in the pair's order.
      swatches: pair.alloys.flatMap(({ slug }) => layers.find((layer) => layer.alloy === slug) ?? []),
    });
  }
  return [...pairs.values()];
}

/**
 * Each coupon's layers (by position) with their dominant swatch: the measured cluster with the
 * largest share over all the coupon's photos, means left out, ties to the older swatch — as the
 * library's list shows it. Layers with no measured colour are left out.
 */
async function dominantByCoupon(couponIds: number[]): Promise<Map<number, RecentSwatch[]>> {
  const byCoupon = new Map<number, RecentSwatch[]>();
  if (couponIds.length === 0) return byCoupon;
  const ranked = db()
    .select({
      layerId: swatches.layerId,
      hex: swatches.hex,
      rank: sql<number>`row_number() over (partition by ${swatches.layerId} order by ${swatches.share} desc, ${swatches.id} asc)`.as('share_rank'),
    })
    .from(swatches)
    .where(and(inArray(swatches.couponId, couponIds), isNotNull(swatches.layerId), eq(swatches.isMean, false)))
    .as('ranked_swatches');
  const rows = await db()
    .select({ couponId: couponLayers.couponId, alloy: alloys.slug, hex: ranked.hex })
    .from(couponLayers)
    .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
    .innerJoin(ranked, and(eq(ranked.layerId, couponLayers.id), eq(ranked.rank, 1)))
    .where(inArray(couponLayers.couponId, couponIds))
    .orderBy(asc(couponLayers.couponId), asc(couponLayers.position));
  for (const row of rows) byCoupon.set(row.couponId, [...(byCoupon.get(row.couponId) ?? []), { alloy: row.alloy, hex: row.hex }]);
  return byCoupon;
}

/**
 * The whole library's version: the sum of the alloys' library versions. Every write that can change
 * what the front page shows (a coupon's edit, sharing or deletion, a photo's attach, measure or
 * deletion, an account's deletion) raises its alloys' versions in its own transaction
 * (library-versions.ts), and versions only go up, so the sum changes with every such write, in
 * every process at once. One small read of a table of a row per alloy, shared by the requests that
 * ask while another read is in flight, and always taken after they asked (fresh-read.ts).
 */
export const libraryVersion: () => Promise<string> = freshRead(async () => {
  const [row] = await db()
    .select({ total: sql<string>`coalesce(sum(${libraryVersions.version}), 0)`.mapWith(String) })
    .from(libraryVersions);
  return row.total;
});

/** The front page's groups, computed once per library version (shared by requests that ask meanwhile). */
let remembered: { version: string; pairs: Promise<RecentPair[]> } | undefined;

/**
 * The front page's "recent in the library" (recentPublicPairs with its usual limits), kept in the
 * process for as long as the library's version stays the same. The version is read before the
 * groups, so groups read after a write are never kept under the version before it.
 */
export async function recentInLibrary(): Promise<RecentPair[]> {
  const version = await libraryVersion();
  let known = remembered;
  if (!known || known.version !== version) {
    const pairs = recentPublicPairs();
    known = remembered = { version, pairs };
    // A failed reading is not kept: the next request tries again.
    pairs.catch(() => {
      if (remembered?.pairs === pairs) remembered = undefined;
    });
  }
  return known.pairs;
}
