// The app under load, against a fresh production server (load-server.ts): a static file from the
// same server gives the reference rate; each route is then driven as fast as it answers, and its
// rate is compared with the static one (absolute figures vary from machine to machine, ratios much
// less). Then fixed-rate runs (the heat planner and the library, signed in), a burst of 20 photo
// uploads with analysis, and the library list at 100 000 coupons when the library benchmark's
// database has been generated (npx tsx scripts/bench/library-database.ts --fresh).
import { loadavg, cpus } from 'node:os';
import { eq, inArray } from 'drizzle-orm';
import { createDatabase } from '../../db/client';
import { alloys, couponLayers, coupons, users } from '../../db/schema';
import { encodeJpeg, renderScene } from '../seed/synthetic-photos';
import { load, signIn, uploadBurst, type LoadResult, type LoadTarget } from './load-runs';
import { startDemoServer, startLibraryServer, type LoadServer } from './load-server';
import { printTable, type Row } from './report';

const SECONDS = 6;
const ROUNDS = 3;
const FIXED_SECONDS = 30;
const WARM_UP_SECONDS = 3;
const DEMO_PASSWORD = 'oxbloom-demo';
const STATIC: LoadTarget = { path: '/favicon.svg' };
const visitorPrediction = { alloy: 'ti-grade-5', process: 'heat', temperatureC: 400, holdMinutes: 30, atmosphere: 'air' };

const ms = (value: number) => `${value.toFixed(value < 10 ? 1 : 0)} ms`;
const describe = (result: LoadResult) =>
  `${result.rate.toFixed(0)} req/s, p50 ${ms(result.p50)}, p99 ${ms(result.p99)}, ${result.errors} errors of ${result.requests}`;
const percent = (value: number) => `${(value * 100).toFixed(0)} %`;

/** One timed run of a route and the static rate beside it (the mean of the static runs just before and after). */
interface Round {
  result: LoadResult;
  staticRate: number;
}
const share = (round: Round) => round.result.rate / round.staticRate;

/**
 * Each route in ROUNDS timed runs, each between two runs of the static file: a run's reference is
 * the mean of the static runs just before and just after it (one static run between two serves
 * both), so a machine whose speed drifts (other work, a busy neighbour on the host) moves both
 * sides of a share alike. A route's share is the median of its rounds: one slow moment of the
 * machine cannot decide it alone, and every round's share is printed.
 */
async function besideStatic(server: LoadServer, targets: LoadTarget[]): Promise<Round[][]> {
  const reference = async () => {
    const result = await load(server.baseUrl, STATIC, { seconds: SECONDS });
    if (result.errors > 0) throw new Error(`The static file answered ${result.errors} errors: the reference is no good.`);
    return result.rate;
  };
  await load(server.baseUrl, STATIC, { seconds: 2 });
  let before = await reference();
  const results: Round[][] = [];
  for (const target of targets) {
    await load(server.baseUrl, target, { seconds: 2 });
    const rounds: Round[] = [];
    for (let round = 0; round < ROUNDS; round += 1) {
      const result = await load(server.baseUrl, target, { seconds: SECONDS });
      const after = await reference();
      rounds.push({ result, staticRate: (before + after) / 2 });
      before = after;
    }
    results.push(rounds);
  }
  return results;
}

/** The median round stands for the route; errors count over all rounds, and p99 is the worst round's. */
function ratioRow(what: string, rounds: Round[], minRatio?: number, maxP99?: number): Row {
  const median = [...rounds].sort((a, b) => share(a) - share(b))[Math.floor(rounds.length / 2)];
  const errors = rounds.reduce((sum, round) => sum + round.result.errors, 0);
  const worstP99 = Math.max(...rounds.map((round) => round.result.p99));
  const ratio = share(median);
  const targets = [minRatio === undefined ? '' : `≥ ${percent(minRatio)} of static`, maxP99 === undefined ? '' : `p99 ≤ ${maxP99} ms`, 'no errors'].filter(
    Boolean,
  );
  const met = (minRatio === undefined || ratio >= minRatio) && (maxP99 === undefined || worstP99 <= maxP99) && errors === 0;
  return {
    what,
    measured: `${describe(median.result)} (median round; static ${median.staticRate.toFixed(0)} req/s); ${percent(ratio)} of static (rounds: ${rounds
      .map((round) => percent(share(round)))
      .join(', ')}); worst p99 ${ms(worstP99)}; ${errors} errors in all`,
    target: targets.join(', '),
    met,
  };
}

