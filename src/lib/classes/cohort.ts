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
  /** An anodized coupon's voltage: it is placed by voltage, not temperature. */
  anodizeVolts: number | null;
  swatches: { alloy: string; hex: string }[];
}

export interface CohortColumn {
  /** What the column holds: a temperature bin's centre in °C, an anodizing voltage, or neither recorded. */
  heat: { kind: 'temperature'; celsius: number } | { kind: 'voltage'; volts: number } | { kind: 'unknown' };
  coupons: CohortCoupon[];
}

const heatOf = (coupon: CohortCoupon): CohortColumn['heat'] => {
  if (coupon.anodizeVolts !== null) return { kind: 'voltage', volts: Math.round(coupon.anodizeVolts) };
  const bin = binOf(coupon.temperatureC);
  return bin === null ? { kind: 'unknown' } : { kind: 'temperature', celsius: bin };
};
const sameHeat = (a: CohortColumn['heat'], b: CohortColumn['heat']) =>
  a.kind === b.kind && (a.kind !== 'temperature' || a.celsius === (b as typeof a).celsius) && (a.kind !== 'voltage' || a.volts === (b as typeof a).volts);
/** Temperatures rising, then voltages rising, then the unrecorded. */
const heatOrder = (heat: CohortColumn['heat']): [number, number] =>
  heat.kind === 'temperature' ? [0, heat.celsius] : heat.kind === 'voltage' ? [1, heat.volts] : [2, 0];

export interface CohortGroup {
  layerKey: string;
  label: string;
  columns: CohortColumn[];
}

/** The bin a temperature falls in: the nearest multiple of COHORT_BIN_C (halves round up). */
export function binOf(temperatureC: number | null): number | null {
  return temperatureC === null ? null : Math.floor(temperatureC / COHORT_BIN_C + 0.5) * COHORT_BIN_C;
}

/** Groups by layer key (labelled by alloy names, alphabetically), then by heat: temperature bins ascending, voltages, unknown last. */
export function cohortGrid(coupons: readonly CohortCoupon[]): CohortGroup[] {
  const groups = new Map<string, CohortGroup>();
  for (const coupon of coupons) {
    const group = groups.get(coupon.layerKey) ?? { layerKey: coupon.layerKey, label: [...new Set(coupon.alloyNames)].sort().join(' + '), columns: [] };
    const heat = heatOf(coupon);
    let column = group.columns.find((candidate) => sameHeat(candidate.heat, heat));
    if (!column) {
      column = { heat, coupons: [] };
      group.columns.push(column);
    }
    column.coupons.push(coupon);
    groups.set(coupon.layerKey, group);
  }
  for (const group of groups.values()) {
    group.columns.sort((a, b) => {
      const [kindA, valueA] = heatOrder(a.heat);
      const [kindB, valueB] = heatOrder(b.heat);
      return kindA - kindB || valueA - valueB;
    });
    for (const column of group.columns) column.coupons.sort((a, b) => (a.holdSeconds ?? Infinity) - (b.holdSeconds ?? Infinity) || a.id - b.id);
  }
  return [...groups.values()].sort((a, b) => a.label.localeCompare(b.label));
}
