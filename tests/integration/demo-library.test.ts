// What the demo library offers a member browsing by alloy pair (invented data): several pairs with
// measured public coupons, the grade 2 / grade 5 titanium pair at a spread of heats with gaps left
// for the matrix to show, and measured colours that follow the heat the way the trade knows.
import { afterAll, describe, expect, it } from 'vitest';
import { and, eq, lt, sql } from 'drizzle-orm';
import { appSettings, alloys, couponLayers, coupons, swatches } from '../../db/schema';
import { testDatabase } from '../support/database';

const { db, pool } = testDatabase();
afterAll(() => pool.end());

interface MeasuredCoupon {
  id: number;
  atmosphere: string;
  temperatureC: number;
  holdMinutes: number;
  /** Each alloy's dominant measured colour (largest-share non-mean swatch of its layer). */
  dominant: Map<string, { l: number; b: number }>;
}

/** The demo's public heat-coloured coupons of one layer key, with every layer's dominant swatch (read here, not through the app). */
async function publicMeasured(layerKey: string): Promise<MeasuredCoupon[]> {
  // Only the demo's coupons (dated before the seed's marker): other test files add coupons meanwhile.
  const [marker] = await db.select().from(appSettings).where(eq(appSettings.key, 'demo-seeded'));
  const rows = await db
    .select({
      id: coupons.id,
      atmosphere: coupons.atmosphere,
      temperatureC: coupons.temperatureC,
      holdSeconds: coupons.holdSeconds,
      alloy: alloys.slug,
      layerId: couponLayers.id,
      swatchId: swatches.id,
      share: swatches.share,
      l: swatches.labL,
      b: swatches.labB,
    })
    .from(coupons)
    .innerJoin(couponLayers, eq(couponLayers.couponId, coupons.id))
    .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
    .leftJoin(swatches, and(eq(swatches.layerId, couponLayers.id), eq(swatches.isMean, false)))
    .where(
      and(eq(coupons.layerKey, layerKey), eq(coupons.visibility, 'public'), lt(coupons.createdAt, marker.createdAt), sql`${coupons.process} <> 'anodize'`),
    );
  const byCoupon = new Map<number, MeasuredCoupon & { best: Map<string, { share: number; id: number }> }>();
  for (const row of rows) {
    if (row.temperatureC === null || row.holdSeconds === null) continue;
    const coupon = byCoupon.get(row.id) ?? {
      id: row.id,
      atmosphere: row.atmosphere,
      temperatureC: row.temperatureC,
      holdMinutes: row.holdSeconds / 60,
      dominant: new Map(),
      best: new Map(),
    };
    byCoupon.set(row.id, coupon);
    if (row.swatchId === null || row.share === null || row.l === null || row.b === null) continue;
    const best = coupon.best.get(row.alloy);
    if (!best || row.share > best.share || (row.share === best.share && row.swatchId < best.id)) {
      coupon.best.set(row.alloy, { share: row.share, id: row.swatchId });
      coupon.dominant.set(row.alloy, { l: row.l, b: row.b });
    }
  }
  return [...byCoupon.values()].filter((coupon) => coupon.dominant.size > 0);
}

/** Coupons heated in air: what the pair matrix and the tint ladder speak of. */
const inAir = (measured: MeasuredCoupon[]) => measured.filter((coupon) => coupon.atmosphere === 'air');

/** The hold columns of the library's pair matrix, in minutes: ≤ 5, 5–15, 15–30, 30–60, 60–120. */
const HOLD_COLUMNS = [5, 15, 30, 60, 120];
const holdColumn = (minutes: number) => HOLD_COLUMNS.findIndex((limit) => minutes <= limit);

