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
    createdAt: timestamps.createdAt,
  },
  (table) => [
    index('swatches_region_idx').on(table.regionId),
    index('swatches_coupon_idx').on(table.couponId),
    index('swatches_alloy_colour_idx').on(table.alloyId, table.labL, table.labA, table.labB),
    // Colour search with no alloy: a range on L* with a*, b* checked from the index.
    index('swatches_colour_idx').on(table.labL, table.labA, table.labB),
  ],
);
