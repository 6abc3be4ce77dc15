import { callApi } from '~/components/api-client';

/** One coupon as the library shows it: what the table, the cards and the swatch grid need, nothing more. */
export interface LibraryRow extends Omit<ListedCoupon, 'createdAt' | 'dominantSwatches'> {
  /** The day it was logged, YYYY-MM-DD (UTC). */
  loggedOn: string;
  /** Each layer's dominant measured swatch; layers without photos have none. */
  swatches: { position: number; alloy: string; hex: string }[];
}

/** One page of results. */
export interface LibraryResults {
  rows: LibraryRow[];
  total: number;
  /** False when the count stopped at its cap and `total` is the cap. */
  totalExact: boolean;
  nextCursor: string | null;
}

/** A coupon as the server's list or `GET /api/coupons` gives it (dates as Date on the server, ISO text in JSON). */
export interface ListedCoupon {
  id: number;
  title: string;
  process: string;
  temperatureC: number | null;
  holdSeconds: number | null;
  volts: number | null;
  atmosphere: string;
  ownerName: string | null;
  createdAt: Date | string;
  layers: { position: number; alloy: string; alloyName: string }[];
  dominantSwatches: { position: number; alloy: string; hex: string }[];
}

export function toRow(coupon: ListedCoupon): LibraryRow {
  return {
    id: coupon.id,
    title: coupon.title,
    process: coupon.process,
    temperatureC: coupon.temperatureC,
    holdSeconds: coupon.holdSeconds,
    volts: coupon.volts,
    atmosphere: coupon.atmosphere,
    ownerName: coupon.ownerName,
    loggedOn: new Date(coupon.createdAt).toISOString().slice(0, 10),
    layers: coupon.layers.map(({ position, alloy, alloyName }) => ({ position, alloy, alloyName })),
    swatches: coupon.dominantSwatches.map(({ position, alloy, hex }) => ({ position, alloy, hex })),
  };
}

/** A refused or failed page load, with the API's message. */
export class LibraryLoadError extends Error {
  constructor(
    message: string,
    readonly status: number,
    /** The query parameter the API named as at fault, e.g. `tempMax`. */
    readonly field?: string,
  ) {
    super(message);
  }
}

/** One page from `GET /api/coupons` for a library query (see library-url.ts). */
export async function fetchLibraryPage(query: string): Promise<LibraryResults> {
  const answer = await callApi<{ coupons: ListedCoupon[]; total: number; totalExact?: boolean; nextCursor: string | null }>(
    `/api/coupons${query ? `?${query}` : ''}`,
  );
  if (!answer.ok) throw new LibraryLoadError(answer.message, answer.status, answer.field);
  return { rows: answer.body.coupons.map(toRow), total: answer.body.total, totalExact: answer.body.totalExact ?? true, nextCursor: answer.body.nextCursor };
}
