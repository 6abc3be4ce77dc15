import { describe, expect, it } from 'vitest';
import { binOf, cohortGrid, type CohortCoupon } from '~/lib/classes/cohort';

const coupon = (
  id: number,
  layerKey: string,
  alloyNames: string[],
  temperatureC: number | null,
  holdSeconds: number | null = null,
  anodizeVolts: number | null = null,
): CohortCoupon => ({
  id,
  title: `Coupon ${id}`,
  ownerName: 'A student',
  layerKey,
  alloyNames,
  temperatureC,
  holdSeconds,
  anodizeVolts,
  swatches: [],
});

describe('binOf', () => {
  // Source: rounding to the nearest 10, halves up, worked by hand.
  it.each([
    [254.9, 250],
    [255, 260],
    [260, 260],
    [264.99, 260],
    [-5, 0],
    [null, null],
  ])('%s °C falls in the %s °C column', (temperature, bin) => {
    expect(binOf(temperature)).toBe(bin);
  });
});

describe('cohortGrid', () => {
  it('groups by alloy pair, then by temperature ascending with unknown temperatures last, then by hold', () => {
    const grid = cohortGrid([
      coupon(1, 'steel-1084', ['1084 steel'], 300),
      coupon(2, 'ti-grade-2+ti-grade-5', ['Ti grade 5', 'Ti grade 2'], 420),
      coupon(3, 'steel-1084', ['1084 steel'], 251, 1200),
      coupon(4, 'steel-1084', ['1084 steel'], null),
      coupon(5, 'steel-1084', ['1084 steel'], 248, 300),
      coupon(6, 'ti-grade-2+ti-grade-5', ['Ti grade 2', 'Ti grade 5'], 418),
    ]);
    // Labels: alloy names sorted, so either layer order reads the same; groups sorted by label.
    expect(grid.map((group) => group.label)).toEqual(['1084 steel', 'Ti grade 2 + Ti grade 5']);
    const steel = grid[0];
    expect(steel.columns.map((column) => column.heat)).toEqual([
      { kind: 'temperature', celsius: 250 },
      { kind: 'temperature', celsius: 300 },
      { kind: 'unknown' },
    ]);
    expect(steel.columns[0].coupons.map((entry) => entry.id)).toEqual([5, 3]);
    expect(grid[1].columns).toHaveLength(1);
    expect(grid[1].columns[0].coupons.map((entry) => entry.id)).toEqual([2, 6]);
  });

  it('places anodized coupons by voltage, after the heated ones', () => {
    const grid = cohortGrid([
      coupon(1, 'ti-grade-2', ['Titanium Grade 2'], null, null, 58),
      coupon(2, 'ti-grade-2', ['Titanium Grade 2'], 400),
      coupon(3, 'ti-grade-2', ['Titanium Grade 2'], null, null, 17.6),
      coupon(4, 'ti-grade-2', ['Titanium Grade 2'], null, null, 18),
    ]);
    expect(grid[0].columns.map((column) => column.heat)).toEqual([
      { kind: 'temperature', celsius: 400 },
      { kind: 'voltage', volts: 18 },
      { kind: 'voltage', volts: 58 },
    ]);
    expect(grid[0].columns[1].coupons.map((entry) => entry.id)).toEqual([3, 4]);
  });

  it('is empty for no coupons', () => {
    expect(cohortGrid([])).toEqual([]);
  });
});
