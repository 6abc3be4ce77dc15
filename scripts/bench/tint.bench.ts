// Tint science figures (BRIEF.md "Figures it must reach" and issue 5): the ladder, a prediction
// with a cached fit, fitting 10 000 coupons, and one pair-planner search.
import { fitGrowth, type CouponObservation } from '~/lib/tint/fit';
import { heatThicknessNm } from '~/lib/tint/growth';
import { buildLadder, colourAt } from '~/lib/tint/ladder';
import { findTintModel } from '~/lib/tint/models';
import { planPair } from '~/lib/tint/plan-pair';
import { predictTint } from '~/lib/tint/predict';
import { seededRandom } from '~/lib/random';
import { ms, printTable, time, type Row } from './report';

const titanium = findTintModel('ti-grade-5')!;
const steel = findTintModel('steel-1084')!;

/** 10 000 synthetic Ti-6Al-4V coupons: half with a measured thickness, half with only a swatch colour. */
function syntheticCoupons(count: number): CouponObservation[] {
  // Seeded, so every run fits the same coupons.
  const random = seededRandom(42);
  return Array.from({ length: count }, (_, i) => {
    const temperatureC = 450 + random() * 200;
    const holdMinutes = 5 + random() * 115;
    const thicknessNm = heatThicknessNm(titanium.heat!.law, temperatureC, holdMinutes) * (0.85 + 0.3 * random());
    if (i % 2 === 0) return { process: 'heat', temperatureC, holdMinutes, thicknessNm };
    const { lab } = colourAt('tio2-on-titanium', thicknessNm);
    return { process: 'heat', temperatureC, holdMinutes, lab: { l: lab.l + random() - 0.5, a: lab.a + random() - 0.5, b: lab.b + random() - 0.5 } };
  });
}

const coupons = syntheticCoupons(10_000);
// Fitted once, as the app's per-process cache (src/lib/server/tint-fit.ts) serves it.
const cachedFit = fitGrowth(titanium, coupons.slice(0, 200));

const ladder = await time(() => buildLadder('tio2-on-titanium', { fromNm: 0, toNm: 600, stepNm: 1 }), 50, 5);
const predict = await time(() => predictTint(titanium, { process: 'heat', temperatureC: 560, holdMinutes: 45 }, cachedFit), 200, 10);
const fit = await time(() => fitGrowth(titanium, coupons), 10, 2);
const plan = await time(() => planPair([titanium, steel], { temperatureC: { min: 200, max: 700 }, widen: true }), 10, 2);

const rows: Row[] = [
  { what: 'tint ladder 0–600 nm at 1 nm (median)', measured: ms(ladder.median), target: '≤ 5 ms', met: ladder.median <= 5 },
  { what: 'prediction with a cached fit (median)', measured: ms(predict.median), target: '≤ 1 ms', met: predict.median <= 1 },
  { what: 'prediction with a cached fit (p95)', measured: ms(predict.p95) },
  { what: 'fit 10 000 coupons, half from colour (median)', measured: ms(fit.median), target: '≤ 100 ms', met: fit.median <= 100 },
  { what: 'pair-planner search, 200 °C × 24 holds (median)', measured: ms(plan.median), target: '≤ 200 ms', met: plan.median <= 200 },
];
printTable(rows);
if (rows.some((row) => row.met === false)) process.exitCode = 1;
