// The colours the demo's synthetic photos show (invented data, for the demo only): thin-film
// colours from the tint model for alloys that have one, and an invented heat-colour ladder for
// the copper alloys, which have no model.
import { anodizeThicknessNm, colourAt, findTintModel, heatThicknessNm, MAX_THICKNESS_NM } from '~/lib/tint';

/** What of a coupon's heat record the demo's colours depend on. */
export interface DemoHeat {
  process: string;
  temperatureC: number | null;
  holdSeconds: number | null;
  volts: number | null;
  atmosphere: string;
}

/** A purge of argon keeps the film far thinner than air would (an invented factor, for the demo). */
const ARGON_FACTOR = 0.12;

/**
 * How much faster (> 1) or slower each alloy's film grows than its model says: invented for the
 * demo and not measured, so the layers of a demo laminate differ the way real ones do (the
 * models give all titanium grades one law) and the library fit has something to find.
 */
const DEMO_GROWTH: Record<string, number> = {
  'ti-grade-1': 1.12,
  'ti-grade-2': 1.08,
  'ti-grade-4': 1.0,
  'ti-grade-5': 0.86,
  'ti-grade-9': 0.94,
  'ti-grade-23': 0.82,
  'steel-1084': 1.0,
  'steel-1095': 1.04,
  'steel-w2': 1.06,
  'steel-15n20': 0.8,
  'steel-o1': 0.9,
  'steel-52100': 0.88,
};

/** The oxide thickness the coupon's heat gives an alloy under its model, or null when the model cannot say. */
export function thicknessNm(coupon: DemoHeat, alloy: string): number | null {
  const model = findTintModel(alloy);
  if (!model?.optics) return null;
  if (coupon.process === 'anodize')
    return model.anodize && coupon.volts ? anodizeThicknessNm(model.anodize.nmPerVolt.mid, coupon.volts, model.anodize.offsetNm) : null;
  if (!model.heat || coupon.temperatureC === null || !coupon.holdSeconds) return null;
  const law = heatThicknessNm(model.heat.law, coupon.temperatureC, coupon.holdSeconds / 60);
  const grown = law * (DEMO_GROWTH[alloy] ?? 1) * (coupon.atmosphere === 'argon' ? ARGON_FACTOR : 1);
  return Math.min(grown, MAX_THICKNESS_NM);
}

/**
 * Invented heat colours of bare copper alloys in air, one step apart: the order the trade
 * describes (salmon, gold, orange, red-brown, purple, blue, a silvery green, then dull brown;
 * common practice, from memory), the hex values made up for the demo. Bronze starts golden.
 */
const COPPER_LADDERS: Record<string, { stops: string[]; lag: number }> = {
  'copper-c11000': { stops: ['#d98b6a', '#d9995a', '#c46a3c', '#9c3f3a', '#7a3a6e', '#4a5a9a', '#6f8f8a', '#5a4a40'], lag: 1 },
  'bronze-c51000': { stops: ['#c9a46a', '#d0a050', '#b9743a', '#8f4a3a', '#6c3f6a', '#4b5c8c', '#75877a', '#55473c'], lag: 0.8 },
};

/** An invented step on a copper alloy's ladder for a heat: hotter and longer go further. */
function copperStep(coupon: DemoHeat, alloy: string): number | null {
  const ladder = COPPER_LADDERS[alloy];
  if (!ladder || coupon.process === 'anodize' || coupon.temperatureC === null || !coupon.holdSeconds) return null;
  const step = ((coupon.temperatureC - 150) / 45 + Math.log2(coupon.holdSeconds / 300)) * ladder.lag;
  return Math.min(Math.max(step, 0), ladder.stops.length - 1);
}

const channels = (hex: string) => [1, 3, 5].map((at) => parseInt(hex.slice(at, at + 2), 16));

/** A colour between two stops of a ladder, mixed in sRGB (close enough for an invented demo colour). */
function between(stops: string[], step: number): string {
  const low = Math.min(Math.floor(step), stops.length - 2);
  const along = step - low;
  const [from, to] = [channels(stops[low]), channels(stops[low + 1])];
  return `#${from
    .map((value, index) =>
      Math.round(value + (to[index] - value) * along)
        .toString(16)
        .padStart(2, '0'),
    )
    .join('')}`;
}

/**
 * The colours of one layer across a coupon, from `columns` points a little cooler (3 % thinner
 * film, or less far along the ladder) to a little hotter; null when the demo has no colour for it.
 */
export function layerShades(coupon: DemoHeat, alloy: string, columns: number): string[] | null {
  const spread = (column: number) => 0.97 + (0.06 * column) / (columns - 1);
  const optics = findTintModel(alloy)?.optics;
  const film = thicknessNm(coupon, alloy);
  if (optics && film !== null) return Array.from({ length: columns }, (_, column) => colourAt(optics, film * spread(column)).hex);
  const step = copperStep(coupon, alloy);
  if (step === null) return null;
  const { stops } = COPPER_LADDERS[alloy];
  return Array.from({ length: columns }, (_, column) => between(stops, Math.min(step * spread(column), stops.length - 1)));
}
