import { describe, expect, it } from 'vitest';
import {
  alloyParamsSchema,
  cellLibraryHref,
  formatTemperatureSpan,
  buildPairMatrix,
  holdColumnOf,
  holdColumns,
  matrixPath,
  memoisedPredictor,
  pairParamsSchema,
  predictLayer,
  temperatureRowOf,
  temperatureRows,
  type LayerPredictor,
  type MatrixCoupon,
} from '~/lib/library/pair-matrix';
import { fitGrowth, type GrowthFit } from '~/lib/tint';
import { colourAt } from '~/lib/tint/ladder';
import { heatThicknessNm } from '~/lib/tint/growth';
import { findTintModel } from '~/lib/tint/models';

let nextId = 1;
function coupon(temperatureC: number | null, holdMinutes: number | null, layers: [string, string | null][], extra: Partial<MatrixCoupon> = {}): MatrixCoupon {
  return {
    id: nextId++,
    title: `Coupon at ${temperatureC} °C`,
    process: 'oven',
    temperatureC,
    holdSeconds: holdMinutes === null ? null : Math.round(holdMinutes * 60),
    volts: null,
    atmosphere: 'air',
    visibility: 'public',
    layers: layers.map(([alloy, hex], position) => ({ position, alloy, swatch: hex ? { hex, lab: { l: 50, a: 0, b: 0 } } : null })),
    ...extra,
  };
}

const centres = (rows: { centreC: number }[]) => rows.map((row) => row.centreC);

describe('hold columns', () => {
  // Hand-worked: bands are closed above (≤ 5, 5–15, 15–30, 30–60, 60–120, > 120 minutes).
  it.each([
    [0, 0],
    [30, 0],
    [300, 0],
    [301, 1],
    [900, 1],
    [901, 2],
    [1800, 2],
    [3600, 3],
    [3601, 4],
    [7200, 4],
    [7201, 5],
    [86_400, 5],
  ])('a hold of %i s is in column %i', (seconds, column) => {
    expect(holdColumnOf(seconds)).toBe(column);
  });

  it('evaluates the model inside each band', () => {
    for (const column of holdColumns) {
      expect(column.modelMinutes * 60).toBeGreaterThan(column.minSeconds);
      if (column.maxSeconds !== null) expect(column.modelMinutes * 60).toBeLessThanOrEqual(column.maxSeconds);
    }
  });
});

describe('temperature rows', () => {
  it('titanium with no coupons: the planner range 350–750 °C at a 50 °C step (25 °C would need 17 rows)', () => {
    const rows = temperatureRows(['ti-grade-2', 'ti-grade-5'], []);
    expect(centres(rows)).toEqual([350, 400, 450, 500, 550, 600, 650, 700, 750]);
    expect(rows[3]).toEqual({ index: 3, centreC: 500, lowC: 475, highC: 525 });
  });

  it('carbon steel: 190–340 °C at a 25 °C step (10 °C would need 16 rows), centres 200–350', () => {
    expect(centres(temperatureRows(['steel-1084', 'steel-15n20'], []))).toEqual([200, 225, 250, 275, 300, 325, 350]);
  });

  it('a coupon far outside the usual range widens the rows and coarsens the step', () => {
    // 350–1000 °C: at 50 °C that is rows 350…1000 (14 > 12), at 100 °C rows 400…1000 (7).
    expect(centres(temperatureRows(['ti-grade-2'], [1000]))).toEqual([400, 500, 600, 700, 800, 900, 1000]);
  });

  it('a titanium–steel laminate spans both families: 190–750 °C in 12 rows of 50 °C', () => {
    expect(centres(temperatureRows(['ti-grade-2', 'steel-1084'], []))).toEqual([200, 250, 300, 350, 400, 450, 500, 550, 600, 650, 700, 750]);
  });

  it('a row holds its lower edge and not its upper one', () => {
    const rows = temperatureRows(['ti-grade-5'], []);
    expect(rows[temperatureRowOf(rows, 475)].centreC).toBe(500);
    expect(rows[temperatureRowOf(rows, 524.99)].centreC).toBe(500);
    expect(rows[temperatureRowOf(rows, 525)].centreC).toBe(550);
    expect(temperatureRowOf(rows, 100)).toBe(-1);
  });
});

