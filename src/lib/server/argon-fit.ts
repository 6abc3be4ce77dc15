import { and, eq, inArray, isNotNull } from 'drizzle-orm';
import { alloys, coupons, swatches } from '../../../db/schema';
import { findTintModel, fitArgonFactor, MIN_LIBRARY_COUPONS, type ArgonFactorFit, type GrowthFit } from '~/lib/tint';
import { db } from './db';
import { observationsFromSwatches, swatchRowColumns } from './tint-fit';
import { visibleCoupons, type Viewer } from './visibility';

/**
 * The argon thickness factor of an alloy for one signed-in person: fitted to the argon-purged heats
 * they may see (visibleCoupons), relative to what the same heats give in air on their air basis.
 * Argon coupons are few, so the fit is made on each request rather than cached.
 */

/** Heat processes whose coupons count; the same as the air fit's. */
const HEAT_PROCESSES = ['oven', 'forge', 'torch', 'induction'] as const;

export async function argonFactorFit(slug: string, viewer: Viewer, airFit: GrowthFit | null): Promise<ArgonFactorFit | null> {
  const model = findTintModel(slug);
  if (!model?.optics || !model.heat) return null;
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

/** The argon factor for a signed-in person, nothing for a visitor (whose reference data cover air only). */
export async function argonFactorFitFor(slug: string, viewer: Viewer | null, airFit: GrowthFit | null): Promise<ArgonFactorFit | null> {
  return viewer ? argonFactorFit(slug, viewer, airFit) : null;
}
