// Heat-planner requests with a cached library fit (BRIEF.md "Figures it must reach": p95 ≤ 25 ms
// at 100 requests/s). Starts its own services and the built app on bench ports with a throwaway
// database (data under .data/bench/), fills the library with synthetic swatched coupons (invented
// data), signs in as the demo member and sends POST /api/tint/predict at a steady 100 requests/s.
// Latency is timed from each request's scheduled send time, so a stall also delays the ones behind
// it (no coordinated omission). Also times the same handler path inside this process.
import { randomBytes } from 'node:crypto';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ms, printTable, summarise, time, type Row, type Timing } from './report';

const loadAverage = () => os.loadavg()[0].toFixed(1);
const root = fileURLToPath(new URL('../..', import.meta.url));
const RATE_PER_SECOND = 100;
const DURATION_SECONDS = 10;
const LIBRARY_COUPONS = 300;
const ALLOY = 'ti-grade-5';

const { loadProfile, appEnvironment } = await import('../services/profile.mjs');
const { startServices, startApp, stopServices } = await import('../services/index.mjs');
const { migrate, seed, build } = await import('../services/tasks.mjs');
const { isPortFree } = await import('../services/processes.mjs');

// Ports of its own (each can be moved with the variable named here) and a data root of its own.
const benchPorts = {
  app: ['OXBLOOM_BENCH_PORT', '4471'],
  db: ['OXBLOOM_BENCH_DB_PORT', '3457'],
  s3: ['OXBLOOM_BENCH_S3_PORT', '4719'],
  smtp: ['OXBLOOM_BENCH_SMTP_PORT', '2675'],
  inbox: ['OXBLOOM_BENCH_INBOX_PORT', '4730'],
} as const;
type Service = keyof typeof benchPorts;
const portOf = (service: Service) => process.env[benchPorts[service][0]] ?? benchPorts[service][1];
const profile = loadProfile('test', {
  OXBLOOM_TEST_PORT: portOf('app'),
  OXBLOOM_TEST_DB_PORT: portOf('db'),
  OXBLOOM_TEST_S3_PORT: portOf('s3'),
  OXBLOOM_TEST_SMTP_PORT: portOf('smtp'),
  OXBLOOM_TEST_INBOX_PORT: portOf('inbox'),
  OXBLOOM_DATA_ROOT: path.join(root, '.data', 'bench'),
});
const env: Record<string, string> = { ...appEnvironment(profile, randomBytes(32).toString('base64url')), ASTRO_TELEMETRY_DISABLED: '1' };

/** Fires `count` requests at a fixed rate without waiting for answers; each latency counts from its scheduled time. */
async function steadyLoad(count: number, perSecond: number, send: (i: number) => Promise<void>): Promise<{ timing: Timing; failures: number }> {
  const interval = 1000 / perSecond;
  const start = performance.now() + 50;
  const latencies: number[] = [];
  let failures = 0;
  const pending: Promise<void>[] = [];
  for (let i = 0; i < count; i += 1) {
    const scheduled = start + i * interval;
    const wait = scheduled - performance.now();
    if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
    pending.push(
      send(i).then(
        () => void latencies.push(performance.now() - scheduled),
        () => void (failures += 1),
      ),
    );
  }
  await Promise.all(pending);
  return { timing: summarise(latencies), failures };
}

