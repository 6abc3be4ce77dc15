import { and, asc, eq, exists, inArray, lt, sql } from 'drizzle-orm';
import { appSettings, classes, coupons, photos, swatches, users } from '../../db/schema';
import { api, type Jar } from './app';
import { demoClass } from '../../scripts/seed/classes';
import { testDatabase } from './database';

/**
 * The demo's own rows that browser tests open pages of: only rows the seed made (before its
 * `demo-seeded` marker), since other test files add and delete coupons meanwhile.
 */
export interface DemoIds {
  /** The demo member's oldest coupon with a photo: its page shows the photo and the region tool. */
  memberPhotoCoupon: number;
  /** Public coupons with swatches, oldest first (at least two). */
  publicCoupons: number[];
  /** Swatches of public coupons, for sheets. */
  publicSwatches: number[];
  demoClass: number;
}

export async function demoIds(): Promise<DemoIds> {
  const { db, pool } = testDatabase();
  try {
    const [marker] = await db.select().from(appSettings).where(eq(appSettings.key, 'demo-seeded'));
    const seeded = lt(coupons.createdAt, marker.createdAt);
    const [member] = await db.select({ id: users.id }).from(users).where(eq(users.email, 'member@oxbloom.test'));
    const withPhoto = exists(
      db
        .select({ one: sql`1` })
        .from(photos)
        .where(eq(photos.couponId, coupons.id)),
    );
    const withSwatch = exists(
      db
        .select({ one: sql`1` })
        .from(swatches)
        .where(eq(swatches.couponId, coupons.id)),
    );
    const [own] = await db
      .select({ id: coupons.id })
      .from(coupons)
      .where(and(seeded, eq(coupons.ownerId, member.id), withPhoto))
      .orderBy(asc(coupons.id))
      .limit(1);
    const shown = await db
      .select({ id: coupons.id })
      .from(coupons)
      .where(and(seeded, eq(coupons.visibility, 'public'), withSwatch))
      .orderBy(asc(coupons.id))
      .limit(4);
    const publicCoupons = shown.map((row) => row.id);
    const picked = await db.select({ id: swatches.id }).from(swatches).where(inArray(swatches.couponId, publicCoupons)).orderBy(asc(swatches.id)).limit(3);
    const [cls] = await db.select({ id: classes.id }).from(classes).where(eq(classes.name, demoClass.name));
    return { memberPhotoCoupon: own.id, publicCoupons, publicSwatches: picked.map((row) => row.id), demoClass: cls.id };
  } finally {
    await pool.end();
  }
}

/** A sheet of the instructor's with a heading and swatches: a draft, or published for everyone. */
export async function demoSheet(instructor: Jar, swatchIds: number[], status: 'draft' | 'published'): Promise<number> {
  const created = await api('/api/sheets', { jar: instructor, json: { title: `Temper colours (${status})`, audience: 'public' } });
  if (created.status !== 201 && created.status !== 200) throw new Error(`Starting a sheet answered ${created.status}`);
  const { id } = (await created.json()) as { id: number };
  const items = [{ kind: 'heading', text: 'Straw to blue' }, ...swatchIds.map((swatchId) => ({ kind: 'swatch', swatchId, caption: 'From the library' }))];
  const changed = await api(`/api/sheets/${id}`, { method: 'PATCH', jar: instructor, json: { items, status } });
  if (changed.status !== 200) throw new Error(`Filling the sheet answered ${changed.status}: ${await changed.text()}`);
  return id;
}
