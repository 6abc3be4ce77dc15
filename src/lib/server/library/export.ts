import { toCsv, type CsvValue } from '~/lib/library/csv';
import type { LibraryQuery } from '~/lib/library/query';
import type { SessionUser } from '~/lib/server/authorise';
import { listLibrary, matchesMoreThan, type LibraryCoupon } from './list';

type Viewer = Pick<SessionUser, 'id' | 'role'> | null;

/** The most rows one export carries; the answer says when it stopped there. */
export const EXPORT_ROW_LIMIT = 5000;
/** Rows read per keyset page while exporting. */
const EXPORT_PAGE = 100;

/**
 * Every coupon of the library view (same filters, sort and visibility), page by page by keyset,
 * up to EXPORT_ROW_LIMIT. The pages skip the list's count, so each costs one ordered index walk.
 */
export async function* exportPages(viewer: Viewer, query: LibraryQuery): AsyncGenerator<LibraryCoupon[]> {
  let cursor: string | undefined;
  let sent = 0;
  for (;;) {
    const page = await listLibrary(viewer, { ...query, cursor, limit: EXPORT_PAGE, offset: 0 }, { count: false });
    const rows = page.coupons.slice(0, EXPORT_ROW_LIMIT - sent);
    sent += rows.length;
    if (rows.length) yield rows;
    if (!page.nextCursor || sent >= EXPORT_ROW_LIMIT) return;
    cursor = page.nextCursor;
  }
}

export interface LibraryExport {
  /** The file's text, page by page: memory holds one page of rows at a time. */
  body: ReadableStream<Uint8Array>;
  /** True when the view holds more than EXPORT_ROW_LIMIT coupons (known before the first row, from one capped count). */
  truncated: boolean;
}

/** The library view as a streamed CSV or JSON file. */
export async function exportLibrary(viewer: Viewer, query: LibraryQuery, format: 'csv' | 'json'): Promise<LibraryExport> {
  const truncated = await matchesMoreThan(viewer, query, EXPORT_ROW_LIMIT);
  const pages = exportPages(viewer, query);
  return { body: textStream(format === 'csv' ? csvChunks(pages) : jsonChunks(pages, truncated)), truncated };
}

async function* csvChunks(pages: AsyncGenerator<LibraryCoupon[]>): AsyncGenerator<string> {
  yield toCsv([header]);
  for await (const page of pages) yield toCsv(page.map(csvRow));
}

async function* jsonChunks(pages: AsyncGenerator<LibraryCoupon[]>, truncated: boolean): AsyncGenerator<string> {
  yield `{"truncated":${truncated},"coupons":[`;
  let first = true;
  for await (const page of pages) {
    yield (first ? '' : ',') + page.map((coupon) => JSON.stringify(jsonRecord(coupon))).join(',');
    first = false;
  }
  yield ']}';
}

function textStream(chunks: AsyncGenerator<string>): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  return new ReadableStream({
    async pull(controller) {
      const next = await chunks.next();
      if (next.done) controller.close();
      else controller.enqueue(encoder.encode(next.value));
    },
    async cancel() {
      await chunks.return(undefined);
    },
  });
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

function csvRow(coupon: LibraryCoupon): CsvValue[] {
  return [
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
  ];
}

/** The JSON export's record: the same fields the CSV has, plus each swatch's CIELAB. */
function jsonRecord(coupon: LibraryCoupon) {
  return {
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
  };
}
