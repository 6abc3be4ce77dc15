import { and, eq, inArray, isNotNull, or, sql, type SQL } from 'drizzle-orm';
import { alloys, couponLayers, coupons, libraryVersions, swatches } from '../../../db/schema';
import type { Lab } from '~/lib/colour';
import { fitGrowth, findTintModel, type CouponObservation, type GrowthFit } from '~/lib/tint';
import { db } from './db';
import { visibleCoupons, type Viewer } from './visibility';

/**
 * The library fit of an alloy's growth laws, for one signed-in person: fitted to the coupons they
 * may see (visibleCoupons in visibility.ts) that have swatches for a layer of that alloy.
 *
 * Fits are kept in this process's memory keyed by alloy and audience, with the alloy's library
 * version (library_versions, bumped by every write that changes its swatches or who sees them:
 * library-versions.ts) read on every request by primary key, so a new, edited, re-shared or deleted
 * coupon refits here and in every other app process alike, and a prediction scans no swatches.
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

export interface LibraryVersion {
  /** Whose fit this is: everyone's library (admins), the shared one, or one person's own. */
  audience: string;
  version: number;
}

/**
 * The alloy's library version and the viewer's audience, in one query: the version row by primary
 * key, and whether the viewer has a private coupon with a layer of the alloy (their own coupons,
 * by the owner index). People with none share one fit: they all see the same library. Undefined
 * for an alloy not in the catalogue.
 */
export async function libraryVersion(slug: string, viewer: Viewer): Promise<LibraryVersion | undefined> {
  const personal =
    viewer.role === 'admin'
      ? sql<number>`0`
      : sql<number>`exists (select 1 from ${coupons} join ${couponLayers} on ${couponLayers.couponId} = ${coupons.id}
          where ${coupons.ownerId} = ${viewer.id} and ${coupons.visibility} = 'private' and ${couponLayers.alloyId} = ${alloys.id})`;
  const [row] = await db()
    .select({ version: sql<number>`coalesce(${libraryVersions.version}, 0)`.mapWith(Number), personal: personal.mapWith(Number) })
    .from(alloys)
    .leftJoin(libraryVersions, eq(libraryVersions.alloyId, alloys.id))
    .where(eq(alloys.slug, slug));
  if (!row) return undefined;
  const audience = viewer.role === 'admin' ? 'all' : row.personal ? `person:${viewer.id}` : 'shared';
  return { audience, version: row.version };
}

export interface SwatchRow {
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
 * One observation per coupon: per layer and photo the region's dominant film cluster (the
 * extracted swatch with the largest share — never the region's mean, a blend of film, shadow and
 * scale that the metal never showed; the mean only when a region has nothing else), averaged over
 * the coupon's photos and layers of the alloy.
 */
export function observationsFromSwatches(rows: readonly SwatchRow[]): CouponObservation[] {
  const chosen = new Map<string, SwatchRow>();
  for (const row of rows) {
    const key = `${row.photoId}:${row.layerId}`;
    const current = chosen.get(key);
    const better = !current || (!row.isMean && current.isMean) || (row.isMean === current.isMean && row.share > current.share);
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

/** The columns of a swatch and its coupon's heat record that a fit observes (see SwatchRow). */
export const swatchRowColumns = {
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
};

/** The observations a fit of the alloy needs, from the coupons the viewer may see. */
export async function loadObservations(slug: string, viewer: Viewer): Promise<CouponObservation[]> {
  const rows = await db()
    .select(swatchRowColumns)
    .from(swatches)
    .innerJoin(coupons, eq(coupons.id, swatches.couponId))
    .innerJoin(alloys, eq(alloys.id, swatches.alloyId))
    .where(relevantSwatches(slug, viewer));
  return observationsFromSwatches(rows);
}

interface CachedFit {
  version: number;
  fit: Promise<GrowthFit | null>;
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
  const current = await libraryVersion(slug, viewer);
  if (!current) return null;
  const key = `${slug}|${current.audience}`;
  const cached = cache.get(key);
  if (cached?.version === current.version) {
    remember(key, cached);
    return cached.fit;
  }
  const fit = loadObservations(slug, viewer).then((observations) => (observations.length === 0 ? null : fitGrowth(model, observations)));
  const entry = { version: current.version, fit };
  remember(key, entry);
  fit.catch(() => cache.get(key) === entry && cache.delete(key));
  return fit;
}

/** The library fit for a signed-in person, nothing for a visitor (reference data only). */
export async function libraryFitFor(slug: string, viewer: Viewer | null): Promise<GrowthFit | null> {
  return viewer ? libraryFit(slug, viewer) : null;
}
