import { toCsv, type CsvValue } from '~/lib/library/csv';
import type { LibraryQuery } from '~/lib/library/query';
import type { SessionUser } from '~/lib/server/authorise';
import { listLibrary, type LibraryCoupon } from './list';

type Viewer = Pick<SessionUser, 'id' | 'role'> | null;

/** The most rows one export carries; the answer says when it stopped there. */
export const EXPORT_ROW_LIMIT = 5000;

/** Every coupon of the library view (same filters, sort and visibility), page by page by keyset. */
export async function exportLibrary(viewer: Viewer, query: LibraryQuery): Promise<{ coupons: LibraryCoupon[]; truncated: boolean }> {
  const rows: LibraryCoupon[] = [];
  let cursor: string | undefined;
  for (;;) {
    const page = await listLibrary(viewer, { ...query, cursor, limit: 100, offset: 0 });
    rows.push(...page.coupons);
    if (!page.nextCursor) return { coupons: rows, truncated: false };
    if (rows.length >= EXPORT_ROW_LIMIT) return { coupons: rows.slice(0, EXPORT_ROW_LIMIT), truncated: true };
    cursor = page.nextCursor;
  }
}

const header = [
  'id',
  'title',
  'layers',
  'process',
  'temperature_c',
  'hold_seconds',
  'volts',
  'atmosphere',
  'surface_prep',
  'owner',
  'visibility',
  'logged_at',
  'dominant_swatches',
];

export function libraryCsv(coupons: LibraryCoupon[]): string {
  const rows: CsvValue[][] = coupons.map((coupon) => [
    coupon.id,
    coupon.title,
    coupon.layers.join('+'),
    coupon.process,
    coupon.temperatureC,
    coupon.holdSeconds,
    coupon.volts,
    coupon.atmosphere,
    coupon.surfacePrep,
    coupon.ownerName,
    coupon.visibility,
    coupon.createdAt.toISOString(),
    coupon.dominantSwatches.map((swatch) => `${swatch.position + 1}:${swatch.hex}`).join(' '),
  ]);
  return toCsv([header, ...rows]);
}

/** The JSON export: the same fields the CSV has, plus each swatch's CIELAB. */
export function libraryJson(coupons: LibraryCoupon[], truncated: boolean) {
  return {
    truncated,
    coupons: coupons.map((coupon) => ({
      id: coupon.id,
      title: coupon.title,
      layers: coupon.layers,
      process: coupon.process,
      temperatureC: coupon.temperatureC,
      holdSeconds: coupon.holdSeconds,
      volts: coupon.volts,
      atmosphere: coupon.atmosphere,
      surfacePrep: coupon.surfacePrep,
      owner: coupon.ownerName,
      visibility: coupon.visibility,
      loggedAt: coupon.createdAt.toISOString(),
      dominantSwatches: coupon.dominantSwatches,
    })),
  };
}
