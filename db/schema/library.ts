import { bigint, int, mysqlTable } from 'drizzle-orm/mysql-core';
import { alloys } from './alloys';

/**
 * A counter per alloy, bumped in the same transaction by every write that can change the swatches
 * some audience sees of that alloy (a coupon's edit or deletion, a photo's attach, region edit or
 * deletion, an account's deletion). The library fit reads it with one primary-key lookup instead
 * of scanning the swatches. No row yet means version 0.
 */
export const libraryVersions = mysqlTable('library_versions', {
  alloyId: int('alloy_id')
    .primaryKey()
    .references(() => alloys.id, { onDelete: 'cascade' }),
  version: bigint('version', { mode: 'number' }).notNull().default(0),
});
