import { z } from 'zod';
import { deltaE2000, type Lab } from '~/lib/colour';

/**
 * Putting two to four coupons side by side: the `ids` of the URL, which layers correspond, and the
 * ΔE00 between corresponding layers' dominant swatches. Pure; the server loads the coupons.
 */

export const MIN_COMPARED = 2;
export const MAX_COMPARED = 4;

/** Longest `ids` text read (four nine-digit numbers and their commas fit well inside). */
const MAX_IDS_TEXT = 200;
const ID_PATTERN = /^[1-9]\d{0,8}$/;

/**
 * `ids` as the URL gives it: `ids=1,2,3`, repeated `ids=1&ids=2` (what a GET form of checkboxes
 * sends), or both, joined with commas by compareQueryFrom. Repeats of an id count once.
 */
export const compareQuerySchema = z.object({
  ids: z
    .string({ error: `choose ${MIN_COMPARED} to ${MAX_COMPARED} coupons to compare, such as ids=12,40` })
    .max(MAX_IDS_TEXT, { error: `choose at most ${MAX_COMPARED} coupons to compare` })
    .transform((text, context) => {
      const parts = text
        .split(',')
        .map((part) => part.trim())
        .filter((part) => part !== '');
      if (parts.some((part) => !ID_PATTERN.test(part))) {
        context.addIssue({ code: 'custom', message: 'give coupon numbers separated by commas, such as 12,40' });
        return z.NEVER;
      }
      return [...new Set(parts.map(Number))];
    })
    .pipe(
      z
        .array(z.number())
        .min(MIN_COMPARED, { error: `choose at least ${MIN_COMPARED} coupons to compare` })
        .max(MAX_COMPARED, { error: `compare at most ${MAX_COMPARED} coupons at a time` }),
    ),
});
export type CompareQuery = z.output<typeof compareQuerySchema>;

/** The raw query of a compare URL: every `ids` value joined, or none when the URL has no `ids`. */
export function compareQueryFrom(params: URLSearchParams): { ids?: string } {
  const values = params.getAll('ids');
  return values.length === 0 ? {} : { ids: values.join(',') };
}

/** The well-formed ids of a refused `ids` (at most MAX_COMPARED), so a page can keep them in its form. */
export function usableIds(ids: string | undefined): number[] {
  const parts = (ids ?? '')
    .slice(0, MAX_IDS_TEXT)
    .split(',')
    .map((part) => part.trim());
  return [...new Set(parts.filter((part) => ID_PATTERN.test(part)).map(Number))].slice(0, MAX_COMPARED);
}

/** A refusal of the `ids` as a sentence for the page ("Choose at least 2 coupons to compare."). */
export const compareProblemSentence = (message: string): string => `${message.charAt(0).toUpperCase()}${message.slice(1)}.`;

/** The shareable URL of a comparison. */
export const compareHref = (ids: readonly number[]): string => `/compare?ids=${ids.join(',')}`;

/** The comparison without one coupon (with one left, the URL still shows it). */
export const withoutCoupon = (ids: readonly number[], id: number): string => compareHref(ids.filter((other) => other !== id));

/** The comparison with one coupon moved first, so the others are measured against it. */
export const asReference = (ids: readonly number[], id: number): string => compareHref([id, ...ids.filter((other) => other !== id)]);

export interface LayerRef {
  position: number;
  alloy: string;
}

export interface LayerMatch {
  /** Position of the layer in the reference coupon. */
  reference: number;
  /** Position of the corresponding layer in the other coupon. */
  other: number;
  /** Matched as the same alloy, or (different alloys) by order among the layers left over. */
  by: 'alloy' | 'position';
}

export const LAYER_MATCHING_RULE =
  'Layers are paired with the first coupon’s: first a layer of the same alloy (in layer order when an alloy appears more than once), ' +
  'then the layers left over, in layer order. With the same alloys in the same order, that is simply layer 1 with layer 1, layer 2 with layer 2.';

/**
 * Which layer of `other` corresponds to which layer of `reference`. Same alloys first: the k-th
 * layer of an alloy in one coupon with the k-th layer of that alloy in the other. The layers left
 * unpaired then pair in order of position. Layers with no partner are left out.
 */
export function matchLayers(reference: readonly LayerRef[], other: readonly LayerRef[]): LayerMatch[] {
  const byPosition = (a: LayerRef, b: LayerRef) => a.position - b.position;
  const left = [...reference].sort(byPosition);
  const right = [...other].sort(byPosition);
  const matches: LayerMatch[] = [];
  const usedRight = new Set<number>();
  const unmatchedLeft: LayerRef[] = [];
  for (const layer of left) {
    const partner = right.find((candidate) => candidate.alloy === layer.alloy && !usedRight.has(candidate.position));
    if (partner) {
      usedRight.add(partner.position);
      matches.push({ reference: layer.position, other: partner.position, by: 'alloy' });
    } else unmatchedLeft.push(layer);
  }
  const unmatchedRight = right.filter((layer) => !usedRight.has(layer.position));
  for (let i = 0; i < Math.min(unmatchedLeft.length, unmatchedRight.length); i += 1) {
    matches.push({ reference: unmatchedLeft[i].position, other: unmatchedRight[i].position, by: 'position' });
  }
  return matches.sort((a, b) => a.reference - b.reference);
}

export interface ComparedSwatch {
  hex: string;
  lab: Lab;
}

export interface ComparedLayer extends LayerRef {
  alloyName: string;
  swatch: ComparedSwatch | null;
}

export interface LayerDifference extends LayerMatch {
  /** ΔE00 (CIEDE2000, kL = kC = kH = 1) between the two layers' dominant swatches; null when either has none. */
  deltaE00: number | null;
}

/** ΔE00 between two measured swatches. */
export const swatchDifference = (first: ComparedSwatch, second: ComparedSwatch): number => deltaE2000(first.lab, second.lab);

/** The corresponding layers of two coupons and the ΔE00 between their dominant swatches. */
export function layerDifferences(reference: readonly ComparedLayer[], other: readonly ComparedLayer[]): LayerDifference[] {
  return matchLayers(reference, other).map((match) => {
    const a = reference.find((layer) => layer.position === match.reference)?.swatch;
    const b = other.find((layer) => layer.position === match.other)?.swatch;
    return { ...match, deltaE00: a && b ? swatchDifference(a, b) : null };
  });
}

/** "1 coupon is not shown…" for ids left out because they name nothing the caller may see. */
export function notShownNote(count: number): string | null {
  if (count === 0) return null;
  return `${count} coupon${count === 1 ? ' is' : 's are'} not shown: ${count === 1 ? 'it does' : 'they do'} not exist or you may not see ${count === 1 ? 'it' : 'them'}.`;
}