describe('binning coupons', () => {
  const pair = ['ti-grade-2', 'ti-grade-5'];
  const a = coupon(500, 60, [
    ['ti-grade-2', '#c09040'],
    ['ti-grade-5', '#8060a0'],
  ]);
  const b = coupon(524, 60.5, [
    ['ti-grade-5', '#3050a0'],
    ['ti-grade-2', null],
  ]);
  const c = coupon(601, 5, [
    ['ti-grade-2', '#4060b0'],
    ['ti-grade-5', '#5070c0'],
  ]);
  const noHold = coupon(550, null, [
    ['ti-grade-2', null],
    ['ti-grade-5', null],
  ]);
  const anodized = coupon(null, null, [['ti-grade-2', '#304080']], { process: 'anodize', volts: 30 });
  const matrix = buildPairMatrix(pair, [c, b, a, noHold, anodized]);
  const cell = (centreC: number, column: number) => matrix.cells.find((entry) => matrix.rows[entry.row].centreC === centreC && entry.column === column)!;

  it('puts each coupon in the cell of its heat, every row × column present', () => {
    expect(matrix.cells).toHaveLength(matrix.rows.length * holdColumns.length);
    // Hand-worked: 500 °C, 60 min → row 500, "30–60 min"; 524 °C, 60.5 min → row 500, "1–2 h"; 601 °C, 5 min → row 600, "≤ 5 min".
    expect(cell(500, 3).coupons.map((entry) => entry.id)).toEqual([a.id]);
    expect(cell(500, 4).coupons.map((entry) => entry.id)).toEqual([b.id]);
    expect(cell(600, 0).coupons.map((entry) => entry.id)).toEqual([c.id]);
    expect(matrix.cells.reduce((sum, entry) => sum + entry.coupons.length, 0)).toBe(3);
  });

  it('keeps heats without a hold and anodized coupons out of the cells, listed apart', () => {
    expect(matrix.unbinned.map((entry) => entry.id)).toEqual([noHold.id]);
    expect(matrix.anodized.map((entry) => entry.id)).toEqual([anodized.id]);
  });

  it('shows layers in the pair’s alloy order whatever their position in the laminate', () => {
    const layers = cell(500, 4).coupons[0].layers;
    expect(layers.map((layer) => [layer.alloy, layer.position, layer.swatch?.hex ?? null])).toEqual([
      ['ti-grade-2', 1, null],
      ['ti-grade-5', 0, '#3050a0'],
    ]);
  });

  it('gives the same matrix for the pair in either order', () => {
    expect(buildPairMatrix(['ti-grade-5', 'ti-grade-2'], [a, b, c, noHold, anodized])).toEqual(matrix);
    expect(matrix.alloys).toEqual(pair);
  });
});