console.log(
  `machine: ${cpus().length} cores (${cpus()[0]?.model.trim()}), load average ${loadavg()
    .map((value) => value.toFixed(2))
    .join(' ')} before the run`,
);
const demo = await startDemoServer();
const rows: Row[] = [];
let library: LoadServer | undefined;
try {
  const member = await signIn(demo.baseUrl, 'member@oxbloom.test', DEMO_PASSWORD);
  const routes: [string, LoadTarget, number?, number?][] = [
    ['POST /api/tint/predict (visitor)', { path: '/api/tint/predict', method: 'POST', json: visitorPrediction }, 0.5, 30],
    ['GET /', { path: '/' }, 0.4],
    ['GET /tint-ladder?alloy=ti-grade-5', { path: '/tint-ladder?alloy=ti-grade-5' }, 0.4],
    ['GET /api/coupons?limit=50 (visitor)', { path: '/api/coupons?limit=50' }],
    ['GET /api/health', { path: '/api/health' }],
    ['GET / (signed in)', { path: '/', cookie: member }],
  ];
  // Every route once before any is measured, so the first measured does not pay for warming the
  // server's shared code (the JIT, the pools) that the later ones find warm.
  for (const [, target] of routes) await load(demo.baseUrl, target, { seconds: WARM_UP_SECONDS });
  const results = await besideStatic(
    demo,
    routes.map(([, target]) => target),
  );
  rows.push({
    what: 'GET /favicon.svg (static, the reference)',
    measured: `${Math.min(...results.flat().map((round) => round.staticRate)).toFixed(0)}–${Math.max(...results.flat().map((round) => round.staticRate)).toFixed(0)} req/s: the mean of the static runs just before and after each round below`,
  });
  routes.forEach(([what, , minRatio, maxP99], index) => rows.push(ratioRow(what, results[index], minRatio, maxP99)));

  for (const [what, target, rate] of [
    ['heat planner, POST /api/tint/predict (signed in)', { path: '/api/tint/predict', method: 'POST', json: visitorPrediction, cookie: member }, 100],
    ['library, GET /api/coupons?limit=50 (signed in)', { path: '/api/coupons?limit=50', cookie: member }, 50],
  ] as [string, LoadTarget, number][]) {
    const result = await load(demo.baseUrl, target, { seconds: FIXED_SECONDS, rate });
    const kept = result.rate >= rate * 0.95;
    rows.push({
      what: `${what} at ${rate} req/s for ${FIXED_SECONDS} s`,
      measured: `${result.rate.toFixed(1)} req/s, p50 ${ms(result.p50)}, p95 ${ms(result.p95)}, p99 ${ms(result.p99)}, ${result.errors} errors`,
      target: `keeps ${rate} req/s, no errors`,
      met: kept && result.errors === 0,
    });
  }

  rows.push(await uploads(demo, member));
  // The library's server uses the same profile's ports: the demo's stops first.
  await demo.stop();
  library = await startLibraryServer(demo).catch((error: unknown) => {
    console.log(`[bench] the library database did not start: ${String(error)}`);
    return undefined;
  });
  if (!library) {
    rows.push({
      what: 'GET /api/coupons?limit=50 at 100 000 coupons (visitor)',
      measured: 'skipped: no library database (npx tsx scripts/bench/library-database.ts --fresh)',
    });
  } else {
    const views: [string, LoadTarget][] = [
      ['GET /api/coupons?limit=50 at 100 000 coupons (visitor)', { path: '/api/coupons?limit=50' }],
      [
        'GET /api/coupons?limit=50&alloy=ti-grade-5&sort=temperature at 100 000 coupons (visitor)',
        { path: '/api/coupons?limit=50&alloy=ti-grade-5&sort=temperature' },
      ],
    ];
    const results = await besideStatic(
      library,
      views.map(([, target]) => target),
    );
    views.forEach(([what], index) => rows.push(ratioRow(what, results[index], 0.25)));
  }
} finally {
  await demo.stop();
  await library?.stop();
}
printTable(rows);
console.log(
  `load average after the run: ${loadavg()
    .map((value) => value.toFixed(2))
    .join(' ')}`,
);

/** 20 photos at once, ten each from two members (a person may have 20 uploads open), each to a coupon of their own. */
async function uploads(server: LoadServer, memberCookie: string): Promise<Row> {
  const { db, pool } = createDatabase(server.env.DATABASE_URL, 2);
  try {
    const member2 = await signIn(server.baseUrl, 'member2@oxbloom.test', DEMO_PASSWORD);
    const [titanium] = await db.select({ id: alloys.id }).from(alloys).where(eq(alloys.slug, 'ti-grade-2'));
    const owners = await db
      .select({ id: users.id, email: users.email })
      .from(users)
      .where(inArray(users.email, ['member@oxbloom.test', 'member2@oxbloom.test']));
    const couponOf = async (email: string) => {
      const ownerId = owners.find((owner) => owner.email === email)!.id;
      const [{ id }] = await db
        .insert(coupons)
        .values({
          ownerId,
          title: 'Load bench coupon',
          layerKey: 'ti-grade-2',
          surfacePrep: 'ground',
          process: 'oven',
          temperatureC: 560,
          holdSeconds: 1800,
          visibility: 'private',
        })
        .$returningId();
      await db.insert(couponLayers).values({ couponId: id, position: 0, alloyId: titanium.id });
      return id;
    };
    const memberCoupon = await couponOf('member@oxbloom.test');
    const member2Coupon = await couponOf('member2@oxbloom.test');
    const photo = await encodeJpeg(
      renderScene({
        width: 1600,
        height: 1200,
        background: '#2b2b2b',
        patches: [
          { region: { x: 200, y: 300, width: 500, height: 600 }, colour: '#3c5fa8' },
          { region: { x: 900, y: 300, width: 500, height: 600 }, colour: '#c9a45a' },
        ],
        noise: { sigma: 4, seed: 11, sampling: 'row' },
      }),
    );
    const jobs = Array.from({ length: 20 }, (_, index) =>
      index % 2 === 0 ? { cookie: memberCookie, couponId: memberCoupon, bytes: photo } : { cookie: member2, couponId: member2Coupon, bytes: photo },
    );
    const result = await uploadBurst(server.baseUrl, jobs);
    return {
      what: `${result.count} concurrent uploads with analysis (1600×1200 JPEG, ${(photo.length / 1024).toFixed(0)} kB)`,
      measured: `all done in ${result.seconds.toFixed(1)} s; each: p50 ${ms(result.p50)}, p95 ${ms(result.p95)}, max ${ms(result.max)}; ${result.errors} errors`,
      target: 'no errors',
      met: result.errors === 0,
    };
  } finally {
    await pool.end();
  }
}
