import { and, eq, inArray, isNotNull, or, sql, type SQL } from 'drizzle-orm';
import { alloys, coupons, swatches } from '../../../db/schema';
import type { Lab } from '~/lib/colour';
import { fitGrowth, findTintModel, type CouponObservation, type GrowthFit } from '~/lib/tint';
import { db } from './db';
import { visibleCoupons, type Viewer } from './visibility';

/**
 * The library fit of an alloy's growth laws, for one signed-in person: fitted to the coupons they
 * may see (visibleCoupons in visibility.ts) that have swatches for a layer of that alloy.
 *
 * Fits are kept in this process's memory keyed by alloy and audience, with a version read from
 * the database on every request (count, id sum and last edit of the coupons' swatches), so a new,
 * edited, re-shared or deleted coupon refits here and in every other app process alike.
 */

/** Heat processes whose coupons feed the heat law; only heats in air (the priors are for air). */
const HEAT_PROCESSES = ['oven', 'forge', 'torch', 'induction'] as const;
/** Fits kept per process; the least recently used goes first. */
const MAX_CACHED_FITS = 256;

/** Coupons whose record a fit can use: a heat in air with temperature and hold, or anodizing with volts. */
const usableCoupon = or(
  and(inArray(coupons.process, HEAT_PROCESSES), eq(coupons.atmosphere, 'air'), isNotNull(coupons.temperatureC), isNotNull(coupons.holdSeconds)),
  and(eq(coupons.process, 'anodize'), isNotNull(coupons.volts)),
);

/** Layer swatches of the alloy on coupons the viewer may see and the fit can use. */
function relevantSwatches(slug: string, viewer: Viewer): SQL | undefined {
  return and(eq(alloys.slug, slug), isNotNull(swatches.layerId), usableCoupon, visibleCoupons(viewer));
}

interface LibraryVersion {
  /** Whose fit this is: everyone's library (admins), the shared one, or one person's own. */
  audience: string;
  version: string;
  swatchCount: number;
}

/**
 * A cheap fingerprint of the swatches a fit would use. The id sum changes with any insert or
 * delete (ids only grow), the last edit with any change to a coupon's heat record or visibility.
 * People with no private coupons of the alloy share one fit: they all see the same library.
 */
export async function libraryVersion(slug: string, viewer: Viewer): Promise<LibraryVersion> {
  const [row] = await db()
    .select({
      count: sql<number>`count(*)`.mapWith(Number),
      idSum: sql<string>`coalesce(sum(${swatches.id}), 0)`.mapWith(String),
      lastEdit: sql<string | null>`cast(max(${coupons.updatedAt}) as char)`,
      privateCount: sql<number>`coalesce(sum(${coupons.visibility} = 'private'), 0)`.mapWith(Number),
    })
    .from(swatches)
    .innerJoin(coupons, eq(coupons.id, swatches.couponId))
    .innerJoin(alloys, eq(alloys.id, swatches.alloyId))
    .where(relevantSwatches(slug, viewer));
  const audience = viewer.role === 'admin' ? 'all' : row.privateCount > 0 ? `person:${viewer.id}` : 'shared';
  return { audience, version: `${row.count}/${row.idSum}/${row.lastEdit ?? '-'}`, swatchCount: row.count };
}

interface SwatchRow {
  couponId: number;
  photoId: number;
  layerId: number | null;
  isMean: boolean;
  share: number;
  l: number;
  a: number;
  b: number;
  process: (typeof coupons.$inferSelect)['process'];
  temperatureC: number | null;
  holdSeconds: number | null;
  volts: number | null;
}

/**
 * One observation per coupon: per layer and photo the region's mean swatch (or, without one, the
 * swatch with the largest share), averaged over the coupon's photos and layers of the alloy.
 */
export function observationsFromSwatches(rows: readonly SwatchRow[]): CouponObservation[] {
  const chosen = new Map<string, SwatchRow>();
  for (const row of rows) {
    const key = `${row.photoId}:${row.layerId}`;
    const current = chosen.get(key);
    const better = !current || (row.isMean && !current.isMean) || (row.isMean === current.isMean && row.share > current.share);
    if (better) chosen.set(key, row);
  }
  const byCoupon = new Map<number, SwatchRow[]>();
  for (const row of chosen.values()) byCoupon.set(row.couponId, [...(byCoupon.get(row.couponId) ?? []), row]);

  const observations: CouponObservation[] = [];
  for (const group of byCoupon.values()) {
    const mean = (pick: (row: SwatchRow) => number) => group.reduce((sum, row) => sum + pick(row), 0) / group.length;
    const lab: Lab = { l: mean((row) => row.l), a: mean((row) => row.a), b: mean((row) => row.b) };
    const [{ process, temperatureC, holdSeconds, volts }] = group;
    if (process === 'anodize' && volts !== null) observations.push({ process: 'anodize', volts, lab });
    else if (process !== 'anodize' && temperatureC !== null && holdSeconds !== null) {
      observations.push({ process: 'heat', temperatureC, holdMinutes: holdSeconds / 60, lab });
    }
  }
  return observations;
}

/** The observations a fit of the alloy needs, from the coupons the viewer may see. */
export async function loadObservations(slug: string, viewer: Viewer): Promise<CouponObservation[]> {
  const rows = await db()
    .select({
      couponId: swatches.couponId,
      photoId: swatches.photoId,
      layerId: swatches.layerId,
      isMean: swatches.isMean,
      share: swatches.share,
      l: swatches.labL,
      a: swatches.labA,
      b: swatches.labB,
      process: coupons.process,
      temperatureC: coupons.temperatureC,
      holdSeconds: coupons.holdSeconds,
      volts: coupons.volts,
    })
    .from(swatches)
    .innerJoin(coupons, eq(coupons.id, swatches.couponId))
    .innerJoin(alloys, eq(alloys.id, swatches.alloyId))
    .where(relevantSwatches(slug, viewer));
  return observationsFromSwatches(rows);
}

interface CachedFit {
  version: string;
  fit: Promise<GrowthFit>;
}

const cache = new Map<string, CachedFit>();

function remember(key: string, entry: CachedFit) {
  cache.delete(key);
  cache.set(key, entry);
  if (cache.size > MAX_CACHED_FITS) cache.delete(cache.keys().next().value!);
}

/**
 * The alloy's library fit for this viewer, or null when the alloy has no growth model or the
 * viewer's library has no usable swatches of it. Refits only when the library's version changed;
 * concurrent requests for the same version share one fit.
 */
export async function libraryFit(slug: string, viewer: Viewer): Promise<GrowthFit | null> {
  const model = findTintModel(slug);
  if (!model?.optics || (!model.heat && !model.anodize)) return null;
  const { audience, version, swatchCount } = await libraryVersion(slug, viewer);
  if (swatchCount === 0) return null;
  const key = `${slug}|${audience}`;
  const cached = cache.get(key);
  if (cached?.version === version) {
    remember(key, cached);
    return cached.fit;
  }
  const fit = loadObservations(slug, viewer).then((observations) => fitGrowth(model, observations));
  const entry = { version, fit };
  remember(key, entry);
  fit.catch(() => cache.get(key) === entry && cache.delete(key));
  return fit;
}

/** The library fit for a signed-in person, nothing for a visitor (reference data only). */
export async function libraryFitFor(slug: string, viewer: Viewer | null): Promise<GrowthFit | null> {
  return viewer ? libraryFit(slug, viewer) : null;
}
