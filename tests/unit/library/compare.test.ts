import { describe, expect, it } from 'vitest';
import {
  asReference,
  compareQueryFrom,
  compareQuerySchema,
  layerDifferences,
  matchLayers,
  notShownNote,
  usableIds,
  withoutCoupon,
  type ComparedLayer,
  type LayerRef,
} from '~/lib/library/compare';

const parse = (query: string) => compareQuerySchema.safeParse(compareQueryFrom(new URLSearchParams(query)));
const idsOf = (query: string) => {
  const result = parse(query);
  if (!result.success) throw new Error(result.error.issues[0].message);
  return result.data.ids;
};
const problemOf = (query: string) => {
  const result = parse(query);
  expect(result.success, query).toBe(false);
  const issue = result.error!.issues[0];
  return { field: issue.path.join('.'), message: issue.message };
};

describe('the ids of a compare URL', () => {
  it('reads a comma list, repeated ids (a form of checkboxes) and both together, in the order given', () => {
    expect(idsOf('ids=12,40,7')).toEqual([12, 40, 7]);
    expect(idsOf('ids=12&ids=40')).toEqual([12, 40]);
    expect(idsOf('ids=12,40&ids=7')).toEqual([12, 40, 7]);
    expect(idsOf('ids=%2012%20,%2040')).toEqual([12, 40]);
  });

  it('counts a repeated id once', () => {
    expect(idsOf('ids=5,6,5&ids=6')).toEqual([5, 6]);
    expect(problemOf('ids=5,5')).toEqual({ field: 'ids', message: 'choose at least 2 coupons to compare' });
  });

  it.each([
    ['no ids at all', '', 'choose 2 to 4 coupons to compare, such as ids=12,40'],
    ['one id', 'ids=3', 'choose at least 2 coupons to compare'],
    ['five ids', 'ids=1,2,3,4,5', 'compare at most 4 coupons at a time'],
    ['a word', 'ids=1,two', 'give coupon numbers separated by commas, such as 12,40'],
    ['a negative number', 'ids=1,-2', 'give coupon numbers separated by commas, such as 12,40'],
    ['a leading zero', 'ids=1,02', 'give coupon numbers separated by commas, such as 12,40'],
    ['an exponent', 'ids=1,1e2', 'give coupon numbers separated by commas, such as 12,40'],
    ['zero', 'ids=0,1', 'give coupon numbers separated by commas, such as 12,40'],
    ['a number past any id', 'ids=1,12345678901', 'give coupon numbers separated by commas, such as 12,40'],
    ['a very long list', `ids=${'1,'.repeat(150)}2`, 'choose at most 4 coupons to compare'],
  ])('refuses %s, naming the field', (_label, query, message) => {
    expect(problemOf(query)).toEqual({ field: 'ids', message });
  });

  it('keeps the well-formed ids of a refused list for the page’s form', () => {
    expect(usableIds('7,abc,7,,12')).toEqual([7, 12]);
    expect(usableIds('1,2,3,4,5')).toEqual([1, 2, 3, 4]);
    expect(usableIds(undefined)).toEqual([]);
  });

  it('links: remove a coupon, or make one the reference, keeping the rest in order', () => {
    expect(withoutCoupon([3, 9, 4], 9)).toBe('/compare?ids=3,4');
    expect(asReference([3, 9, 4], 4)).toBe('/compare?ids=4,3,9');
  });

  it('says how many coupons are left out, never which or why', () => {
    expect(notShownNote(0)).toBeNull();
    expect(notShownNote(1)).toBe('1 coupon is not shown: it does not exist or you may not see it.');
    expect(notShownNote(2)).toBe('2 coupons are not shown: they do not exist or you may not see them.');
  });
});

const layers = (...alloys: string[]): LayerRef[] => alloys.map((alloy, position) => ({ position, alloy }));