async function main() {
  await stopServices(profile);
  for (const service of Object.keys(benchPorts) as Service[]) {
    const port = profile.ports[service];
    if (!(await isPortFree(port))) throw new Error(`Port ${port} is in use: set ${benchPorts[service][0]} to a free port.`);
  }
  await startServices(profile, { freshDatabase: true });
  migrate(env);
  seed(env);
  console.log('[bench] building the app into .data/bench (skipped when the build is current)');
  build(profile, env);
  await startApp(profile, env);

  Object.assign(process.env, env, { OXBLOOM_TEST_BASE_URL: profile.appUrl });
  const { api } = await import('../../tests/support/app');
  const { demo, signedIn } = await import('../../tests/support/auth');
  const { createDatabase } = await import('../../db/client');
  const { insertSyntheticCoupon } = await import('../../tests/fixtures/library-coupons');
  const { heatThicknessNm } = await import('~/lib/tint/growth');
  const { findTintModel, predictTint } = await import('~/lib/tint');

  // The library: swatched Ti-6Al-4V heats in air, shared with members.
  const { db, pool } = createDatabase(env.DATABASE_URL, 4);
  const law = findTintModel(ALLOY)!.heat!.law;
  for (let i = 0; i < LIBRARY_COUPONS; i += 1) {
    const temperatureC = 450 + ((i * 37) % 200);
    const holdMinutes = 5 + ((i * 53) % 115);
    const thicknessNm = heatThicknessNm(law, temperatureC, holdMinutes) * (0.9 + (0.2 * ((i * 7) % 10)) / 10);
    await insertSyntheticCoupon(db, { ownerEmail: demo.member2, alloy: ALLOY, visibility: 'members', temperatureC, holdMinutes, thicknessNm });
  }

  const member = await signedIn(demo.member);
  const plan = (i: number) => ({ alloy: ALLOY, process: 'heat', temperatureC: 480 + (i % 150), holdMinutes: 10 + (i % 100) });
  const first = await (await api('/api/tint/predict', { jar: member, json: plan(0) })).json();
  // The demo's own measured photos may add a few coupons of the alloy.
  if (first.basis !== 'library' || first.couponCount < LIBRARY_COUPONS)
    throw new Error(`Expected the library fit of ${LIBRARY_COUPONS}+ coupons, got ${first.basis} ${first.couponCount}`);

  const request = (jar?: typeof member) => async (i: number) => {
    const response = await api('/api/tint/predict', { jar, json: plan(i) });
    await response.arrayBuffer();
    if (response.status !== 200) throw new Error(`status ${response.status}`);
  };
  const count = RATE_PER_SECOND * DURATION_SECONDS;
  await steadyLoad(100, RATE_PER_SECOND, request(member)); // warm-up
  const library = await steadyLoad(count, RATE_PER_SECOND, request(member));
  const visitor = await steadyLoad(count, RATE_PER_SECOND, request());
  // The same rate of signed-in requests to a route that does almost nothing: the cost of reading the session.
  const sessionOnly = await steadyLoad(count, RATE_PER_SECOND, async () => {
    const response = await api('/api/tint/ladder', { jar: member, json: { alloy: ALLOY, fromNm: 0, toNm: 0, stepNm: 1 } });
    await response.arrayBuffer();
    if (response.status !== 200) throw new Error(`status ${response.status}`);
  });

  // The handler path in this process: the version query, the cached fit, the prediction, the JSON.
  const { libraryFit, libraryVersion } = await import('~/lib/server/tint-fit');
  const viewer = { id: 'bench-viewer', role: 'member' as const };
  const model = findTintModel(ALLOY)!;
  await libraryFit(ALLOY, viewer);
  const planned = { process: 'heat' as const, temperatureC: 560, holdMinutes: 45 };
  const inProcess = await time(async () => JSON.stringify(predictTint(model, planned, await libraryFit(ALLOY, viewer))), 300, 20);
  const versionOnly = await time(() => libraryVersion(ALLOY, viewer), 300, 20);

  await pool.end();

  const perSecond = `${RATE_PER_SECOND}/s for ${DURATION_SECONDS} s`;
  const rows: Row[] = [
    {
      what: `member, library fit of ${first.couponCount} coupons, ${perSecond} (p95)`,
      measured: ms(library.timing.p95),
      target: '≤ 25 ms',
      met: library.timing.p95 <= 25 && library.failures === 0,
    },
    { what: '  same, median / max', measured: `${ms(library.timing.median)} / ${ms(library.timing.max)}` },
    { what: '  same, failed requests', measured: String(library.failures) },
    {
      what: `visitor, reference data, ${perSecond} (p95)`,
      measured: ms(visitor.timing.p95),
      target: '≤ 25 ms',
      met: visitor.timing.p95 <= 25 && visitor.failures === 0,
    },
    { what: '  same, median', measured: ms(visitor.timing.median) },
    { what: `member, one-step tint ladder (session read only), ${perSecond} (p95)`, measured: ms(sessionOnly.timing.p95) },
    { what: '  same, median', measured: ms(sessionOnly.timing.median) },
    { what: 'in process: version query + cached fit + prediction + JSON (p95)', measured: ms(inProcess.p95) },
    { what: 'in process: the version read alone (median; at 1 000 000 swatches: library bench)', measured: ms(versionOnly.median) },
  ];
  rows.push({ what: `machine load average (1 min) at the end, ${os.cpus().length} cores`, measured: loadAverage() });
  printTable(rows);
  if (rows.some((row) => row.met === false)) process.exitCode = 1;
}

try {
  await main();
} finally {
  await stopServices(profile);
}
process.exit(process.exitCode ?? 0);
