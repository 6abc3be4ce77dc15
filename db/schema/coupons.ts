import { double, index, int, mysqlEnum, mysqlTable, smallint, text, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { timestamps } from './columns';
import { users } from './users';
import { alloys } from './alloys';
import { atmospheres, coolings, processes, surfacePreparations, temperatureMethods, visibilities } from './enums';

/**
 * One test coupon and its heat record. Temperatures in °C, times in seconds, flow in L/min.
 * `layerKey` is the sorted alloy slugs joined by '+', so the library can filter by alloy pair
 * with one indexed column. `dominantLabL` is the first layer's dominant swatch's L* (the measured
 * cluster with the largest share over its photos; NULL with none), kept by the photo writers, so
 * the library can sort by lightness on an index.
 */
export const coupons = mysqlTable(
  'coupons',
  {
    id: int('id').autoincrement().primaryKey(),
    ownerId: varchar('owner_id', { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    title: varchar('title', { length: 160 }).notNull(),
    layerKey: varchar('layer_key', { length: 255 }).notNull(),
    surfacePrep: mysqlEnum('surface_prep', surfacePreparations).notNull(),
    surfaceGrit: smallint('surface_grit'),
    process: mysqlEnum('process', processes).notNull(),
    temperatureC: double('temperature_c'),
    temperatureMethod: mysqlEnum('temperature_method', temperatureMethods),
    holdSeconds: int('hold_seconds'),
    volts: double('volts'),
    atmosphere: mysqlEnum('atmosphere', atmospheres).notNull().default('air'),
    argonFlowLpm: double('argon_flow_lpm'),
    atmosphereNote: varchar('atmosphere_note', { length: 255 }),
    cooling: mysqlEnum('cooling', coolings),
    notes: text('notes'),
    visibility: mysqlEnum('visibility', visibilities).notNull().default('private'),
    dominantLabL: double('dominant_lab_l'),
    ...timestamps,
  },
  (table) => [
    index('coupons_owner_idx').on(table.ownerId, table.createdAt),
    index('coupons_visibility_idx').on(table.visibility, table.createdAt),
    // The front page's newest public coupons of one pair: an ordered walk that stops at a handful.
    index('coupons_visibility_pair_idx').on(table.visibility, table.layerKey, table.createdAt),
    index('coupons_layer_key_idx').on(table.layerKey, table.temperatureC),
    index('coupons_process_idx').on(table.process, table.temperatureC),
    index('coupons_temperature_idx').on(table.temperatureC),
    index('coupons_hold_idx').on(table.holdSeconds),
    index('coupons_atmosphere_idx').on(table.atmosphere),
    index('coupons_lightness_idx').on(table.dominantLabL),
    // The library's date order for a member (public, members' and own): an ordered walk that stops at the page.
    index('coupons_created_idx').on(table.createdAt),
  ],
);

/** One alloy in a coupon; a laminate has two or more, ordered by position. */
export const couponLayers = mysqlTable(
  'coupon_layers',
  {
    id: int('id').autoincrement().primaryKey(),
    couponId: int('coupon_id')
      .notNull()
      .references(() => coupons.id, { onDelete: 'cascade' }),
    position: smallint('position').notNull(),
    alloyId: int('alloy_id')
      .notNull()
      .references(() => alloys.id, { onDelete: 'restrict' }),
  },
  (table) => [uniqueIndex('coupon_layers_position_idx').on(table.couponId, table.position), index('coupon_layers_alloy_idx').on(table.alloyId)],
);