describe('the model’s band per cell', () => {
  const matrix = buildPairMatrix(['ti-grade-5', 'ti-grade-2'], []);
  const predicted = (centreC: number, column: number) =>
    matrix.predicted.find((entry) => matrix.rows[entry.row].centreC === centreC && entry.column === column)!;

  it('at 600 °C and 45 min follows the published 1 h thickness by the parabolic law', () => {
    // Source: Int. J. Biomaterials 2015, article 395657, Table 1: Ti-6Al-4V, 1 h in air at 600 °C → ≈ 50 nm.
    // The parabolic law d² ∝ t (Wagner; the heat planner's titanium law) gives 50·√(45/60) nm after 45 min.
    const expectedNm = 50 * Math.sqrt(45 / 60);
    const cell = predicted(600, 3);
    expect(cell.temperatureC).toBe(600);
    expect(cell.holdMinutes).toBe(45);
    for (const layer of cell.layers) {
      expect(layer.thicknessNm.mid).toBeCloseTo(expectedNm, 1);
      expect(layer.hex).toBe(colourAt('tio2-on-titanium', expectedNm).hex);
      expect(layer.basis).toBe('reference');
    }
    expect(cell.layers.map((layer) => layer.alloy)).toEqual(['ti-grade-2', 'ti-grade-5']);
  });

  it('every cell’s colour equals the growth law and thin-film colour called directly', () => {
    const law = findTintModel('ti-grade-5')!.heat!.law;
    for (const cell of matrix.predicted) {
      const direct = colourAt('tio2-on-titanium', heatThicknessNm(law, cell.temperatureC, cell.holdMinutes));
      for (const layer of cell.layers) expect(layer.hex).toBe(direct.hex);
    }
    expect(matrix.predicted).toHaveLength(matrix.rows.length * holdColumns.length);
  });

  it('marks heats outside the reference data’s temperatures as extrapolated', () => {
    // Source: models.ts cites the titanium data as covering about 450–650 °C (Int. J. Biomaterials 2015).
    expect(predicted(400, 3).layers.every((layer) => layer.extrapolated)).toBe(true);
    expect(predicted(550, 3).layers.every((layer) => layer.extrapolated)).toBe(false);
  });

  it('says once why an alloy without a model gets no band, and predicts the other layer', () => {
    const mixed = buildPairMatrix(['steel-304', 'ti-grade-2'], []);
    expect(mixed.unavailable).toEqual([{ alloy: 'steel-304', reason: expect.stringMatching(/304 stainless has no optical film model yet/) }]);
    expect(mixed.predicted.every((cell) => cell.layers.length === 1 && cell.layers[0].alloy === 'ti-grade-2')).toBe(true);
    const copper = buildPairMatrix(['copper-c11000'], []);
    expect(copper.predicted).toEqual([]);
    expect(copper.unavailable).toHaveLength(1);
    // No coupons and no growth model: the family's span, 150–450 °C, in 50 °C rows (25 °C would need 13).
    expect(centres(copper.rows)).toEqual([150, 200, 250, 300, 350, 400, 450]);
  });

  it('zirconium has optics but no heat kinetics: unavailable for heats', () => {
    expect(buildPairMatrix(['zirconium-702'], []).unavailable[0].reason).toMatch(/heat-growth kinetics/);
  });
});

describe('route parameters', () => {
  it('reads a pair in either order, with + or a space (a + decoded from a query)', () => {
    expect(pairParamsSchema.parse({ pair: 'ti-grade-5+ti-grade-2' }).pair).toEqual(['ti-grade-2', 'ti-grade-5']);
    expect(pairParamsSchema.parse({ pair: 'ti-grade-2 ti-grade-5' }).pair).toEqual(['ti-grade-2', 'ti-grade-5']);
    expect(pairParamsSchema.parse({ pair: 'ti-grade-5%2Bti-grade-2' }).pair).toEqual(['ti-grade-2', 'ti-grade-5']);
    expect(matrixPath(['ti-grade-5', 'ti-grade-2'])).toBe('/library/pairs/ti-grade-2+ti-grade-5');
    expect(matrixPath(['niobium'])).toBe('/library/alloys/niobium');
  });

  it.each([
    ['unobtainium+ti-grade-2', /“unobtainium” is not an alloy/],
    ['ti-grade-2', /two alloys/],
    ['ti-grade-2+ti-grade-5+steel-1084', /two alloys/],
    ['ti-grade-2+ti-grade-2', /two different alloys/],
    ['x'.repeat(101), /longer/],
  ])('refuses %s, naming the field', (pair, message) => {
    const result = pairParamsSchema.safeParse({ pair });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0].path).toEqual(['pair']);
    expect(result.error!.issues[0].message).toMatch(message);
  });

  it('reads one alloy and refuses two or an unknown one', () => {
    expect(alloyParamsSchema.parse({ alloy: 'niobium' }).alloy).toEqual(['niobium']);
    expect(alloyParamsSchema.safeParse({ alloy: 'niobium+ti-grade-2' }).success).toBe(false);
    expect(alloyParamsSchema.safeParse({ alloy: 'steel' }).error!.issues[0].path).toEqual(['alloy']);
  });
});

describe('labels and links', () => {
  it('writes a row’s span in °C or °F', () => {
    // Source: NIST SP 811 (2008) appendix B.8: 475 °C = 887 °F, 525 °C = 977 °F.
    expect(formatTemperatureSpan({ lowC: 475, highC: 525 }, 'C')).toBe('475–525 °C');
    expect(formatTemperatureSpan({ lowC: 475, highC: 525 }, 'F')).toBe('887–977 °F');
  });

  it('links a cell to the library filtered to its heats', () => {
    const rows = temperatureRows(['ti-grade-2', 'ti-grade-5'], []);
    const href = new URL(cellLibraryHref(['ti-grade-5', 'ti-grade-2'], rows[3], holdColumns[1]), 'http://x');
    expect(Object.fromEntries(href.searchParams)).toEqual({
      pair: 'ti-grade-2+ti-grade-5',
      tempMin: '475',
      tempMax: '525',
      holdMin: '5',
      holdMax: '15',
      sort: 'temperature',
    });
    expect(new URL(cellLibraryHref(['niobium'], rows[0], holdColumns[5]), 'http://x').searchParams.get('holdMax')).toBeNull();
  });
});

