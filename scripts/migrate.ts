// Checks the app's settings, then applies the committed Drizzle migrations in db/migrations to
// DATABASE_URL. On failure it prints one line naming the fault and exits 1.
import { migrate } from 'drizzle-orm/mysql2/migrator';
import { createDatabase } from '../db/client';
import { readConfig } from '~/lib/server/config';

// Every app setting is checked here, before anything starts, so a bad one stops start-up with one line.
let url: string;
try {
  url = readConfig(process.env).DATABASE_URL;
} catch (error) {
  console.error((error as Error).message);
  process.exit(1);
}

function reason(error: unknown): string {
  const cause = (error as { cause?: { message?: string } }).cause?.message;
  return (cause ?? (error as Error).message ?? String(error)).split('\n')[0];
}

const { db, pool } = createDatabase(url, 1);
try {
  await migrate(db, { migrationsFolder: new URL('../db/migrations', import.meta.url).pathname });
  console.log('[oxbloom] database schema is up to date.');
} catch (error) {
  console.error(`${reason(error)} — fix the migration in db/migrations or the database, then start again.`);
  process.exitCode = 1;
} finally {
  await pool.end();
}
