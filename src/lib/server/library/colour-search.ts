import { and, between, eq, inArray } from 'drizzle-orm';
import { alloys, couponLayers, coupons, swatches } from '../../../../db/schema';
import { boxCells, deltaE00Box, MAX_CELL_RANGES } from '~/lib/library/colour-box';
import type { ColourSearch } from '~/lib/library/colour-search';
import { deltaE2000, type Lab } from '~/lib/colour';
import type { SessionUser } from '~/lib/server/authorise';
import { visibleCoupons } from '~/lib/server/visibility';
import { db } from '~/lib/server/db';

type Viewer = Pick<SessionUser, 'id' | 'role'> | null;

export interface SwatchHit {
  swatchId: number;
  hex: string;
  /** The stored CIELAB of the swatch (its measured colour; `hex` is that colour rounded to sRGB). */
  lab: { l: number; a: number; b: number };
  /** ΔE00 between the searched colour and the swatch's stored CIELAB (not its rounded hex). */
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

/** The first ΔE00 radius searched; further rounds widen it (nextRadius), up to the asked limit. */
const FIRST_RADIUS = 1.5;

/**
 * The next round's radius: as far as the visible hits found so far suggest `limit` lie (they grow
 * with the volume, so with r³), with a margin; at least a quarter wider, at most twice, never past
 * the asked limit. Only speed depends on it: every round is exact within its radius.
 */
export function nextRadius(radius: number, found: number, limit: number, maxDeltaE: number): number {
  const estimate = found > 0 ? radius * Math.cbrt(limit / found) * 1.15 : radius * 2;
  return Math.min(maxDeltaE, Math.max(radius * 1.25, Math.min(radius * 2, estimate)));
}

/** A swatch found near the colour, before anyone's visibility is applied. */
interface Candidate {
  id: number;
  lab: Lab;
  deltaE00: number;
}

type Details = Omit<SwatchHit, 'lab' | 'deltaE00'>;

/**
 * Measured swatches (ranked clusters; a region's mean is left out, being no colour on the metal
 * itself) of coupons the viewer may see, within `maxDeltaE` ΔE00 of the colour, nearest first
 * (ties by swatch id), at most `limit`.
 *
 * In rounds of growing radius r (FIRST_RADIUS, then nextRadius, up to maxDeltaE):
 * 1. nearbySwatches reads id and CIELAB of every measured swatch in the CIELAB box that provably
 *    holds all colours within r (deltaE00Box) from the covering colour index alone, as one range
 *    of b* per colour cell; exact ΔE00 keeps those within r, nearest first.
 * 2. visibleDetails then asks, in batches down that order, which of them belong to coupons the viewer
 *    may see (visibleCoupons, in SQL), with their coupons' records, until `limit` are found.
 * Every swatch within r has been seen, so `limit` visible hits within r are the nearest of all; with
 * fewer, the next round looks further. Visibility already asked is kept between rounds.
 */
export async function searchSwatches(viewer: Viewer, query: ColourSearch): Promise<SwatchHit[]> {
  let alloyId: number | null = null;
  if (query.alloy) {
    const [alloy] = await db().select({ id: alloys.id }).from(alloys).where(eq(alloys.slug, query.alloy));
    if (!alloy) return [];
    alloyId = alloy.id;
  }
  const known = new Map<number, Details | null>();
  for (let radius = Math.min(FIRST_RADIUS, query.maxDeltaE); ;) {
    const candidates = await nearbySwatches(query.lab, radius, alloyId);
    const hits: SwatchHit[] = [];
    let batch = query.limit * 2 + 10;
    for (let next = 0; next < candidates.length && hits.length < query.limit; next += 1) {
      const candidate = candidates[next];
      if (!known.has(candidate.id)) {
        const unknown = candidates
          .slice(next)
          .filter((other) => !known.has(other.id))
          .slice(0, batch);
        for (const id of unknown.map((other) => other.id)) known.set(id, null);
        for (const found of await visibleDetails(
          viewer,
          unknown.map((other) => other.id),
        ))
          known.set(found.swatchId, found);
        batch *= 2;
      }
      const details = known.get(candidate.id);
      if (details) hits.push({ ...details, lab: candidate.lab, deltaE00: Math.round(candidate.deltaE00 * 1000) / 1000 });
    }
    if (hits.length >= query.limit || radius >= query.maxDeltaE) return hits;
    radius = nextRadius(radius, hits.length, query.limit, query.maxDeltaE);
  }
}

/** Measured swatches (of the alloy, when given) within ΔE00 `radius` of the colour, nearest first, read from the colour index alone. */
async function nearbySwatches(centre: Lab, radius: number, alloyId: number | null): Promise<Candidate[]> {
  const box = deltaE00Box(centre, radius)!;
  const cells = boxCells(box);
  const perCell = cells.l.length * cells.a.length <= MAX_CELL_RANGES;
  const rows = await db()
    .select({ id: swatches.id, l: swatches.labL, a: swatches.labA, b: swatches.labB })
    .from(swatches, { forceIndex: alloyId === null ? 'swatches_colour_cell_idx' : 'swatches_alloy_colour_cell_idx' })
    .where(
      and(
        alloyId === null ? undefined : eq(swatches.alloyId, alloyId),
        eq(swatches.isMean, false),
        inArray(swatches.labLCell, cells.l),
        perCell ? inArray(swatches.labACell, cells.a) : between(swatches.labACell, cells.a[0], cells.a.at(-1)!),
        between(swatches.labB, box.b[0], box.b[1]),
        between(swatches.labL, box.l[0], box.l[1]),
        between(swatches.labA, box.a[0], box.a[1]),
      ),
    );
  const candidates: Candidate[] = [];
  for (const row of rows) {
    const lab = { l: row.l, a: row.a, b: row.b };
    const deltaE00 = deltaE2000(centre, lab);
    if (deltaE00 <= radius) candidates.push({ id: row.id, lab, deltaE00 });
  }
  return candidates.sort((first, second) => first.deltaE00 - second.deltaE00 || first.id - second.id);
}

/** Of these swatches, those of coupons the viewer may see, with their coupons' records. */
async function visibleDetails(viewer: Viewer, ids: number[]): Promise<Details[]> {
  if (ids.length === 0) return [];
  const rows = await db()
    .select({
      swatchId: swatches.id,
      hex: swatches.hex,
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
    .where(and(inArray(swatches.id, ids), visibleCoupons(viewer)));
  return rows.map(({ title, layerKey, process, temperatureC, holdSeconds, volts, atmosphere, ...swatch }) => ({
    ...swatch,
    coupon: { title, layerKey, process, temperatureC, holdSeconds, volts, atmosphere },
  }));
}
