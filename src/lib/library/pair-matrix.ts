import { z } from 'zod';
import type { Lab } from '~/lib/colour';
import { alloySlugs, findAlloy, layerKeyOf, type AlloyFamily } from '~/lib/alloys';
import type { Process, Visibility } from '~/lib/coupons';
import { celsiusToFahrenheit } from '~/lib/units';
import { findTintModel, ModelUnavailableError, NoPredictionError, predictTint, type GrowthFit, type TintName } from '~/lib/tint';

/**
 * The heat matrix of one alloy or alloy pair: the library's measured coupons binned by
 * temperature (rows) and hold (columns), and the model's predicted band for every layer at each
 * row × column heat, so a reader sees where measurement and model agree and where the library has
 * no coupons yet. Pure: the server module loads the coupons and the fits.
 */

// --- The route parameter ------------------------------------------------------------------------

const knownSlugs = new Set(alloySlugs);

/** The alloys a route parameter names: 'a+b' (either order) or, with `single`, one slug. Sorted. */
function alloysSchema(single: boolean) {
  return z
    .string({ error: single ? 'Name an alloy.' : 'Name two alloys as a+b.' })
    .max(100, { error: 'That is longer than any alloy name.' })
    .transform((value, context) => {
      const parts = value
        // A '+' may arrive percent-encoded in a path, or as a space from a query string.
        .split(/\+|%2b|\s/i)
        .map((part) => part.trim())
        .filter(Boolean);
      const unknown = parts.find((part) => !knownSlugs.has(part));
      if (unknown !== undefined) {
        context.addIssue({ code: 'custom', message: `“${unknown}” is not an alloy in the catalogue.` });
        return z.NEVER;
      }
      if (single && parts.length !== 1) {
        context.addIssue({ code: 'custom', message: 'Name one alloy; a pair has its own view at /library/pairs/a+b.' });
        return z.NEVER;
      }
      if (!single && parts.length !== 2) {
        context.addIssue({ code: 'custom', message: 'Name two alloys as a+b.' });
        return z.NEVER;
      }
      if (!single && parts[0] === parts[1]) {
        context.addIssue({ code: 'custom', message: `Name two different alloys; one alloy has its own view at /library/alloys/${parts[0]}.` });
        return z.NEVER;
      }
      return [...parts].sort();
    });
}

/** `{ pair: 'a+b' }` → the two slugs, sorted; an unknown slug, a third alloy or the same alloy twice is refused. */
export const pairParamsSchema = z.object({ pair: alloysSchema(false) });
/** `{ alloy: 'a' }` → `[a]`. */
export const alloyParamsSchema = z.object({ alloy: alloysSchema(true) });

/** The canonical path of a pair's (or one alloy's) matrix page. */
export function matrixPath(alloys: readonly string[]): string {
  return alloys.length === 1 ? `/library/alloys/${alloys[0]}` : `/library/pairs/${layerKeyOf(alloys)}`;
}

// --- Rows and columns ---------------------------------------------------------------------------

/** One temperature row: the heats from lowC (inclusive) to highC (exclusive), named by its centre. */
export interface TemperatureRow {
  index: number;
  centreC: number;
  lowC: number;
  highC: number;
}

/** One hold column: holds above minSeconds (from 0 inclusive in the first) up to maxSeconds inclusive. */
export interface HoldColumn {
  index: number;
  label: string;
  minSeconds: number;
  maxSeconds: number | null;
  /** The hold the model is evaluated at, roughly the band's geometric middle. */
  modelMinutes: number;
}

/**
 * Hold bands in minutes. Oxide growth goes with a root of time, so the bands widen as holds grow;
 * the model is evaluated near each band's geometric middle (3 min for the first, where holds of a
 * few tens of seconds to five minutes are common in torch work).
 */
export const holdColumns: readonly HoldColumn[] = [
  { label: '≤ 5 min', minMinutes: 0, maxMinutes: 5, modelMinutes: 3 },
  { label: '5–15 min', minMinutes: 5, maxMinutes: 15, modelMinutes: 10 },
  { label: '15–30 min', minMinutes: 15, maxMinutes: 30, modelMinutes: 20 },
  { label: '30–60 min', minMinutes: 30, maxMinutes: 60, modelMinutes: 45 },
  { label: '1–2 h', minMinutes: 60, maxMinutes: 120, modelMinutes: 90 },
  { label: '> 2 h', minMinutes: 120, maxMinutes: null, modelMinutes: 180 },
].map((band, index) => ({
  index,
  label: band.label,
  minSeconds: band.minMinutes * 60,
  maxSeconds: band.maxMinutes === null ? null : band.maxMinutes * 60,
  modelMinutes: band.modelMinutes,
}));

