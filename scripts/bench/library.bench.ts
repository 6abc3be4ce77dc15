// The library at scale (100 000 coupons, 1 000 000 swatches, generated once into the bench
// profile's own database: library-database.ts): the list behind GET /api/coupons and /library for
// every filter the page offers, each sort and a page deep in, with EXPLAIN of each query it sends;
// colour search, timed and checked for recall against a brute-force ΔE00 scan (culori's CIEDE2000)
// over the same rows; the library fit's version read, against the recount it replaced; the pair
// matrix of the busiest pair, the front page's recent pairs and the first 1 000 rows of an export.
import { differenceCiede2000 } from 'culori';
import type { Pool } from 'mysql2/promise';
import { ms, printTable, time, type Row, type Timing } from './report';
import { benchAdminId, ownerId } from './generate-library';
import { openLibraryBench } from './library-database';

const RUNS = 20;
const LIST_TARGET_MS = 100;
const SEARCH_TARGET_MS = 100;

const bench = await openLibraryBench();
const { pool } = bench;
// The database stops at the end, also after a failure (its data stays for the next run).
try {
  const { libraryQuerySchema, encodeCursor } = await import('~/lib/library/query');
  const { listLibrary } = await import('~/lib/server/library/list');
  const { colourSearchSchema } = await import('~/lib/library/colour-search');
  const { searchSwatches } = await import('~/lib/server/library/colour-search');
  const { libraryVersion } = await import('~/lib/server/tint-fit');

  type Viewer = { id: string; role: 'member' | 'instructor' | 'admin' } | null;
  const member: Viewer = { id: ownerId(20), role: 'member' };
  const prolific: Viewer = { id: ownerId(0), role: 'instructor' };
  const admin: Viewer = { id: benchAdminId, role: 'admin' };

  /** Every SQL statement the app's pool sends while `recording` is on (the pool class is shared). */
  const sent: { sql: string; values: unknown[] }[] = [];
  let recording = false;
  const poolPrototype = Object.getPrototypeOf(pool) as { query: (...args: unknown[]) => unknown };
  const originalQuery = poolPrototype.query;
  poolPrototype.query = function (this: unknown, ...args: unknown[]) {
    if (recording) {
      const [first, values] = args as [string | { sql: string }, unknown[] | undefined];
      sent.push({ sql: typeof first === 'string' ? first : first.sql, values: values ?? [] });
    }
    return originalQuery.apply(this, args);
  };

  async function explain(sql: string, values: unknown[]): Promise<string[]> {
    const [rows] = (await pool.query(`EXPLAIN ${sql}`, values)) as unknown as [Record<string, unknown>[]];
    return rows.map((row) =>
      `    ${row.id} ${row.select_type} ${row.table} type=${row.type} key=${row.key ?? 'NULL'} rows=${row.rows} ${row.Extra ?? ''}`.trimEnd(),
    );
  }

  /** The statements one call sends, with their EXPLAIN. */
  async function explainCall(label: string, call: () => Promise<unknown>): Promise<string[]> {
    sent.length = 0;
    recording = true;
    await call();
    recording = false;
    const lines = [`  ${label}`];
    for (const statement of [...sent]) {
      lines.push(`   ${statement.sql.replace(/\s+/g, ' ').slice(0, 400)}`);
      lines.push(...(await explain(statement.sql, statement.values)));
    }
    return lines;
  }

  const verdict = (timing: Timing, target: number) => timing.median <= target && timing.p95 <= target;
  const rows: Row[] = [];
  const explains: string[] = [];

  // A page deep into the results: the cursor of the row half-way down by temperature, and by date.
  async function deepCursor(sort: 'temperature' | 'date', order: 'asc' | 'desc'): Promise<string> {
    const column = sort === 'temperature' ? 'temperature_c' : 'created_at';
    const [[row]] = (await pool.query(
      `SELECT id, ${column} AS value FROM coupons WHERE ${column} IS NOT NULL AND visibility IN ('public','members') ORDER BY ${column} ${order}, id ${order} LIMIT 1 OFFSET 40000`,
    )) as unknown as [{ id: number; value: number | Date }[]];
    const value = row.value instanceof Date ? row.value.getTime() : row.value;
    return encodeCursor({ sort, order, value, id: row.id });
  }

  const listCases: [string, Viewer, Record<string, string>][] = [
    ['no filter, visitor', null, {}],
    ['no filter, member', member, {}],
    ['no filter, admin', admin, {}],
    ['alloy ti-grade-5', member, { alloy: 'ti-grade-5' }],
    ['alloy niobium', member, { alloy: 'niobium' }],
    ['pair ti-grade-2 + ti-grade-5', member, { pair: 'ti-grade-2+ti-grade-5' }],
    ['process torch', member, { process: 'torch' }],
    ['temperature 400–500 °C', member, { tempMin: '400', tempMax: '500' }],
    ['temperature 752–932 °F', member, { tempMin: '752', tempMax: '932', unit: 'F' }],
    ['hold 5–15 min', member, { holdMin: '5', holdMax: '15' }],
    ['anodize 20–40 V', member, { process: 'anodize', voltsMin: '20', voltsMax: '40' }],
    ['atmosphere argon', member, { atmosphere: 'argon' }],
    ['prep polished', member, { prep: 'polished' }],
    ['has photos', member, { photos: '1' }],
    ['mine (a few dozen)', member, { mine: '1' }],
    ['mine (thousands)', prolific, { mine: '1' }],
    [
      'combined: ti-grade-5, oven, 450–650 °C, air, photos',
      member,
      { alloy: 'ti-grade-5', process: 'oven', tempMin: '450', tempMax: '650', atmosphere: 'air', photos: '1' },
    ],
    ['combined: pair, etched, ≥ 700 °C, hold ≤ 10 min', member, { pair: 'ti-grade-2+ti-grade-5', prep: 'etched', tempMin: '700', holdMax: '10' }],
    ['sort date, oldest first', member, { sort: 'date', order: 'asc' }],
    ['sort temperature', member, { sort: 'temperature' }],
    ['sort temperature, descending', member, { sort: 'temperature', order: 'desc' }],
    ['sort hold', member, { sort: 'hold' }],
    ['sort hold, descending', member, { sort: 'hold', order: 'desc' }],
    ['sort lightness', member, { sort: 'lightness' }],
    ['sort lightness, descending', member, { sort: 'lightness', order: 'desc' }],
    ['alloy ti-grade-5, sort temperature descending', member, { alloy: 'ti-grade-5', sort: 'temperature', order: 'desc' }],
    ['temperature 400–500 °C, sort hold', member, { tempMin: '400', tempMax: '500', sort: 'hold' }],
    ['page 1 600 by temperature (cursor)', member, { sort: 'temperature', cursor: await deepCursor('temperature', 'asc') }],
    ['page 1 600 by date (cursor)', member, { sort: 'date', cursor: await deepCursor('date', 'desc') }],
  ];

  const explained = new Set([
    'no filter, member',
    'alloy ti-grade-5',
    'temperature 400–500 °C',
    'mine (thousands)',
    'sort lightness',
    'page 1 600 by temperature (cursor)',
    'combined: ti-grade-5, oven, 450–650 °C, air, photos',
  ]);
  for (const [label, viewer, params] of listCases) {
    const parsed = libraryQuerySchema.safeParse(params);
    if (!parsed.success) {
      rows.push({ what: `list: ${label}`, measured: `not offered (${parsed.error.issues[0].message})` });
      continue;
    }
    const call = () => listLibrary(viewer, parsed.data);
    const timing = await time(call, RUNS, 3);
    const page = await call();
    rows.push({
      what: `list: ${label} (${page.coupons.length} rows, ${page.total}${page.totalExact === false ? '+' : ''} match)`,
      measured: `${ms(timing.median)} / p95 ${ms(timing.p95)}`,
      target: `≤ ${LIST_TARGET_MS} ms`,
      met: verdict(timing, LIST_TARGET_MS),
    });
    if (explained.has(label)) explains.push(...(await explainCall(`list: ${label}`, call)));
  }

  // Colour search against a brute-force scan of every swatch.
  interface Swatches {
    id: Int32Array;
    lab: Float64Array;
    alloy: Int32Array;
    visibleToMember: Uint8Array;
    visibleToVisitor: Uint8Array;
  }
  async function loadEverySwatch(database: Pool): Promise<Swatches> {
    const [[{ n }]] = (await database.query('SELECT count(*) AS n FROM swatches WHERE is_mean = false')) as unknown as [{ n: number }[]];
    const all: Swatches = {
      id: new Int32Array(n),
      lab: new Float64Array(n * 3),
      alloy: new Int32Array(n),
      visibleToMember: new Uint8Array(n),
      visibleToVisitor: new Uint8Array(n),
    };
    let i = 0;
    // Streamed in id ranges, so the million rows never sit in memory as objects.
    for (let from = 0; ; from += 200_000) {
      const [batch] = (await database.query({
        sql: `SELECT s.id, s.lab_l, s.lab_a, s.lab_b, coalesce(s.alloy_id, 0), c.visibility IN ('public','members') OR c.owner_id = ?, c.visibility = 'public' FROM swatches s JOIN coupons c ON c.id = s.coupon_id
            WHERE s.is_mean = false AND s.id > ? AND s.id <= ? ORDER BY s.id`,
        values: [member!.id, from, from + 200_000],
        rowsAsArray: true,
      })) as unknown as [[number, number, number, number, number, number, number][]];
      for (const [id, l, a, b, alloy, visible, isPublic] of batch) {
        all.id[i] = id;
        all.lab.set([l, a, b], i * 3);
        all.alloy[i] = alloy;
        all.visibleToMember[i] = visible;
        all.visibleToVisitor[i] = isPublic;
        i += 1;
      }
      if (i >= n) break;
    }
    return all;
  }
  const every = await loadEverySwatch(pool);
  const [alloyRows] = (await pool.query('SELECT id, slug FROM alloys')) as unknown as [{ id: number; slug: string }[]];
  const alloyIdOf = new Map(alloyRows.map((row) => [row.slug, row.id]));
  const ciede2000 = differenceCiede2000();

  function bruteForce(lab: { l: number; a: number; b: number }, maxDeltaE: number, alloy: string | undefined, limit: number, visitor: boolean): number[] {
    const wanted = alloy ? alloyIdOf.get(alloy)! : 0;
    const visible = visitor ? every.visibleToVisitor : every.visibleToMember;
    const hits: [number, number][] = [];
    const target = { mode: 'lab65' as const, ...lab };
    for (let i = 0; i < every.id.length; i += 1) {
      if (!visible[i] || (wanted && every.alloy[i] !== wanted)) continue;
      const d = ciede2000(target, { mode: 'lab65', l: every.lab[i * 3], a: every.lab[i * 3 + 1], b: every.lab[i * 3 + 2] });
      if (d <= maxDeltaE) hits.push([d, every.id[i]]);
    }
    return hits
      .sort((x, y) => x[0] - y[0] || x[1] - y[1])
      .slice(0, limit)
      .map(([, id]) => id);
  }

  // No alloy and with one, tight and wide limits, a member and a visitor (public coupons only).
  const searchCases: [string, Viewer, Record<string, string>][] = [
    ['#3a5fa0 (blue), ΔE00 ≤ 0.5, member', member, { hex: '#3a5fa0', maxDeltaE: '0.5', limit: '100' }],
    ['#3a5fa0 (blue), ΔE00 ≤ 2, member', member, { hex: '#3a5fa0', maxDeltaE: '2', limit: '100' }],
    ['#3a5fa0 (blue), ΔE00 ≤ 5, member', member, { hex: '#3a5fa0', maxDeltaE: '5', limit: '100' }],
    ['#3a5fa0 (blue), ΔE00 ≤ 10, member', member, { hex: '#3a5fa0', maxDeltaE: '10', limit: '100' }],
    ['#3a5fa0 (blue), ΔE00 ≤ 10, visitor', null, { hex: '#3a5fa0', maxDeltaE: '10', limit: '100' }],
    ['#c9a23c (straw), ΔE00 ≤ 5, member', member, { hex: '#c9a23c', maxDeltaE: '5', limit: '100' }],
    ['#7a4a8c (purple), ΔE00 ≤ 3, limit 20, member', member, { hex: '#7a4a8c', maxDeltaE: '3', limit: '20' }],
    ['#8a8a8a (grey), ΔE00 ≤ 10, member', member, { hex: '#8a8a8a', maxDeltaE: '10', limit: '100' }],
    ['#8a8a8a (grey), ΔE00 ≤ 10, visitor', null, { hex: '#8a8a8a', maxDeltaE: '10', limit: '100' }],
    ['#e0e0ff (outside the data), ΔE00 ≤ 10, member', member, { hex: '#e0e0ff', maxDeltaE: '10', limit: '100' }],
    ['#3a5fa0, ti-grade-5, ΔE00 ≤ 1, member', member, { hex: '#3a5fa0', alloy: 'ti-grade-5', maxDeltaE: '1', limit: '100' }],
    ['#3a5fa0, ti-grade-5, ΔE00 ≤ 5, member', member, { hex: '#3a5fa0', alloy: 'ti-grade-5', maxDeltaE: '5', limit: '100' }],
    ['#3a5fa0, ti-grade-5, ΔE00 ≤ 5, visitor', null, { hex: '#3a5fa0', alloy: 'ti-grade-5', maxDeltaE: '5', limit: '100' }],
    ['#c9a23c, steel-1084, ΔE00 ≤ 10, member', member, { hex: '#c9a23c', alloy: 'steel-1084', maxDeltaE: '10', limit: '100' }],
    ['#c9a23c, niobium, ΔE00 ≤ 10, visitor', null, { hex: '#c9a23c', alloy: 'niobium', maxDeltaE: '10', limit: '100' }],
  ];
  const explainedSearches = new Set([
    '#3a5fa0 (blue), ΔE00 ≤ 5, member',
    '#8a8a8a (grey), ΔE00 ≤ 10, visitor',
    '#e0e0ff (outside the data), ΔE00 ≤ 10, member',
    '#3a5fa0, ti-grade-5, ΔE00 ≤ 5, member',
  ]);
  for (const [label, viewer, params] of searchCases) {
    const query = colourSearchSchema.parse(params);
    const call = () => searchSwatches(viewer, query);
    const timing = await time(call, RUNS, 3);
    const found = (await call()).map((hit) => hit.swatchId);
    const truth = bruteForce(query.lab, query.maxDeltaE, query.alloy, query.limit, viewer === null);
    const recalled = truth.filter((id) => found.includes(id)).length;
    const recall = truth.length === 0 ? 1 : recalled / truth.length;
    const sameOrder = truth.length === found.length && truth.every((id, k) => found[k] === id);
    rows.push({
      what: `colour search: ${label} (${found.length} hits)`,
      measured: `${ms(timing.median)} / p95 ${ms(timing.p95)}`,
      target: `≤ ${SEARCH_TARGET_MS} ms`,
      met: verdict(timing, SEARCH_TARGET_MS),
    });
    rows.push({
      what: `  recall against the brute-force scan (${truth.length} true hits), same order`,
      measured: `${recall.toFixed(3)}, ${sameOrder ? 'yes' : 'no'}`,
      target: '1.000, yes',
      met: recall === 1 && sameOrder,
    });
    if (explainedSearches.has(label)) explains.push(...(await explainCall(`colour search: ${label}`, call)));
  }

  // The library fit's version: the recount it replaced (count, id sum and last edit of the alloy's
  // usable swatches the viewer may see, as tint-fit.ts read it until now) against the version row.
  const recount = () =>
    pool.query(
      `SELECT count(*), coalesce(sum(s.id), 0), cast(max(c.updated_at) as char), coalesce(sum(c.visibility = 'private'), 0)
     FROM swatches s JOIN coupons c ON c.id = s.coupon_id JOIN alloys a ON a.id = s.alloy_id
     WHERE a.slug = ? AND s.layer_id IS NOT NULL
       AND ((c.process IN ('oven','forge','torch','induction') AND c.atmosphere = 'air' AND c.temperature_c IS NOT NULL AND c.hold_seconds IS NOT NULL) OR (c.process = 'anodize' AND c.volts IS NOT NULL))
       AND (c.visibility IN ('public','members') OR c.owner_id = ?)`,
      ['ti-grade-5', member!.id],
    );
  const [[{ n: alloySwatches }]] = (await pool.query(
    "SELECT count(*) AS n FROM swatches s JOIN alloys a ON a.id = s.alloy_id WHERE a.slug = 'ti-grade-5'",
  )) as unknown as [{ n: number }[]];
  const oldRead = await time(recount, 10, 2);
  const newRead = await time(() => libraryVersion('ti-grade-5', member!), 200, 10);
  rows.push({
    what: `fit version, old recount (ti-grade-5: ${alloySwatches} of 1 000 000 swatches)`,
    measured: `${ms(oldRead.median)} / p95 ${ms(oldRead.p95)}`,
  });
  rows.push({
    what: 'fit version, version row read at 1 000 000 swatches',
    measured: `${ms(newRead.median)} / p95 ${ms(newRead.p95)}`,
    target: '≤ 1 ms',
    met: newRead.median <= 1,
  });
  explains.push(...(await explainCall('fit version read', () => libraryVersion('ti-grade-5', member!))));

  // The pair matrix of the busiest pair, the front page's recent pairs, and an export's first rows.
  const { loadPairMatrix } = await import('~/lib/server/library/pair-matrix');
  const { recentPublicPairs } = await import('~/lib/server/library/recent');
  const { exportLibrary } = await import('~/lib/server/library/export');
  const [[busiest]] = (await pool.query(
    "SELECT layer_key AS pair, count(*) AS n FROM coupons WHERE layer_key LIKE '%+%' AND layer_key NOT LIKE '%+%+%' GROUP BY layer_key ORDER BY n DESC LIMIT 1",
  )) as unknown as [{ pair: string; n: number }[]];
  const pairCall = () => loadPairMatrix(member, busiest.pair.split('+'));
  const pairTiming = await time(pairCall, RUNS, 3);
  const matrix = await pairCall();
  rows.push({
    what: `pair matrix: ${busiest.pair} (${busiest.n} coupons; ${matrix.couponCount} visible, ${matrix.cells.filter((cell) => cell.count > 0).length} cells filled)`,
    measured: `${ms(pairTiming.median)} / p95 ${ms(pairTiming.p95)}`,
    target: `≤ ${LIST_TARGET_MS} ms`,
    met: verdict(pairTiming, LIST_TARGET_MS),
  });
  explains.push(...(await explainCall(`pair matrix: ${busiest.pair}`, pairCall)));

  const recentTiming = await time(() => recentPublicPairs(), RUNS, 3);
  const recent = await recentPublicPairs();
  rows.push({
    what: `front page recent pairs (${recent.length} pairs, ${recent.reduce((sum, pair) => sum + pair.coupons.length, 0)} coupons)`,
    measured: `${ms(recentTiming.median)} / p95 ${ms(recentTiming.p95)}`,
    target: `≤ ${LIST_TARGET_MS} ms`,
    met: verdict(recentTiming, LIST_TARGET_MS),
  });
  explains.push(...(await explainCall('front page recent pairs', () => recentPublicPairs())));

  /** Reads an export's CSV until `wanted` rows (after the header) have arrived, then stops it. */
  async function exportRows(params: Record<string, string>, wanted: number): Promise<number> {
    const { body } = await exportLibrary(member, libraryQuerySchema.parse(params), 'csv');
    const reader = body.getReader();
    const decoder = new TextDecoder();
    let lines = 0;
    while (lines <= wanted) {
      const { value, done } = await reader.read();
      if (done) break;
      lines += decoder.decode(value).split('\r\n').length - 1;
    }
    await reader.cancel();
    return lines - 1;
  }
  const exportView = { alloy: 'ti-grade-5', process: 'oven', sort: 'temperature' };
  const exportTiming = await time(() => exportRows(exportView, 1000), 5, 1);
  const exported = await exportRows(exportView, 1000);
  rows.push({
    what: `export CSV, ti-grade-5 oven by temperature: first ${exported} rows (10 pages)`,
    measured: `${ms(exportTiming.median)} / p95 ${ms(exportTiming.p95)}`,
    target: '≤ 1000 ms',
    met: verdict(exportTiming, 1000),
  });
  explains.push(...(await explainCall('export CSV, ti-grade-5 oven by temperature (count, then the first two pages)', () => exportRows(exportView, 150))));

  if (bench.generatedIn !== undefined)
    rows.push({ what: 'generating the data set (this run)', measured: `${bench.generatedIn.toFixed(1)} s`, target: '≤ 120 s', met: bench.generatedIn <= 120 });
  printTable(rows);
  console.log('\nEXPLAIN of each statement (id select_type table type key rows Extra):');
  for (const line of explains) console.log(line);

  poolPrototype.query = originalQuery;
  if (rows.some((row) => row.met === false)) process.exitCode = 1;
} finally {
  await bench.stop();
}
process.exit(process.exitCode ?? 0);
