import { mysqlTable, text, varchar } from 'drizzle-orm/mysql-core';
import { timestamps } from './columns';

/** Small facts about this installation, e.g. whether the demo has been seeded. */
export const appSettings = mysqlTable('app_settings', {
  key: varchar('setting_key', { length: 64 }).primaryKey(),
  value: text('value').notNull(),
  ...timestamps,
});
