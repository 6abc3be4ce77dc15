import { and, eq, inArray, isNotNull } from 'drizzle-orm';
import { alloys, coupons, swatches } from '../../../db/schema';
import { findTintModel, fitArgonFactor, MIN_LIBRARY_COUPONS, type ArgonFactorFit, type GrowthFit } from '~/lib/tint';
import { db } from './db';
import { libraryVersion, observationsFromSwatches, swatchRowColumns } from './tint-fit';
import { visibleCoupons, type Viewer } from './visibility';

/**
 * The argon thickness factor of an alloy for one signed-in person: fitted to the argon-purged heats
 * they may see (visibleCoupons), relative to what the same heats give in air on their air basis.
 *
 * Kept like the air fit (tint-fit.ts): in this process's memory by alloy and audience, refitted when
 * the alloy's library version (library_versions, bumped by every write that changes its swatches,
 * a coupon's atmosphere or who sees them) has moved, or when the air basis it is relative to is
 * another fit.
 */

/** Heat processes whose coupons count; the same as the air fit's. */
const HEAT_PROCESSES = ['oven', 'forge', 'torch', 'induction'] as const;
/** Fits kept per process; the least recently used goes first. */
const MAX_CACHED_FITS = 256;

async function loadArgonFit(slug: string, viewer: Viewer, airFit: GrowthFit | null): Promise<ArgonFactorFit | null> {
  const model = findTintModel(slug)!;
  const rows = await db()
    .select(swatchRowColumns)
    .from(swatches)
    .innerJoin(coupons, eq(coupons.id, swatches.couponId))
    .innerJoin(alloys, eq(alloys.id, swatches.alloyId))
    .where(
      and(
        eq(alloys.slug, slug),
        isNotNull(swatches.layerId),
        inArray(coupons.process, HEAT_PROCESSES),
        eq(coupons.atmosphere, 'argon'),
        isNotNull(coupons.temperatureC),
        isNotNull(coupons.holdSeconds),
        visibleCoupons(viewer),
      ),
    );
  return fitArgonFactor(model, observationsFromSwatches(rows), airFit, MIN_LIBRARY_COUPONS);
}

interface CachedFit {
  version: number;
  airFit: GrowthFit | null;
  fit: Promise<ArgonFactorFit | null>;
}

const cache = new Map<string, CachedFit>();

function remember(key: string, entry: CachedFit) {
  cache.delete(key);
  cache.set(key, entry);
  if (cache.size > MAX_CACHED_FITS) cache.delete(cache.keys().next().value!);
}

/**
 * The argon factor for this viewer, or null when the alloy has no heat model or too few argon
 * coupons are in the viewer's library. Refits only when the library's version (or the air basis)
 * changed; concurrent requests for the same version share one fit.
 */
export async function argonFactorFit(slug: string, viewer: Viewer, airFit: GrowthFit | null): Promise<ArgonFactorFit | null> {
  const model = findTintModel(slug);
  if (!model?.optics || !model.heat) return null;
  const current = await libraryVersion(slug, viewer);
  if (!current) return null;
  const key = `${slug}|${current.audience}`;
  const cached = cache.get(key);
  if (cached?.version === current.version && cached.airFit === airFit) {
    remember(key, cached);
    return cached.fit;
  }
  const fit = loadArgonFit(slug, viewer, airFit);
  const entry = { version: current.version, airFit, fit };
  remember(key, entry);
  fit.catch(() => cache.get(key) === entry && cache.delete(key));
  return fit;
}

/** The argon factor for a signed-in person, nothing for a visitor (whose reference data cover air only). */
export async function argonFactorFitFor(slug: string, viewer: Viewer | null, airFit: GrowthFit | null): Promise<ArgonFactorFit | null> {
  return viewer ? argonFactorFit(slug, viewer, airFit) : null;
}
