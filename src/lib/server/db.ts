import { createDatabase, type Database } from '../../../db/client';
import { config } from './config';

let instance: ReturnType<typeof createDatabase> | undefined;

/** The process-wide Drizzle client (a mysql2 pool; the app keeps no other state of its own). */
export function db(): Database {
  instance ??= createDatabase(config().DATABASE_URL);
  return instance.db;
}

export async function pingDatabase(): Promise<void> {
  instance ??= createDatabase(config().DATABASE_URL);
  await instance.pool.query('SELECT 1');
}