/** The column of a hold: bands are closed above, so exactly 5 min is "≤ 5 min". */
export function holdColumnOf(holdSeconds: number): number {
  const column = holdColumns.find((band) => band.maxSeconds === null || holdSeconds <= band.maxSeconds);
  return column!.index;
}

/**
 * Temperatures a matrix shows when the library has no coupons yet: the heat planner's range where
 * the alloy has a growth model, else a span by family. The family spans are from memory of the
 * trade's temper and heat-tint charts (common practice), wide enough to hold straw to blue.
 */
const familySpanC: Record<AlloyFamily, { min: number; max: number }> = {
  titanium: { min: 350, max: 750 },
  'carbon-steel': { min: 190, max: 340 },
  'stainless-steel': { min: 250, max: 700 },
  copper: { min: 150, max: 450 },
  bronze: { min: 150, max: 450 },
  brass: { min: 150, max: 450 },
  zirconium: { min: 300, max: 700 },
  niobium: { min: 300, max: 700 },
};

export function defaultSpanC(slug: string): { min: number; max: number } {
  const planner = findTintModel(slug)?.heat?.plannerC;
  if (planner) return planner;
  const family = findAlloy(slug)?.family;
  return family ? familySpanC[family] : { min: 200, max: 700 };
}

/** Row steps tried in order; the first that covers the span in at most MAX_ROWS rows is used. */
export const ROW_STEPS_C = [10, 25, 50, 100, 250, 500] as const;
export const MAX_ROWS = 12;

/**
 * Rows centred on multiples of a step (500 °C covers 475–525 °C at a 50 °C step), spanning the
 * alloys' default spans and every coupon's temperature, at the finest step that needs at most
 * MAX_ROWS rows.
 */
export function temperatureRows(alloys: readonly string[], temperaturesC: readonly number[]): TemperatureRow[] {
  const spans = alloys.map(defaultSpanC);
  const low = Math.min(...spans.map((span) => span.min), ...temperaturesC);
  const high = Math.max(...spans.map((span) => span.max), ...temperaturesC);
  const step = ROW_STEPS_C.find((candidate) => rowIndex(high, candidate) - rowIndex(low, candidate) + 1 <= MAX_ROWS) ?? ROW_STEPS_C.at(-1)!;
  const first = rowIndex(low, step);
  const last = rowIndex(high, step);
  return Array.from({ length: last - first + 1 }, (_, index) => {
    const centreC = (first + index) * step;
    return { index, centreC, lowC: centreC - step / 2, highC: centreC + step / 2 };
  });
}

/** Which multiple of the step a temperature is nearest to (halfway goes up). */
const rowIndex = (temperatureC: number, step: number) => Math.floor(temperatureC / step + 0.5);

/** The row a temperature falls in, or -1 outside the rows. */
export function temperatureRowOf(rows: readonly TemperatureRow[], temperatureC: number): number {
  return rows.findIndex((row) => temperatureC >= row.lowC && temperatureC < row.highC);
}

// --- The matrix ---------------------------------------------------------------------------------

export interface MatrixSwatch {
  hex: string;
  lab: Lab;
}

export interface MatrixLayer {
  position: number;
  alloy: string;
  /** The layer's dominant swatch (its measured cluster with the largest share), or null without photos. */
  swatch: MatrixSwatch | null;
}

export interface MatrixCoupon {
  id: number;
  title: string;
  process: Process;
  temperatureC: number | null;
  holdSeconds: number | null;
  volts: number | null;
  atmosphere: 'air' | 'argon' | 'other';
  visibility: Visibility;
  layers: MatrixLayer[];
}

export interface MatrixCell {
  row: number;
  column: number;
  coupons: MatrixCoupon[];
  /** How many coupons the cell holds: more than `coupons` carries when the server kept only the newest. */
  count: number;
}

/** What the server counted where the coupons are, when it carries only some of each cell's coupons. */
export interface CellCounts {
  /** The lowest and highest temperature of every binnable coupon (carried or not), so the rows span them all. */
  temperaturesC: readonly number[];
  /** Coupons per cell, by cell index (row × columns + column); a cell not named holds none. */
  perCell: ReadonlyMap<number, number>;
}

export interface PredictedLayer {
  alloy: string;
  hex: string;
  name: TintName;
  thicknessNm: { low: number; mid: number; high: number };
  /** The band's colours from low to high thickness. */
  band: { thicknessNm: number; hex: string; name: TintName }[];
  basis: 'library' | 'reference';
  couponCount: number;
  /** True when the heat lies outside the temperatures the reference data cover. */
  extrapolated: boolean;
}

export interface PredictedCell {
  row: number;
  column: number;
  temperatureC: number;
  holdMinutes: number;
  layers: PredictedLayer[];
  /** Layers the model gives no colour at this heat (a steel past its temper range), with the reason. */
  beyond: { alloy: string; reason: string }[];
}

