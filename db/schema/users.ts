import { int, mysqlEnum, mysqlTable, primaryKey, timestamp, varchar, char, index, uniqueIndex } from 'drizzle-orm/mysql-core';
import { timestamps } from './columns';

export const roles = ['member', 'instructor', 'admin'] as const;
export type Role = (typeof roles)[number];

/**
 * E-mail columns hold the normalised address (src/lib/email-address.ts) under the collation
 * utf8mb4_nopad_bin, so the database compares addresses byte for byte: no case or accent folding,
 * no ignored trailing spaces. Drizzle's MySQL columns can't declare a collation, so the migration
 * that sets it (0002_account-identity-and-sessions.sql) was written by hand; keep it when a
 * column here changes.
 */
/** People with an account. Column keys follow what the Auth.js Drizzle adapter expects. */
export const users = mysqlTable('users', {
  id: varchar('id', { length: 255 })
    .primaryKey()
    .$defaultFn(() => crypto.randomUUID()),
  name: varchar('name', { length: 255 }),
  /** Normalised, exact collation (see above); unique. */
  email: varchar('email', { length: 255 }).notNull().unique(),
  emailVerified: timestamp('email_verified', { mode: 'date', fsp: 3 }),
  image: varchar('image', { length: 255 }),
  role: mysqlEnum('role', roles).notNull().default('member'),
  passwordHash: varchar('password_hash', { length: 255 }),
  ...timestamps,
});

/** Auth.js: linked sign-in providers (OAuth-style accounts; unused by password sign-in). */
export const accounts = mysqlTable(
  'accounts',
  {
    userId: varchar('user_id', { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    type: varchar('type', { length: 255 }).notNull(),
    provider: varchar('provider', { length: 255 }).notNull(),
    providerAccountId: varchar('provider_account_id', { length: 255 }).notNull(),
    refresh_token: varchar('refresh_token', { length: 2048 }),
    access_token: varchar('access_token', { length: 2048 }),
    expires_at: int('expires_at'),
    token_type: varchar('token_type', { length: 255 }),
    scope: varchar('scope', { length: 255 }),
    id_token: varchar('id_token', { length: 2048 }),
    session_state: varchar('session_state', { length: 255 }),
  },
  (table) => [primaryKey({ columns: [table.provider, table.providerAccountId] })],
);

/**
 * Live sign-ins. Every session cookie (a JWT) carries the id of its row here, and a session is
 * good only while its row is: signing out deletes the row, signing out everywhere or changing the
 * password deletes all of a person's rows. Checking one is a primary-key read. (The table is the
 * one Auth.js's adapter keeps for database sessions; with JWT sessions Auth.js never writes it.)
 */
export const sessions = mysqlTable(
  'sessions',
  {
    sessionToken: varchar('session_token', { length: 255 }).primaryKey(),
    userId: varchar('user_id', { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expires: timestamp('expires', { mode: 'date' }).notNull(),
    createdAt: timestamps.createdAt,
  },
  (table) => [index('sessions_user_idx').on(table.userId)],
);

/** Auth.js: one-time sign-in links sent by e-mail. The identifier is an e-mail column (exact collation). */
export const verificationTokens = mysqlTable(
  'verification_tokens',
  {
    identifier: varchar('identifier', { length: 255 }).notNull(),
    token: varchar('token', { length: 255 }).notNull(),
    expires: timestamp('expires', { mode: 'date' }).notNull(),
  },
  (table) => [primaryKey({ columns: [table.identifier, table.token] })],
);

export const accountTokenPurposes = ['verify-email', 'reset-password'] as const;

/** Our own single-use e-mailed tokens (address verification, password reset); only hashes are kept. */
export const accountTokens = mysqlTable(
  'account_tokens',
  {
    id: int('id').autoincrement().primaryKey(),
    userId: varchar('user_id', { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    purpose: mysqlEnum('purpose', accountTokenPurposes).notNull(),
    tokenHash: char('token_hash', { length: 64 }).notNull(),
    expiresAt: timestamp('expires_at', { mode: 'date' }).notNull(),
    usedAt: timestamp('used_at', { mode: 'date' }),
    createdAt: timestamps.createdAt,
  },
  (table) => [uniqueIndex('account_tokens_hash_idx').on(table.tokenHash), index('account_tokens_user_idx').on(table.userId)],
);

/** Fixed-window counters for rate limits, shared by every app process. */
export const rateLimits = mysqlTable('rate_limits', {
  bucket: varchar('bucket', { length: 255 }).primaryKey(),
  windowStart: timestamp('window_start', { mode: 'date' }).notNull(),
  hits: int('hits').notNull().default(0),
});
