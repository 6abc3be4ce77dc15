import { char, index, int, mysqlEnum, mysqlTable, primaryKey, smallint, text, timestamp, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { timestamps } from './columns';
import { users } from './users';
import { coupons } from './coupons';
import { swatches } from './photos';

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

export const sheetStatuses = ['draft', 'published'] as const;

/** An instructor's printable colour sheet. */
export const colourSheets = mysqlTable(
  'colour_sheets',
  {
    id: int('id').autoincrement().primaryKey(),
    // A published sheet outlives its author's account; it keeps only swatches that still exist.
    ownerId: varchar('owner_id', { length: 255 }).references(() => users.id, { onDelete: 'set null' }),
    classId: int('class_id').references(() => classes.id, { onDelete: 'set null' }),
    slug: varchar('slug', { length: 64 }).notNull().unique(),
    title: varchar('title', { length: 160 }).notNull(),
    intro: text('intro'),
    status: mysqlEnum('status', sheetStatuses).notNull().default('draft'),
    publishedAt: timestamp('published_at', { mode: 'date' }),
    ...timestamps,
  },
  (table) => [index('colour_sheets_owner_idx').on(table.ownerId)],
);

/** A swatch on a colour sheet; it goes when its swatch goes. */
export const colourSheetItems = mysqlTable(
  'colour_sheet_items',
  {
    id: int('id').autoincrement().primaryKey(),
    sheetId: int('sheet_id')
      .notNull()
      .references(() => colourSheets.id, { onDelete: 'cascade' }),
    swatchId: int('swatch_id')
      .notNull()
      .references(() => swatches.id, { onDelete: 'cascade' }),
    position: smallint('position').notNull(),
    note: text('note'),
  },
  (table) => [index('colour_sheet_items_sheet_idx').on(table.sheetId, table.position)],
);