export interface PairMatrix {
  /** The alloys, sorted: a pair in either order gives the same matrix. */
  alloys: string[];
  rows: TemperatureRow[];
  columns: readonly HoldColumn[];
  /** Every row × column, row by row; an empty `coupons` is a gap in the library. */
  cells: MatrixCell[];
  /** The model's band per layer at each row's centre and column's model hold, in air. */
  predicted: PredictedCell[];
  /** Alloys the model cannot predict a heat for, with the reason, once each. */
  unavailable: { alloy: string; reason: string }[];
  /** Anodized coupons of the same alloys, by voltage. */
  anodized: MatrixCoupon[];
  /** Heat coupons without a temperature or a hold, which no cell can hold. */
  unbinned: MatrixCoupon[];
}

const byHeat = (a: MatrixCoupon, b: MatrixCoupon) =>
  (a.temperatureC ?? 0) - (b.temperatureC ?? 0) || (a.holdSeconds ?? 0) - (b.holdSeconds ?? 0) || a.id - b.id;

/** A coupon's layers in the matrix's alloy order, then by position (a laminate may repeat an alloy). */
function orderLayers(coupon: MatrixCoupon, alloys: readonly string[]): MatrixCoupon {
  const rank = (layer: MatrixLayer) => alloys.indexOf(layer.alloy);
  return { ...coupon, layers: [...coupon.layers].sort((a, b) => rank(a) - rank(b) || a.position - b.position) };
}

/** Why the model cannot predict a heat for an alloy, or null when it can. */
export function heatUnavailableReason(slug: string): string | null {
  const model = findTintModel(slug);
  if (!model) return `${slug} is not in the catalogue.`;
  // Written here rather than with tint's missingModelReason, whose sentence reads "has no an …".
  if (!model.optics) return `${model.alloy.name} has no optical film model yet: library data only.`;
  if (!model.heat) return `${model.alloy.name} has no heat-growth kinetics yet: library data only.`;
  return null;
}

/** The model's band for one alloy at one heat in air, as the heat planner gives it. */
export function predictLayer(slug: string, temperatureC: number, holdMinutes: number, fit?: GrowthFit | null): PredictedLayer {
  const model = findTintModel(slug);
  if (!model) throw new ModelUnavailableError(`${slug} is not in the catalogue.`);
  const prediction = predictTint(model, { process: 'heat', temperatureC, holdMinutes, atmosphere: 'air' }, fit);
  return {
    alloy: slug,
    hex: prediction.colour.hex,
    name: prediction.colour.name,
    thicknessNm: prediction.thicknessNm,
    band: prediction.band,
    basis: prediction.basis,
    couponCount: prediction.couponCount,
    extrapolated: prediction.warnings.some((warning) => warning.code === 'outside-reference-range'),
  };
}

/** Predicts one alloy's band at one heat (predictLayer, or a memo of it: memoisedPredictor). */
export type LayerPredictor = (slug: string, temperatureC: number, holdMinutes: number, fit: GrowthFit | null) => PredictedLayer;

/** The most predictions a memo keeps per fit (and for the reference data); beyond, it starts again. */
export const MAX_MEMOISED_PREDICTIONS = 4096;

/**
 * predictLayer remembered per fit: a prediction depends only on the alloy, the heat and the fit, so
 * each fit (an immutable object; a library version that changes gives a new one) keeps its own
 * predictions, and the reference data's (no fit) are kept for good. A heat the model gives no
 * colour is remembered as its NoPredictionError. Fits no longer held elsewhere take their
 * predictions with them (WeakMap).
 */
export function memoisedPredictor(predict: LayerPredictor = (slug, t, minutes, fit) => predictLayer(slug, t, minutes, fit)): LayerPredictor {
  type Outcome = { layer: PredictedLayer } | { error: NoPredictionError };
  const reference = new Map<string, Outcome>();
  const byFit = new WeakMap<GrowthFit, Map<string, Outcome>>();
  return (slug, temperatureC, holdMinutes, fit) => {
    let store = fit ? byFit.get(fit) : reference;
    if (!store) byFit.set(fit!, (store = new Map()));
    const key = `${slug}|${temperatureC}|${holdMinutes}`;
    let outcome = store.get(key);
    if (!outcome) {
      try {
        outcome = { layer: predict(slug, temperatureC, holdMinutes, fit) };
      } catch (error) {
        if (!(error instanceof NoPredictionError)) throw error;
        outcome = { error };
      }
      if (store.size >= MAX_MEMOISED_PREDICTIONS) store.clear();
      store.set(key, outcome);
    }
    if ('error' in outcome) throw outcome.error;
    return outcome.layer;
  };
}

