import { timestamp } from 'drizzle-orm/mysql-core';

/** Created/updated stamps shared by every table that records edits. */
export const timestamps = {
  createdAt: timestamp('created_at', { mode: 'date', fsp: 3 }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { mode: 'date', fsp: 3 }).notNull().defaultNow().onUpdateNow(),
};