describe('the demo library', () => {
  it('has measured public coupons of several alloy pairs: three titanium pairs, a steel pair and copper with bronze', async () => {
    for (const pair of ['ti-grade-2+ti-grade-5', 'ti-grade-1+ti-grade-5', 'ti-grade-2+ti-grade-23', 'steel-1084+steel-15n20', 'bronze-c51000+copper-c11000']) {
      const measured = await publicMeasured(pair);
      expect(measured.length, pair).toBeGreaterThanOrEqual(3);
      // A pair view shows both layers: every one of these coupons has a dominant swatch per alloy.
      for (const coupon of measured) expect([...coupon.dominant.keys()].sort().join('+'), `${pair} coupon ${coupon.id}`).toBe(pair);
    }
  });

  it('gives the grade 2 / grade 5 titanium pair a dominant swatch per layer on every photographed public coupon', async () => {
    const [marker] = await db.select().from(appSettings).where(eq(appSettings.key, 'demo-seeded'));
    const photographed = await db
      .select({ id: coupons.id })
      .from(coupons)
      .where(
        and(
          eq(coupons.layerKey, 'ti-grade-2+ti-grade-5'),
          eq(coupons.visibility, 'public'),
          lt(coupons.createdAt, marker.createdAt),
          sql`exists (select 1 from photos where photos.coupon_id = ${coupons.id})`,
        ),
      );
    const measured = new Map((await publicMeasured('ti-grade-2+ti-grade-5')).map((coupon) => [coupon.id, coupon]));
    expect(photographed.length).toBeGreaterThanOrEqual(12);
    for (const { id } of photographed) expect(measured.get(id)?.dominant.size, `coupon ${id}`).toBe(2);
  });

  it('spreads the grade 2 / grade 5 pair over 450–700 °C and every hold column, with empty cells left in the matrix', async () => {
    const measured = inAir(await publicMeasured('ti-grade-2+ti-grade-5')).filter(
      (coupon) => coupon.temperatureC >= 450 && coupon.temperatureC < 750 && coupon.holdMinutes <= 120,
    );
    const cells = new Set(measured.map((coupon) => `${Math.floor(coupon.temperatureC / 50) * 50}/${holdColumn(coupon.holdMinutes)}`));
    const bands = new Set(measured.map((coupon) => Math.floor(coupon.temperatureC / 50) * 50));
    expect(bands.size).toBeGreaterThanOrEqual(5);
    for (const column of HOLD_COLUMNS.keys())
      expect(
        measured.some((coupon) => holdColumn(coupon.holdMinutes) === column),
        `hold column ${column}`,
      ).toBe(true);
    // Filled cells, and gaps between them: the matrix is neither empty nor full.
    expect(cells.size).toBeGreaterThanOrEqual(12);
    expect(cells.size).toBeLessThan(bands.size * HOLD_COLUMNS.length);
  });

  it('measures titanium from pale straw at light heats to blue after long holds at 550–650 °C', async () => {
    // Common practice (from memory): titanium heated in air runs pale straw, gold, bronze, purple,
    // then blue and light blue as the heat or the hold grows.
    const measured = inAir(await publicMeasured('ti-grade-2+ti-grade-5'));
    const light = measured.filter((coupon) => coupon.temperatureC <= 500 && coupon.holdMinutes <= 15);
    const long = measured.filter((coupon) => coupon.temperatureC >= 550 && coupon.temperatureC <= 650 && coupon.holdMinutes >= 45);
    expect(light.length).toBeGreaterThan(0);
    expect(long.length).toBeGreaterThan(0);
    for (const coupon of light) {
      const grade2 = coupon.dominant.get('ti-grade-2')!;
      expect(grade2.l, `coupon ${coupon.id}`).toBeGreaterThan(60);
      expect(grade2.b, `coupon ${coupon.id}`).toBeGreaterThan(0);
    }
    for (const coupon of long) expect(coupon.dominant.get('ti-grade-2')!.b, `coupon ${coupon.id}`).toBeLessThan(0);
  });

  it('spans the temper range on the 1084 / 15N20 pair, straw at 200–220 °C and blue at 280–320 °C', async () => {
    // Source: temper colour charts of the tool-making handbooks (from memory): straw around
    // 200–240 °C, brown and purple around 250–270 °C, blue around 280–320 °C.
    const measured = inAir(await publicMeasured('steel-1084+steel-15n20'));
    expect(
      new Set(measured.filter((coupon) => coupon.temperatureC >= 200 && coupon.temperatureC <= 340).map((coupon) => coupon.temperatureC)).size,
    ).toBeGreaterThanOrEqual(5);
    const straw = measured.filter((coupon) => coupon.temperatureC <= 220);
    const blue = measured.filter((coupon) => coupon.temperatureC >= 280 && coupon.temperatureC <= 320);
    expect(straw.length).toBeGreaterThan(0);
    expect(blue.length).toBeGreaterThan(0);
    for (const coupon of straw) expect(coupon.dominant.get('steel-1084')!.b, `coupon ${coupon.id}`).toBeGreaterThan(0);
    for (const coupon of blue) expect(coupon.dominant.get('steel-1084')!.b, `coupon ${coupon.id}`).toBeLessThan(0);
  });
});
