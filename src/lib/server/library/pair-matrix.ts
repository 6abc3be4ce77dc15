import { and, desc, eq } from 'drizzle-orm';
import { coupons } from '../../../../db/schema';
import { layerKeyOf } from '~/lib/alloys';
import { buildPairMatrix, type MatrixCoupon, type PairMatrix } from '~/lib/library/pair-matrix';
import type { SessionUser } from '~/lib/server/authorise';
import { layersOf } from '~/lib/server/coupons';
import { db } from '~/lib/server/db';
import { libraryFitFor } from '~/lib/server/tint-fit';
import { visibleCoupons } from '~/lib/server/visibility';
import { dominantSwatches } from './list';

type Viewer = Pick<SessionUser, 'id' | 'role'> | null;

/** The most coupons one matrix carries (the newest); the answer says when it stopped there. */
export const MATRIX_COUPON_LIMIT = 2000;

export type LoadedPairMatrix = PairMatrix & { truncated: boolean; couponCount: number };

/**
 * The heat matrix of an alloy pair (or one alloy) for a viewer: the coupons they may see whose
 * layers are exactly these alloys (one query on the layer key's index), their layers' dominant
 * swatches, and the model's band per cell, fitted to the viewer's library as the heat planner is.
 */
export async function loadPairMatrix(viewer: Viewer, alloys: readonly string[]): Promise<LoadedPairMatrix> {
  const rows = await db()
    .select({
      id: coupons.id,
      title: coupons.title,
      process: coupons.process,
      temperatureC: coupons.temperatureC,
      holdSeconds: coupons.holdSeconds,
      volts: coupons.volts,
      atmosphere: coupons.atmosphere,
      visibility: coupons.visibility,
    })
    .from(coupons)
    .where(and(eq(coupons.layerKey, layerKeyOf(alloys)), visibleCoupons(viewer)))
    .orderBy(desc(coupons.id))
    .limit(MATRIX_COUPON_LIMIT + 1);
  const kept = rows.slice(0, MATRIX_COUPON_LIMIT);
  const layers = await layersOf(kept.map((row) => row.id));
  const swatches = await dominantSwatches([...layers.values()].flat().map((layer) => layer.id));
  const matrixCoupons: MatrixCoupon[] = kept.map((row) => ({
    ...row,
    layers: (layers.get(row.id) ?? []).map((layer) => {
      const swatch = swatches.get(layer.id);
      return { position: layer.position, alloy: layer.alloy, swatch: swatch ? { hex: swatch.hex, lab: swatch.lab } : null };
    }),
  }));
  const fits = Object.fromEntries(await Promise.all(alloys.map(async (slug) => [slug, await libraryFitFor(slug, viewer)] as const)));
  return { ...buildPairMatrix(alloys, matrixCoupons, fits), truncated: rows.length > MATRIX_COUPON_LIMIT, couponCount: kept.length };
}