describe('a steel heat past its temper range', () => {
  it('gives that layer no model colour in the cell and says why, instead of failing the matrix', () => {
    // Common practice (no source): a carbon steel held an hour at 600 °C is far past the blues and
    // greys of tempering and comes out scaled, so the model must not give it a temper colour.
    const matrix = buildPairMatrix(['steel-1084'], [coupon(600, 60, [['steel-1084', null]])]);
    const hot = matrix.predicted.filter((cell) => cell.temperatureC >= 600);
    expect(hot.length).toBeGreaterThan(0);
    for (const cell of hot) {
      expect(cell.layers).toEqual([]);
      expect(cell.beyond).toEqual([{ alloy: 'steel-1084', reason: expect.stringMatching(/past the temper range/) }]);
    }
  });
});

describe('the model’s bands remembered per fit', () => {
  /** predictLayer, counting its calls and the fits it was given. */
  function counting() {
    const calls: (GrowthFit | null)[] = [];
    const predict: LayerPredictor = (slug, temperatureC, holdMinutes, fit) => {
      calls.push(fit);
      return predictLayer(slug, temperatureC, holdMinutes, fit);
    };
    return { calls, predict };
  }
  // Fits as libraryFit hands them out: one object per alloy, audience and library version. The
  // coupon's colour is invented; only the fits' identity matters to the memo.
  const fitOf = (b: number): GrowthFit => fitGrowth('ti-grade-5', [{ process: 'heat', temperatureC: 600, holdMinutes: 60, lab: { l: 45, a: 5, b } }]);

  it('a repeat of a matrix predicts nothing and gives the same bands as predicting afresh', () => {
    const { calls, predict } = counting();
    const memo = memoisedPredictor(predict);
    const first = buildPairMatrix(['ti-grade-2', 'ti-grade-5'], [], {}, undefined, memo);
    const predictions = calls.length;
    expect(predictions).toBe(first.rows.length * holdColumns.length * 2);
    const again = buildPairMatrix(['ti-grade-2', 'ti-grade-5'], [], {}, undefined, memo);
    expect(calls.length).toBe(predictions);
    // Source of truth: the matrix built with predictLayer itself, no memo.
    expect(again.predicted).toEqual(buildPairMatrix(['ti-grade-2', 'ti-grade-5'], []).predicted);
  });

  it('a new fit (the library version moved) is predicted afresh, with that fit', () => {
    const { calls, predict } = counting();
    const memo = memoisedPredictor(predict);
    const before = fitOf(1);
    memo('ti-grade-5', 600, 45, before);
    memo('ti-grade-5', 600, 45, before);
    expect(calls).toEqual([before]);
    const after = fitOf(2);
    memo('ti-grade-5', 600, 45, after);
    expect(calls).toEqual([before, after]);
    memo('ti-grade-5', 600, 45, null);
    memo('ti-grade-5', 600, 45, null);
    expect(calls).toEqual([before, after, null]);
  });

  it('remembers a heat the model gives no colour, and says why each time', () => {
    const { calls, predict } = counting();
    const memo = memoisedPredictor(predict);
    const direct = buildPairMatrix(['steel-1084'], [coupon(700, 30, [['steel-1084', null]])]);
    const beyond = direct.predicted.filter((cell) => cell.beyond.length > 0);
    expect(beyond.length, 'a steel heat past its temper range').toBeGreaterThan(0);
    buildPairMatrix(['steel-1084'], [coupon(700, 30, [['steel-1084', null]])], {}, undefined, memo);
    const predictions = calls.length;
    const again = buildPairMatrix(['steel-1084'], [coupon(700, 30, [['steel-1084', null]])], {}, undefined, memo);
    expect(calls.length).toBe(predictions);
    expect(again.predicted).toEqual(direct.predicted);
  });
});
