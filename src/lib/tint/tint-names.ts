import { oklabToOklch, type Lab } from '~/lib/colour';

/**
 * Tint band names: the product's own vocabulary, built from the trade's colour words.
 *
 * The rule: each colour gets a hue family from its OKLCh hue, chroma and lightness, and the name
 * also depends on the interference order, i.e. how many times the film has already run through
 * its blues (a thin film's colours repeat with thickness, so "gold" before the first blue and gold
 * after it are different films). The order is counted along a system's ladder from zero
 * thickness, so a name always belongs to a thickness on a particular alloy, never to a colour alone.
 */
/** The orders past the first a repeating name carries. */
const orders = ['second-order', 'third-order', 'higher-order'] as const;
type Order = (typeof orders)[number];
/** Colours that come back in every order after the first; each carries its order in its name. */
const repeating = ['gold', 'pale gold', 'blue', 'rose', 'violet', 'teal', 'green', 'grey'] as const;
type Repeating = (typeof repeating)[number];

const firstOrder = ['silver', 'pale straw', 'straw', 'gold', 'bronze', 'brown', 'purple', 'deep blue', 'blue', 'light blue', 'grey'] as const;

export type TintName = (typeof firstOrder)[number] | `${Order} ${Repeating}`;

export const tintNames: readonly TintName[] = [...firstOrder, ...orders.flatMap((order) => repeating.map((name) => `${order} ${name}` as const))];

/** Coarse hue families, used to count interference orders (the blues end each order). */
export type HueFamily = 'neutral' | 'yellow' | 'orange' | 'red' | 'violet' | 'blue' | 'teal' | 'green';

/** Below this OKLCh chroma a film reads as uncoloured metal (silver or grey). */
const NEUTRAL_CHROMA = 0.03;
/** Below this chroma a yellow reads as pale (pale straw, pale gold). */
const PALE_CHROMA = 0.06;

/** Hue family of an OKLab colour; hue limits in degrees of OKLCh hue. */
export function hueFamily(oklab: Lab): HueFamily {
  const { c, h } = oklabToOklch(oklab);
  if (c < NEUTRAL_CHROMA) return 'neutral';
  if (h >= 70 && h < 125) return 'yellow';
  if (h >= 40 && h < 70) return 'orange';
  if (h >= 125 && h < 185) return 'green';
  if (h >= 185 && h < 215) return 'teal';
  if (h >= 215 && h < 285) return 'blue';
  if (h >= 285 && h < 330) return 'violet';
  return 'red';
}

/** Chroma that separates straw from gold in the first order (a dark yellow is gold too). */
const GOLD_CHROMA = 0.09;

const ordinal = (order: number): Order => (order === 2 ? 'second-order' : order === 3 ? 'third-order' : 'higher-order');

/**
 * The name of a colour of the given interference order (1 = before the film's first blues end).
 * Hue limits are OKLCh degrees; lightness and chroma split a hue into the trade's words (a pale,
 * weakly coloured yellow is "pale straw", a saturated one "gold"; a light orange is "bronze", a
 * dark one "brown"; a dark blue "deep blue", a pale one "light blue").
 */
export function tintName(oklab: Lab, order: number): TintName {
  const { l, c, h } = oklabToOklch(oklab);
  if (c < NEUTRAL_CHROMA) return order <= 1 ? 'silver' : `${ordinal(order)} grey`;
  if (order <= 1) {
    if (h >= 70 && h < 125) return c < PALE_CHROMA ? 'pale straw' : c < GOLD_CHROMA && l >= 0.5 ? 'straw' : 'gold';
    if (h >= 20 && h < 70) return l >= 0.45 ? 'bronze' : 'brown';
    if (h >= 285 || h < 20) return 'purple';
    if (h >= 185 && h < 285) return l < 0.4 ? 'deep blue' : l >= 0.65 ? 'light blue' : 'blue';
    return 'grey';
  }
  const named = (name: Repeating): TintName => `${ordinal(order)} ${name}`;
  if (h >= 55 && h < 125) return named(c < PALE_CHROMA ? 'pale gold' : 'gold');
  if (h >= 330 || h < 55) return named('rose');
  if (h >= 285) return named('violet');
  if (h >= 215) return named('blue');
  if (c < PALE_CHROMA) return named('grey');
  return h >= 185 ? named('teal') : named('green');
}

/**
 * Names along a ladder with blips removed: a run shorter than `minRun` steps inside the ladder takes
 * the name of the run before it (or, between two runs of one name, that name). A hue limit crossed
 * and recrossed within a nanometre or two is the model's rounding, not a colour a smith could see.
 */
export function withoutBlips<T>(names: readonly T[], minRun: number): T[] {
  const result = [...names];
  for (let pass = 0; pass < result.length; pass += 1) {
    const runs: { name: T; start: number; end: number }[] = [];
    let start = 0;
    for (let i = 1; i <= result.length; i += 1) {
      if (i === result.length || result[i] !== result[start]) {
        runs.push({ name: result[start], start, end: i });
        start = i;
      }
    }
    const r = runs.findIndex((run, index) => index > 0 && index < runs.length - 1 && run.end - run.start < minRun);
    if (r < 0) break;
    for (let i = runs[r].start; i < runs[r].end; i += 1) result[i] = runs[r - 1].name;
  }
  return result;
}

/** Families that follow the blues as a film thickens (the start of the next order). */
const AFTER_BLUE: ReadonlySet<HueFamily> = new Set(['teal', 'green', 'neutral', 'yellow']);

/**
 * Interference orders along a ladder that starts at zero thickness: the order goes up by one each
 * time the colours move on from a run of blues towards teal, green, grey or yellow (so the films
 * after the first blues are order 2). A step back from blue into violet does not count.
 */
export function interferenceOrders(ladder: readonly Lab[]): number[] {
  const orders: number[] = [];
  let order = 1;
  let previous: HueFamily = 'neutral';
  for (const oklab of ladder) {
    const family = hueFamily(oklab);
    if (previous === 'blue' && AFTER_BLUE.has(family)) order += 1;
    if (family !== previous) previous = family;
    orders.push(order);
  }
  return orders;
}
