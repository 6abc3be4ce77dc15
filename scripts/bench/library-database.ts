// The library benchmark's own MariaDB (the `bench` profile: ports OXBLOOM_BENCH_DB_PORT…, data in
// .data/bench/), migrated, with the alloy catalogue and the generated data set. The data set is
// made once and kept (a marker row in app_settings says it is there), so later runs start at once.
import { migrate } from 'drizzle-orm/mysql2/migrator';
import { eq } from 'drizzle-orm';
import { createDatabase } from '../../db/client';
import { alloys, appSettings } from '../../db/schema';
import { alloyCatalogue } from '~/lib/alloys';
import { GENERATED_MARKER, LIBRARY_SIZE, generateLibrary } from './generate-library';

const { loadProfile, appEnvironment } = await import('../services/profile.mjs');
const { startMariadb, prepareDatabase, stopMariadb } = await import('../services/mariadb.mjs');

export const benchProfile = loadProfile('bench');

/**
 * Starts the bench database (a fresh one with `fresh`), brings it up to date and fills it when it
 * has no data set yet. Sets the app's environment in process.env, so server modules use it.
 */
export async function openLibraryBench({ fresh = false } = {}) {
  const { mkdirSync } = await import('node:fs');
  mkdirSync(benchProfile.runDir, { recursive: true });
  await startMariadb(benchProfile);
  prepareDatabase(benchProfile, { fresh });
  const env = appEnvironment(benchProfile, 'bench-only-secret-not-for-any-real-session');
  Object.assign(process.env, env);
  const { db, pool } = createDatabase(env.DATABASE_URL, 4);
  await migrate(db, { migrationsFolder: new URL('../../db/migrations', import.meta.url).pathname });
  for (const alloy of alloyCatalogue)
    await db
      .insert(alloys)
      .values(alloy)
      .onDuplicateKeyUpdate({ set: { name: alloy.name } });
  const [marker] = await db.select().from(appSettings).where(eq(appSettings.key, GENERATED_MARKER));
  let generatedIn: number | undefined;
  if (!marker) {
    const [[{ coupons }]] = (await pool.query('SELECT count(*) AS coupons FROM coupons')) as unknown as [{ coupons: number }[]];
    if (coupons > 0) throw new Error('The bench database holds coupons but no data-set marker: run with --fresh (scripts/bench/generate-library.ts).');
    console.log(`[bench] generating ${LIBRARY_SIZE.coupons} coupons and ${LIBRARY_SIZE.swatches} swatches (once; kept in .data/bench)`);
    generatedIn = await generateLibrary(pool);
  }
  return { env, db, pool, generatedIn, stop: () => stopMariadb(benchProfile) };
}

// Alone: makes the data set (again, with --fresh) and stops the database.
if (import.meta.url === `file://${process.argv[1]}`) {
  const bench = await openLibraryBench({ fresh: process.argv.includes('--fresh') });
  console.log(bench.generatedIn === undefined ? '[bench] the data set is there already.' : `[bench] generated in ${bench.generatedIn.toFixed(1)} s.`);
  await bench.pool.end();
  await bench.stop();
}
