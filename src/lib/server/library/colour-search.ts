import { and, between, eq, sql } from 'drizzle-orm';
import { alloys, couponLayers, coupons, swatches } from '../../../../db/schema';
import { deltaE00Box } from '~/lib/library/colour-box';
import type { ColourSearch } from '~/lib/library/colour-search';
import { deltaE2000 } from '~/lib/colour';
import type { SessionUser } from '~/lib/server/authorise';
import { visibleCoupons } from '~/lib/server/visibility';
import { db } from '~/lib/server/db';

type Viewer = Pick<SessionUser, 'id' | 'role'> | null;

export interface SwatchHit {
  swatchId: number;
  hex: string;
  lab: { l: number; a: number; b: number };
  deltaE00: number;
  couponId: number;
  /** The layer's position in the coupon (0 = first), null when the whole photo was measured. */
  layer: number | null;
  alloy: string | null;
  coupon: {
    title: string;
    layerKey: string;
    process: string;
    temperatureC: number | null;
    holdSeconds: number | null;
    volts: number | null;
    atmosphere: string;
  };
}

/**
 * Measured swatches (ranked clusters; a region's mean is left out, being no colour on the metal
 * itself) of coupons the viewer may see, within `maxDeltaE` ΔE00 of the colour, nearest first.
 * The database narrows by a CIELAB box that provably holds every such colour (deltaE00Box), using
 * the index on (L*, a*, b*), or on (alloy, L*, a*, b*) with an alloy; exact ΔE00 decides the rest.
 */
export async function searchSwatches(viewer: Viewer, query: ColourSearch): Promise<SwatchHit[]> {
  const box = deltaE00Box(query.lab, query.maxDeltaE)!;
  const rows = await db()
    .select({
      swatchId: swatches.id,
      hex: swatches.hex,
      l: swatches.labL,
      a: swatches.labA,
      b: swatches.labB,
      couponId: swatches.couponId,
      layer: couponLayers.position,
      alloy: alloys.slug,
      title: coupons.title,
      layerKey: coupons.layerKey,
      process: coupons.process,
      temperatureC: coupons.temperatureC,
      holdSeconds: coupons.holdSeconds,
      volts: coupons.volts,
      atmosphere: coupons.atmosphere,
    })
    .from(swatches)
    .innerJoin(coupons, eq(coupons.id, swatches.couponId))
    .leftJoin(couponLayers, eq(couponLayers.id, swatches.layerId))
    .leftJoin(alloys, eq(alloys.id, swatches.alloyId))
    .where(
      and(
        visibleCoupons(viewer),
        eq(swatches.isMean, false),
        query.alloy ? sql`${swatches.alloyId} = (select ${alloys.id} from ${alloys} where ${alloys.slug} = ${query.alloy})` : undefined,
        between(swatches.labL, box.l[0], box.l[1]),
        between(swatches.labA, box.a[0], box.a[1]),
        between(swatches.labB, box.b[0], box.b[1]),
      ),
    );
  return rows
    .map((row) => ({ row, deltaE00: deltaE2000(query.lab, { l: row.l, a: row.a, b: row.b }) }))
    .filter(({ deltaE00 }) => deltaE00 <= query.maxDeltaE)
    .sort((first, second) => first.deltaE00 - second.deltaE00 || first.row.swatchId - second.row.swatchId)
    .slice(0, query.limit)
    .map(({ row, deltaE00 }) => ({
      swatchId: row.swatchId,
      hex: row.hex,
      lab: { l: row.l, a: row.a, b: row.b },
      deltaE00: Math.round(deltaE00 * 1000) / 1000,
      couponId: row.couponId,
      layer: row.layer,
      alloy: row.alloy,
      coupon: {
        title: row.title,
        layerKey: row.layerKey,
        process: row.process,
        temperatureC: row.temperatureC,
        holdSeconds: row.holdSeconds,
        volts: row.volts,
        atmosphere: row.atmosphere,
      },
    }));
}