// Hand-worked cases of the rule: same alloy first (k-th of an alloy with its k-th), then the
// layers left over in order of position.
describe('which layers correspond', () => {
  it('the same alloys in the same order: layer by position', () => {
    expect(matchLayers(layers('ti-grade-2', 'ti-grade-5'), layers('ti-grade-2', 'ti-grade-5'))).toEqual([
      { reference: 0, other: 0, by: 'alloy' },
      { reference: 1, other: 1, by: 'alloy' },
    ]);
  });

  it('the same pair stacked the other way round: by alloy, not position', () => {
    expect(matchLayers(layers('ti-grade-2', 'ti-grade-5'), layers('ti-grade-5', 'ti-grade-2'))).toEqual([
      { reference: 0, other: 1, by: 'alloy' },
      { reference: 1, other: 0, by: 'alloy' },
    ]);
  });

  it('one alloy shared: it pairs, the others pair by position', () => {
    expect(matchLayers(layers('ti-grade-2', 'ti-grade-5'), layers('ti-grade-2', 'ti-grade-9'))).toEqual([
      { reference: 0, other: 0, by: 'alloy' },
      { reference: 1, other: 1, by: 'position' },
    ]);
    expect(matchLayers(layers('ti-grade-5', 'steel-1084', 'ti-grade-2'), layers('ti-grade-2', 'copper', 'ti-grade-5'))).toEqual([
      { reference: 0, other: 2, by: 'alloy' },
      { reference: 1, other: 1, by: 'position' },
      { reference: 2, other: 0, by: 'alloy' },
    ]);
  });

  it('an alloy twice: first with first, second with second; a layer with no partner is left out', () => {
    expect(matchLayers(layers('ti-grade-2', 'steel-1084', 'ti-grade-2'), layers('ti-grade-2', 'ti-grade-2'))).toEqual([
      { reference: 0, other: 0, by: 'alloy' },
      { reference: 2, other: 1, by: 'alloy' },
    ]);
  });

  it('no alloy in common: by position', () => {
    expect(matchLayers(layers('steel-1084'), layers('ti-grade-2', 'ti-grade-5'))).toEqual([{ reference: 0, other: 0, by: 'position' }]);
  });
});

describe('ΔE00 between corresponding layers', () => {
  const layer = (position: number, alloy: string, lab: [number, number, number] | null): ComparedLayer => ({
    position,
    alloy,
    alloyName: alloy,
    swatch: lab ? { hex: '#000000', lab: { l: lab[0], a: lab[1], b: lab[2] } } : null,
  });

  it('matches Sharma, Wu & Dalal (2005) for the layers paired by alloy', () => {
    // Source: Sharma, Wu & Dalal, Color Res. Appl. 30(1):21–30 (2005), Table 1, pairs 17 and 25:
    // (50, 2.5, 0) / (73, 25, -18) → 27.1492; (60.2574, -34.0099, 36.2677) / (60.4626, -34.1751, 39.4387) → 1.2644.
    const reference = [layer(0, 'ti-grade-2', [50, 2.5, 0]), layer(1, 'ti-grade-5', [60.2574, -34.0099, 36.2677])];
    const other = [layer(0, 'ti-grade-5', [60.4626, -34.1751, 39.4387]), layer(1, 'ti-grade-2', [73, 25, -18])];
    const differences = layerDifferences(reference, other);
    expect(differences.map(({ reference: r, other: o }) => [r, o])).toEqual([
      [0, 1],
      [1, 0],
    ]);
    expect(differences[0].deltaE00).toBeCloseTo(27.1492, 4);
    expect(differences[1].deltaE00).toBeCloseTo(1.2644, 4);
  });

  it('no ΔE00 where a layer has no measured swatch', () => {
    const [difference] = layerDifferences([layer(0, 'niobium', [50, 0, 0])], [layer(0, 'niobium', null)]);
    expect(difference).toEqual({ reference: 0, other: 0, by: 'alloy', deltaE00: null });
  });
});
