import { sql } from 'drizzle-orm';
import { bigint, boolean, char, double, index, int, mysqlEnum, mysqlTable, smallint, timestamp, varchar } from 'drizzle-orm/mysql-core';
import { timestamps } from './columns';
import { users } from './users';
import { alloys } from './alloys';
import { coupons, couponLayers } from './coupons';

/** Presigned uploads not yet attached to a coupon; a sweep deletes stale ones from storage. */
export const uploads = mysqlTable(
  'uploads',
  {
    key: varchar('object_key', { length: 512 }).primaryKey(),
    ownerId: varchar('owner_id', { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    contentType: varchar('content_type', { length: 64 }).notNull(),
    byteSize: bigint('byte_size', { mode: 'number' }).notNull(),
    expiresAt: timestamp('expires_at', { mode: 'date' }).notNull(),
    createdAt: timestamps.createdAt,
  },
  (table) => [index('uploads_created_idx').on(table.createdAt)],
);

/** A photo of a coupon: the original and its derived files in storage, and EXIF facts (never GPS). */
export const photos = mysqlTable(
  'photos',
  {
    id: int('id').autoincrement().primaryKey(),
    couponId: int('coupon_id')
      .notNull()
      .references(() => coupons.id, { onDelete: 'cascade' }),
    ownerId: varchar('owner_id', { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    originalKey: varchar('original_key', { length: 512 }).notNull(),
    displayKey: varchar('display_key', { length: 512 }).notNull(),
    thumbKey: varchar('thumb_key', { length: 512 }).notNull(),
    /** A lossless copy of the shrunk image colours are measured on, so a region edit needs no decode. */
    analysisKey: varchar('analysis_key', { length: 512 }),
    contentType: varchar('content_type', { length: 64 }).notNull(),
    byteSize: bigint('byte_size', { mode: 'number' }).notNull(),
    width: int('width').notNull(),
    height: int('height').notNull(),
    takenAt: timestamp('taken_at', { mode: 'date' }),
    camera: varchar('camera', { length: 160 }),
    lens: varchar('lens', { length: 160 }),
    exposure: varchar('exposure', { length: 160 }),
    whiteBalance: varchar('white_balance', { length: 32 }),
    ...timestamps,
  },
  (table) => [index('photos_coupon_idx').on(table.couponId)],
);

export const regionKinds = ['layer', 'grey'] as const;

/** A rectangle on a photo, in pixels of the upright image: one per layer, optionally one grey card. */
export const regions = mysqlTable(
  'regions',
  {
    id: int('id').autoincrement().primaryKey(),
    photoId: int('photo_id')
      .notNull()
      .references(() => photos.id, { onDelete: 'cascade' }),
    kind: mysqlEnum('kind', regionKinds).notNull(),
    layerId: int('layer_id').references(() => couponLayers.id, { onDelete: 'cascade' }),
    x: int('x').notNull(),
    y: int('y').notNull(),
    width: int('width').notNull(),
    height: int('height').notNull(),
    /** A grey card's reflectance in percent, as the person gave it (null: a standard 18 % card). */
    reflectance: double('reflectance'),
    ...timestamps,
  },
  (table) => [index('regions_photo_idx').on(table.photoId)],
);

/**
 * One extracted colour of a region (or the region's mean when `isMean`). Colour in D65 CIELAB
 * and OKLab; coupon and alloy are copied here so colour search needs no joins.
 */
export const swatches = mysqlTable(
  'swatches',
  {
    id: int('id').autoincrement().primaryKey(),
    regionId: int('region_id').references(() => regions.id, { onDelete: 'cascade' }),
    photoId: int('photo_id')
      .notNull()
      .references(() => photos.id, { onDelete: 'cascade' }),
    couponId: int('coupon_id')
      .notNull()
      .references(() => coupons.id, { onDelete: 'cascade' }),
    layerId: int('layer_id').references(() => couponLayers.id, { onDelete: 'cascade' }),
    alloyId: int('alloy_id').references(() => alloys.id, { onDelete: 'restrict' }),
    rank: smallint('rank').notNull(),
    isMean: boolean('is_mean').notNull().default(false),
    share: double('share').notNull(),
    spread: double('spread').notNull(),
    hex: char('hex', { length: 7 }).notNull(),
    labL: double('lab_l').notNull(),
    labA: double('lab_a').notNull(),
    labB: double('lab_b').notNull(),
    oklabL: double('oklab_l').notNull(),
    oklabA: double('oklab_a').notNull(),
    oklabB: double('oklab_b').notNull(),
    /**
     * The swatch's cell in CIELAB for colour search: L* and a* in steps of LAB_CELL (library/colour-box.ts),
     * so the colour index can be read as ranges of b* in a block of cells around the colour.
     */
    labLCell: int('lab_l_cell').generatedAlwaysAs(sql`floor(\`lab_l\` / 2)`, { mode: 'stored' }),
    labACell: int('lab_a_cell').generatedAlwaysAs(sql`floor(\`lab_a\` / 4)`, { mode: 'stored' }),
    createdAt: timestamps.createdAt,
  },
  (table) => [
    index('swatches_region_idx').on(table.regionId),
    index('swatches_coupon_idx').on(table.couponId),
    // Colour search (library/colour-search.ts): covering, so the nearest swatches are found from the index alone.
    index('swatches_colour_cell_idx').on(table.isMean, table.labLCell, table.labACell, table.labB, table.labL, table.labA),
    index('swatches_alloy_colour_cell_idx').on(table.alloyId, table.isMean, table.labLCell, table.labACell, table.labB, table.labL, table.labA),
  ],
);
