import { drizzle } from 'drizzle-orm/mysql2';
import mysql from 'mysql2/promise';
import * as schema from './schema';

/** A Drizzle client over a mysql2 pool; every timestamp is UTC on both sides. */
export function createDatabase(url: string, connectionLimit = 10) {
  const pool = mysql.createPool({ uri: url, connectionLimit, timezone: 'Z', dateStrings: false });
  const db = drizzle(pool, { schema, mode: 'default' });
  return { db, pool };
}

export type Database = ReturnType<typeof createDatabase>['db'];
