import { char, index, int, mysqlEnum, mysqlTable, primaryKey, text, timestamp, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { timestamps } from './columns';
import { users } from './users';
import { coupons } from './coupons';

/** A class run by an instructor. */
export const classes = mysqlTable(
  'classes',
  {
    id: int('id').autoincrement().primaryKey(),
    instructorId: varchar('instructor_id', { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: varchar('name', { length: 160 }).notNull(),
    /** When the class runs, as the instructor writes it ("Spring 2027", "Tuesday evenings"). */
    term: varchar('term', { length: 80 }),
    description: text('description'),
    ...timestamps,
  },
  (table) => [index('classes_instructor_idx').on(table.instructorId)],
);

export const classMemberRoles = ['student', 'instructor'] as const;

export const classMembers = mysqlTable(
  'class_members',
  {
    classId: int('class_id')
      .notNull()
      .references(() => classes.id, { onDelete: 'cascade' }),
    userId: varchar('user_id', { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: mysqlEnum('role', classMemberRoles).notNull().default('student'),
    joinedAt: timestamps.createdAt,
  },
  (table) => [primaryKey({ columns: [table.classId, table.userId] }), index('class_members_user_idx').on(table.userId)],
);

/** An e-mailed invitation to join a class; only the token's hash is kept. */
export const invitations = mysqlTable(
  'invitations',
  {
    id: int('id').autoincrement().primaryKey(),
    classId: int('class_id')
      .notNull()
      .references(() => classes.id, { onDelete: 'cascade' }),
    /** Normalised, exact collation, like users.email (see users.ts). */
    email: varchar('email', { length: 255 }).notNull(),
    tokenHash: char('token_hash', { length: 64 }).notNull(),
    invitedBy: varchar('invited_by', { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { mode: 'date' }).notNull(),
    acceptedAt: timestamp('accepted_at', { mode: 'date' }),
    acceptedBy: varchar('accepted_by', { length: 255 }).references(() => users.id, { onDelete: 'set null' }),
    /** Set when the instructor revokes it, or sends a new link in its place. */
    revokedAt: timestamp('revoked_at', { mode: 'date' }),
    createdAt: timestamps.createdAt,
  },
  (table) => [
    uniqueIndex('invitations_token_idx').on(table.tokenHash),
    index('invitations_class_idx').on(table.classId),
    index('invitations_email_idx').on(table.email),
  ],
);

/** Coupons a member has shared with a class they belong to. */
export const classCoupons = mysqlTable(
  'class_coupons',
  {
    classId: int('class_id')
      .notNull()
      .references(() => classes.id, { onDelete: 'cascade' }),
    couponId: int('coupon_id')
      .notNull()
      .references(() => coupons.id, { onDelete: 'cascade' }),
    sharedAt: timestamps.createdAt,
  },
  (table) => [primaryKey({ columns: [table.classId, table.couponId] }), index('class_coupons_coupon_idx').on(table.couponId)],
);
