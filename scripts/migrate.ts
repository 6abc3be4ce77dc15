// Applies the committed Drizzle migrations in db/migrations to DATABASE_URL.
import { migrate } from 'drizzle-orm/mysql2/migrator';
import { createDatabase } from '../db/client';

const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set.');
  process.exit(1);
}
const { db, pool } = createDatabase(url, 1);
try {
  await migrate(db, { migrationsFolder: new URL('../db/migrations', import.meta.url).pathname });
  console.log('[oxbloom] database schema is up to date.');
} catch (error) {
  console.error(`[oxbloom] migration failed: ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  await pool.end();
}
