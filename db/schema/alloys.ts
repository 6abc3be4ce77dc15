import { int, mysqlEnum, mysqlTable, varchar, text } from 'drizzle-orm/mysql-core';
import { alloyFamilies } from './enums';
import { timestamps } from './columns';

/** The alloy catalogue: designations are the standard names (UNS where one exists). */
export const alloys = mysqlTable('alloys', {
  id: int('id').autoincrement().primaryKey(),
  slug: varchar('slug', { length: 64 }).notNull().unique(),
  name: varchar('name', { length: 128 }).notNull(),
  family: mysqlEnum('family', alloyFamilies).notNull(),
  uns: varchar('uns', { length: 16 }),
  notes: text('notes'),
  ...timestamps,
});
