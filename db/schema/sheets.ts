import { boolean, index, int, json, mysqlEnum, mysqlTable, smallint, timestamp, uniqueIndex, varchar, text } from 'drizzle-orm/mysql-core';
import { timestamps } from './columns';
import { users } from './users';
import { coupons } from './coupons';
import { swatches } from './photos';
import { classes } from './classes';
import { sheetAudiences, sheetItemKinds, sheetOrientations, sheetPageSizes, sheetStatuses, sheetUnits } from './enums';

export { sheetStatuses };

/** An instructor's printable colour sheet. */
export const colourSheets = mysqlTable(
  'colour_sheets',
  {
    id: int('id').autoincrement().primaryKey(),
    // A published sheet outlives its author's account.
    ownerId: varchar('owner_id', { length: 255 }).references(() => users.id, { onDelete: 'set null' }),
    classId: int('class_id').references(() => classes.id, { onDelete: 'set null' }),
    title: varchar('title', { length: 160 }).notNull(),
    intro: text('intro'),
    units: mysqlEnum('units', sheetUnits).notNull().default('c'),
    pageSize: mysqlEnum('page_size', sheetPageSizes).notNull().default('a4'),
    orientation: mysqlEnum('orientation', sheetOrientations).notNull().default('portrait'),
    status: mysqlEnum('status', sheetStatuses).notNull().default('draft'),
    audience: mysqlEnum('audience', sheetAudiences).notNull().default('class'),
    showPrediction: boolean('show_prediction').notNull().default(false),
    publishedAt: timestamp('published_at', { mode: 'date' }),
    ...timestamps,
  },
  (table) => [
    index('colour_sheets_owner_idx').on(table.ownerId),
    index('colour_sheets_class_idx').on(table.classId),
    index('colour_sheets_status_idx').on(table.status, table.audience),
  ],
);

/** What a swatch looked like when it was put on a sheet, so a later change or loss is noticed. */
export interface SheetSwatchSnapshot {
  hex: string;
  lab: [number, number, number];
  couponTitle: string;
  temperatureC: number | null;
  holdSeconds: number | null;
  process: string;
  alloys: string[];
}

/**
 * One entry on a sheet, in order: a heading, or a swatch. A swatch's coupon may later be deleted
 * (the references go null, the snapshot stays) or stop being shared; the sheet notes either to its
 * owner rather than losing the entry silently.
 */
export const colourSheetItems = mysqlTable(
  'colour_sheet_items',
  {
    id: int('id').autoincrement().primaryKey(),
    sheetId: int('sheet_id')
      .notNull()
      .references(() => colourSheets.id, { onDelete: 'cascade' }),
    position: smallint('position').notNull(),
    kind: mysqlEnum('kind', sheetItemKinds).notNull(),
    heading: varchar('heading', { length: 160 }),
    swatchId: int('swatch_id').references(() => swatches.id, { onDelete: 'set null' }),
    couponId: int('coupon_id').references(() => coupons.id, { onDelete: 'set null' }),
    snapshot: json('snapshot').$type<SheetSwatchSnapshot>(),
    caption: varchar('caption', { length: 280 }),
    hideTemperature: boolean('hide_temperature').notNull().default(false),
    hideHold: boolean('hide_hold').notNull().default(false),
    hideProcess: boolean('hide_process').notNull().default(false),
    hideAlloy: boolean('hide_alloy').notNull().default(false),
  },
  (table) => [
    uniqueIndex('colour_sheet_items_position_idx').on(table.sheetId, table.position),
    index('colour_sheet_items_swatch_idx').on(table.swatchId),
    index('colour_sheet_items_coupon_idx').on(table.couponId),
  ],
);