/** Every layer's band at one heat; a layer the model gives no colour there is named apart. */
function predictCell(
  alloys: readonly string[],
  temperatureC: number,
  holdMinutes: number,
  fits: Readonly<Record<string, GrowthFit | null>>,
  predict: LayerPredictor,
) {
  const layers: PredictedLayer[] = [];
  const beyond: { alloy: string; reason: string }[] = [];
  for (const alloy of alloys) {
    try {
      layers.push(predict(alloy, temperatureC, holdMinutes, fits[alloy] ?? null));
    } catch (error) {
      if (!(error instanceof NoPredictionError)) throw error;
      beyond.push({ alloy, reason: error.message });
    }
  }
  return { layers, beyond };
}

/**
 * Bins the coupons (already only the viewer's, of exactly these alloys) into the matrix and
 * predicts every cell's heat. `fits` holds each alloy's library fit for the viewer (absent or
 * null: reference data alone). `counted`, when the coupons are a sample of each cell, gives the
 * cells' full counts and the temperature span of them all. `predict` gives each layer's band
 * (predictLayer unless the caller keeps a memo of it).
 */
export function buildPairMatrix(
  alloys: readonly string[],
  coupons: readonly MatrixCoupon[],
  fits: Readonly<Record<string, GrowthFit | null>> = {},
  counted?: CellCounts,
  predict: LayerPredictor = (slug, temperatureC, holdMinutes, fit) => predictLayer(slug, temperatureC, holdMinutes, fit),
): PairMatrix {
  const sorted = [...new Set(alloys)].sort();
  const ordered = coupons.map((coupon) => orderLayers(coupon, sorted));
  const heats = ordered.filter((coupon) => coupon.process !== 'anodize');
  const binnable = heats.filter((coupon) => coupon.temperatureC !== null && coupon.holdSeconds !== null);
  const rows = temperatureRows(sorted, [...binnable.map((coupon) => coupon.temperatureC!), ...(counted?.temperaturesC ?? [])]);

  const cells: MatrixCell[] = rows.flatMap((row) =>
    holdColumns.map((column) => ({ row: row.index, column: column.index, coupons: [] as MatrixCoupon[], count: 0 })),
  );
  for (const coupon of [...binnable].sort(byHeat)) {
    const row = temperatureRowOf(rows, coupon.temperatureC!);
    cells[row * holdColumns.length + holdColumnOf(coupon.holdSeconds!)].coupons.push(coupon);
  }
  for (const [index, cell] of cells.entries()) cell.count = Math.max(cell.coupons.length, counted?.perCell.get(index) ?? 0);

  const unavailable = sorted.flatMap((alloy) => {
    const reason = heatUnavailableReason(alloy);
    return reason ? [{ alloy, reason }] : [];
  });
  const modelled = sorted.filter((alloy) => !unavailable.some((entry) => entry.alloy === alloy));
  const predicted: PredictedCell[] =
    modelled.length === 0
      ? []
      : rows.flatMap((row) =>
          holdColumns.map((column) => ({
            row: row.index,
            column: column.index,
            temperatureC: row.centreC,
            holdMinutes: column.modelMinutes,
            ...predictCell(modelled, row.centreC, column.modelMinutes, fits, predict),
          })),
        );

  return {
    alloys: sorted,
    rows,
    columns: holdColumns,
    cells,
    predicted,
    unavailable,
    anodized: ordered.filter((coupon) => coupon.process === 'anodize').sort((a, b) => (a.volts ?? 0) - (b.volts ?? 0) || a.id - b.id),
    unbinned: heats.filter((coupon) => coupon.temperatureC === null || coupon.holdSeconds === null).sort((a, b) => a.id - b.id),
  };
}

/** A row's span in the reader's unit, whole degrees: "475–525 °C", "887–977 °F". */
export function formatTemperatureSpan(row: Pick<TemperatureRow, 'lowC' | 'highC'>, unit: 'C' | 'F'): string {
  // Source: NIST SP 811 (2008) appendix B.8: t/°F = 1.8·t/°C + 32.
  const inUnit = (celsius: number) => Math.round(unit === 'F' ? celsiusToFahrenheit(celsius) : celsius);
  return `${inUnit(row.lowC)}–${inUnit(row.highC)} °${unit}`;
}

/** The /library view of one cell's coupons (its bounds are inclusive there, so a coupon on an edge also shows in its neighbour's). */
export function cellLibraryHref(alloys: readonly string[], row: TemperatureRow, column: HoldColumn): string {
  const params = new URLSearchParams(alloys.length === 1 ? { alloy: alloys[0] } : { pair: layerKeyOf(alloys) });
  params.set('tempMin', String(row.lowC));
  params.set('tempMax', String(row.highC));
  params.set('holdMin', String(column.minSeconds / 60));
  if (column.maxSeconds !== null) params.set('holdMax', String(column.maxSeconds / 60));
  params.set('sort', 'temperature');
  return `/library?${params}`;
}
