import { and, asc, desc, eq, isNotNull, isNull, lte, max, min, ne, or, sql, type SQL } from 'drizzle-orm';
import { coupons } from '../../../../db/schema';
import { layerKeyOf } from '~/lib/alloys';
import {
  buildPairMatrix,
  holdColumns,
  memoisedPredictor,
  temperatureRows,
  type MatrixCoupon,
  type PairMatrix,
  type TemperatureRow,
} from '~/lib/library/pair-matrix';
import type { SessionUser } from '~/lib/server/authorise';
import { layersOf } from '~/lib/server/coupons';
import { db } from '~/lib/server/db';
import { libraryFitFor } from '~/lib/server/tint-fit';
import { visibleCoupons } from '~/lib/server/visibility';
import { dominantSwatches } from './list';

type Viewer = Pick<SessionUser, 'id' | 'role'> | null;

/** The most coupons one cell carries (its newest); the cell's count says how many it holds. */
export const CELL_COUPON_LIMIT = 8;
/** The most coupons the anodized and the unbinned lists carry each (anodized by voltage, unbinned newest first). */
export const LIST_COUPON_LIMIT = 60;

export type LoadedPairMatrix = PairMatrix & {
  /** True when the anodized or unbinned list stopped at LIST_COUPON_LIMIT. */
  truncated: boolean;
  /** Every coupon of the alloys the viewer may see: in cells, anodized and unbinned. */
  couponCount: number;
};

const matrixColumns = {
  id: coupons.id,
  title: coupons.title,
  process: coupons.process,
  temperatureC: coupons.temperatureC,
  holdSeconds: coupons.holdSeconds,
  volts: coupons.volts,
  atmosphere: coupons.atmosphere,
  visibility: coupons.visibility,
};

type MatrixRow = Omit<MatrixCoupon, 'layers'>;

/**
 * The model's bands, remembered in this process per fit: libraryFit keeps one fit per alloy,
 * audience and library version, so a repeat of a matrix predicts nothing, and a write that bumps
 * the alloy's version (library-versions.ts) brings a new fit and fresh predictions.
 */
const predictLayerMemo = memoisedPredictor();

/** A temperature's row, as temperatureRowOf bins it (rows are contiguous: the first whose top lies above). */
function rowCase(rows: readonly TemperatureRow[]): SQL {
  return sql`case ${sql.join(
    rows.map((row) => sql`when ${coupons.temperatureC} < ${row.highC} then ${row.index}`),
    sql` `,
  )} else -1 end`;
}

/** A hold's column, as holdColumnOf bins it (bands closed above). */
function columnCase(): SQL {
  return sql`case ${sql.join(
    holdColumns.map((column) =>
      column.maxSeconds === null ? sql`else ${column.index}` : sql`when ${coupons.holdSeconds} <= ${column.maxSeconds} then ${column.index}`,
    ),
    sql` `,
  )} end`;
}

/**
 * The heat matrix of an alloy pair (or one alloy) for a viewer, bounded however many coupons the
 * alloys have: the coupons they may see whose layers are exactly these alloys (the layer key's
 * index), counted per temperature row × hold column in SQL, with each cell's newest
 * CELL_COUPON_LIMIT coupons and their layers' dominant swatches; anodized and unbinned coupons
 * up to LIST_COUPON_LIMIT each; and the model's band per cell, fitted to the viewer's library as
 * the heat planner is.
 */
export async function loadPairMatrix(viewer: Viewer, alloys: readonly string[]): Promise<LoadedPairMatrix> {
  const sorted = [...new Set(alloys)].sort();
  const ofAlloys = and(eq(coupons.layerKey, layerKeyOf(sorted)), visibleCoupons(viewer));
  const binnable = and(ofAlloys, ne(coupons.process, 'anodize'), isNotNull(coupons.temperatureC), isNotNull(coupons.holdSeconds));

  const [span] = await db()
    .select({ low: min(coupons.temperatureC), high: max(coupons.temperatureC) })
    .from(coupons)
    .where(binnable);
  const temperaturesC = span && span.low !== null && span.high !== null ? [Number(span.low), Number(span.high)] : [];
  const rows = temperatureRows(sorted, temperaturesC);

  const cellRows = temperaturesC.length ? await cellSamples(binnable, rows) : [];
  const perCell = new Map(cellRows.map((row) => [row.cellIndex, row.cellCount]));
  const [anodized, unbinned] = await Promise.all([
    listed(and(ofAlloys, eq(coupons.process, 'anodize')), [asc(coupons.volts), asc(coupons.id)]),
    listed(and(ofAlloys, ne(coupons.process, 'anodize'), or(isNull(coupons.temperatureC), isNull(coupons.holdSeconds))), [desc(coupons.id)]),
  ]);
  const carried: MatrixRow[] = [...cellRows.map((row) => row.coupon), ...anodized.rows, ...unbinned.rows];

  const layers = await layersOf(carried.map((row) => row.id));
  const swatches = await dominantSwatches([...layers.values()].flat().map((layer) => layer.id));
  const matrixCoupons: MatrixCoupon[] = carried.map((row) => ({
    ...row,
    layers: (layers.get(row.id) ?? []).map((layer) => {
      const swatch = swatches.get(layer.id);
      return { position: layer.position, alloy: layer.alloy, swatch: swatch ? { hex: swatch.hex, lab: swatch.lab } : null };
    }),
  }));
  const fits = Object.fromEntries(await Promise.all(sorted.map(async (slug) => [slug, await libraryFitFor(slug, viewer)] as const)));
  const matrix = buildPairMatrix(sorted, matrixCoupons, fits, { temperaturesC, perCell }, predictLayerMemo);
  const inCells = [...perCell.values()].reduce((sum, n) => sum + n, 0);
  return {
    ...matrix,
    truncated: anodized.total > anodized.rows.length || unbinned.total > unbinned.rows.length,
    couponCount: inCells + anodized.total + unbinned.total,
  };
}

/**
 * Each cell's newest CELL_COUPON_LIMIT coupons and its count, in one statement: the coupons are
 * binned by CASE on the rows' and columns' bounds and ranked per cell by window functions.
 */
async function cellSamples(binnable: SQL | undefined, rows: readonly TemperatureRow[]) {
  const cellIndex = sql`(${rowCase(rows)}) * ${holdColumns.length} + (${columnCase()})`;
  const ranked = db()
    .select({
      ...matrixColumns,
      cellIndex: sql<number>`${cellIndex}`.as('cell_index'),
      cellRank: sql<number>`row_number() over (partition by ${cellIndex} order by ${coupons.id} desc)`.as('cell_rank'),
      cellCount: sql<number>`count(*) over (partition by ${cellIndex})`.as('cell_count'),
    })
    .from(coupons)
    .where(binnable)
    .as('ranked_cells');
  const found = await db().select().from(ranked).where(lte(ranked.cellRank, CELL_COUPON_LIMIT));
  return found.map(({ cellIndex: index, cellRank: _rank, cellCount, ...coupon }) => ({ cellIndex: Number(index), cellCount: Number(cellCount), coupon }));
}

/** Up to LIST_COUPON_LIMIT coupons in an order, and how many match (a window count, in the same statement). */
async function listed(where: SQL | undefined, order: SQL[]): Promise<{ rows: MatrixRow[]; total: number }> {
  const found = await db()
    .select({ ...matrixColumns, total: sql<number>`count(*) over ()` })
    .from(coupons)
    .where(where)
    .orderBy(...order)
    .limit(LIST_COUPON_LIMIT);
  return { rows: found.map(({ total: _total, ...row }) => row), total: Number(found[0]?.total ?? 0) };
}
