import { findAlloy } from '../alloys';
import { formatDuration } from '../heat-record-text';

/**
 * The sheet builder's library picker: the library's own filters (alloy, alloy pair, process,
 * temperature) turned into a `GET /api/coupons` query, and the answer's layers' dominant swatches
 * turned into swatches to place.
 */

export interface LibraryPickFilters {
  alloy: string;
  pairA: string;
  pairB: string;
  process: string;
  tempMin: string;
  tempMax: string;
}

export const noLibraryFilters: LibraryPickFilters = { alloy: '', pairA: '', pairB: '', process: '', tempMin: '', tempMax: '' };

/** At most this many coupons a search; each gives one swatch per measured layer. */
export const LIBRARY_PICK_LIMIT = 40;

/** The query string for `GET /api/coupons`: only coupons with photos, temperatures in °C. */
export function libraryPickQuery(filters: LibraryPickFilters): string {
  const params = new URLSearchParams({ photos: '1', unit: 'C', limit: String(LIBRARY_PICK_LIMIT) });
  for (const key of ['alloy', 'process', 'tempMin', 'tempMax'] as const) {
    const value = filters[key].trim();
    if (value) params.set(key, value);
  }
  // A pair is both alloys or neither; the route names the missing one when only one is chosen.
  if (filters.pairA || filters.pairB) {
    params.set('pairA', filters.pairA);
    params.set('pairB', filters.pairB);
  }
  return params.toString();
}

export interface LibraryCouponAnswer {
  title: string;
  temperatureC: number | null;
  holdSeconds: number | null;
  dominantSwatches: { swatchId: number; position: number; alloy: string; hex: string }[];
}

export interface LibraryPick {
  swatchId: number;
  hex: string;
  couponTitle: string;
}

/** One pick per measured layer, labelled with the coupon, the layer's alloy (on a laminate) and the heat. */
export function libraryPicks(coupons: readonly LibraryCouponAnswer[]): LibraryPick[] {
  return coupons.flatMap((coupon) => {
    const heat = [
      coupon.temperatureC !== null ? `${Math.round(coupon.temperatureC)} °C` : null,
      coupon.holdSeconds !== null ? formatDuration(coupon.holdSeconds) : null,
    ]
      .filter(Boolean)
      .join(', ');
    const laminate = coupon.dominantSwatches.length > 1;
    // A title that already names its temperature ("… 280 °C, 10 min") is not told it twice.
    const named = coupon.temperatureC !== null && coupon.title.includes(`${Math.round(coupon.temperatureC)} °C`);
    return coupon.dominantSwatches.map((swatch) => {
      const alloy = laminate ? ` · ${findAlloy(swatch.alloy)?.name ?? swatch.alloy}` : '';
      return { swatchId: swatch.swatchId, hex: swatch.hex, couponTitle: `${coupon.title}${alloy}${heat && !named ? ` (${heat})` : ''}` };
    });
  });
}
