import { createDatabase } from '../../db/client';

/** A direct connection to the test database, for checking what routes wrote. */
export function testDatabase() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: run the suite with `npm test`.');
  return createDatabase(url, 2);
}
