/**
 * The class page's swatch grid: the cohort's shared coupons grouped by alloy (or alloy pair) and
 * then by temperature, so an instructor sees everyone's result at one heat side by side.
 */

/** Temperatures are binned to this many degrees Celsius (a thermocouple's reading ±5 °C reads as one heat). */
export const COHORT_BIN_C = 10;

export interface CohortCoupon {
  id: number;
  title: string;
  ownerName: string | null;
  /** The layer key ('+'-joined sorted slugs) and the alloys' names in layer order. */
  layerKey: string;
  alloyNames: string[];
  temperatureC: number | null;
  holdSeconds: number | null;
  swatches: { alloy: string; hex: string }[];
}

export interface CohortColumn {
  /** The bin's centre in °C; null for coupons with no temperature recorded. */
  temperatureC: number | null;
  coupons: CohortCoupon[];
}

export interface CohortGroup {
  layerKey: string;
  label: string;
  columns: CohortColumn[];
}

/** The bin a temperature falls in: the nearest multiple of COHORT_BIN_C (halves round up). */
export function binOf(temperatureC: number | null): number | null {
  return temperatureC === null ? null : Math.floor(temperatureC / COHORT_BIN_C + 0.5) * COHORT_BIN_C;
}

/** Groups by layer key (labelled by alloy names, alphabetically), then by temperature bin ascending, unknown last. */
export function cohortGrid(coupons: readonly CohortCoupon[]): CohortGroup[] {
  const groups = new Map<string, CohortGroup>();
  for (const coupon of coupons) {
    const group = groups.get(coupon.layerKey) ?? { layerKey: coupon.layerKey, label: [...new Set(coupon.alloyNames)].sort().join(' + '), columns: [] };
    const bin = binOf(coupon.temperatureC);
    let column = group.columns.find((candidate) => candidate.temperatureC === bin);
    if (!column) {
      column = { temperatureC: bin, coupons: [] };
      group.columns.push(column);
    }
    column.coupons.push(coupon);
    groups.set(coupon.layerKey, group);
  }
  for (const group of groups.values()) {
    group.columns.sort((a, b) => (a.temperatureC ?? Infinity) - (b.temperatureC ?? Infinity));
    for (const column of group.columns) column.coupons.sort((a, b) => (a.holdSeconds ?? Infinity) - (b.holdSeconds ?? Infinity) || a.id - b.id);
  }
  return [...groups.values()].sort((a, b) => a.label.localeCompare(b.label));
}
