import { asc, desc, eq, inArray } from 'drizzle-orm';
import { classCoupons, coupons } from '../../../../db/schema';
import { db } from '../db';
import { layersOf } from '../coupons';
import { dominantSwatches } from '../library/list';
import type { Viewer } from '../visibility';
import { libraryPicks } from '~/lib/sheets/library-picks';

/** A swatch the sheet builder offers: each measured layer's dominant swatch, as the library shows it. */
export interface PickableSwatch {
  swatchId: number;
  hex: string;
  couponId: number;
  /** The coupon's title, with the layer's alloy on a laminate and the heat. */
  couponTitle: string;
  temperatureC: number | null;
  holdSeconds: number | null;
}

const columns = { id: coupons.id, title: coupons.title, temperatureC: coupons.temperatureC, holdSeconds: coupons.holdSeconds };
type CouponRow = { id: number; title: string; temperatureC: number | null; holdSeconds: number | null };

/** Each coupon's measured layers, in order: the largest cluster of each (means left out). */
async function picksOf(rows: CouponRow[]): Promise<PickableSwatch[]> {
  const layers = await layersOf(rows.map((row) => row.id));
  const dominant = await dominantSwatches([...layers.values()].flat().map((layer) => layer.id));
  return rows.flatMap((row) => {
    const measured = (layers.get(row.id) ?? []).flatMap((layer) => {
      const swatch = dominant.get(layer.id);
      return swatch ? [{ swatchId: swatch.swatchId, position: layer.position, alloy: layer.alloy, hex: swatch.hex }] : [];
    });
    return libraryPicks([{ ...row, dominantSwatches: measured }]).map((pick) => ({
      ...pick,
      couponId: row.id,
      temperatureC: row.temperatureC,
      holdSeconds: row.holdSeconds,
    }));
  });
}

/** The builder's two lists: swatches of coupons shared with the sheet's class, and the owner's own. */
export async function pickableSwatches(viewer: Viewer, classId: number | null, limit = 120): Promise<{ fromClass: PickableSwatch[]; own: PickableSwatch[] }> {
  const own = db().select(columns).from(coupons).where(eq(coupons.ownerId, viewer.id)).orderBy(desc(coupons.createdAt), desc(coupons.id)).limit(limit);
  const fromClass =
    classId === null
      ? Promise.resolve([])
      : db()
          .select(columns)
          .from(coupons)
          .where(inArray(coupons.id, db().select({ id: classCoupons.couponId }).from(classCoupons).where(eq(classCoupons.classId, classId))))
          .orderBy(asc(coupons.temperatureC), asc(coupons.holdSeconds), asc(coupons.id))
          .limit(limit);
  const [ownRows, classRows] = await Promise.all([own, fromClass]);
  const [ownPicks, classPicks] = await Promise.all([picksOf(ownRows), picksOf(classRows)]);
  return { fromClass: classPicks, own: ownPicks };
}
