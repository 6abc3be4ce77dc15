import { and, asc, desc, eq, inArray, or, sql } from 'drizzle-orm';
import { alloys, classes, colourSheetItems, colourSheets, coupons, swatches, users, type SheetSwatchSnapshot } from '../../../../db/schema';
import type { CreateSheetInput, SheetItemInput, UpdateSheetInput } from '~/lib/sheets/requests';
import { db } from '../db';
import type { Viewer } from '../visibility';
import type { SheetAccess } from './access';

/** Reads and writes of colour sheets and their entries. */

export type SheetRow = typeof colourSheets.$inferSelect & { ownerName: string | null; className: string | null };
export type SheetItemRow = typeof colourSheetItems.$inferSelect;

export async function findSheet(id: number): Promise<SheetRow | undefined> {
  const [row] = await db()
    .select({ sheet: colourSheets, ownerName: users.name, className: classes.name })
    .from(colourSheets)
    .leftJoin(users, eq(users.id, colourSheets.ownerId))
    .leftJoin(classes, eq(classes.id, colourSheets.classId))
    .where(eq(colourSheets.id, id));
  return row ? { ...row.sheet, ownerName: row.ownerName, className: row.className } : undefined;
}

/** The sheets a person may see (the rule of access.ts in SQL), newest first. */
export async function listSheets(viewer: Viewer | null, classIds: ReadonlySet<number>, limit = 200) {
  const published = eq(colourSheets.status, 'published');
  const visible =
    viewer?.role === 'admin'
      ? undefined
      : or(
          and(published, eq(colourSheets.audience, 'public')),
          classIds.size ? and(published, eq(colourSheets.audience, 'class'), inArray(colourSheets.classId, [...classIds])) : undefined,
          viewer ? eq(colourSheets.ownerId, viewer.id) : undefined,
        );
  return db()
    .select({
      id: colourSheets.id,
      title: colourSheets.title,
      status: colourSheets.status,
      audience: colourSheets.audience,
      classId: colourSheets.classId,
      className: classes.name,
      ownerId: colourSheets.ownerId,
      ownerName: users.name,
      updatedAt: colourSheets.updatedAt,
      publishedAt: colourSheets.publishedAt,
    })
    .from(colourSheets)
    .leftJoin(users, eq(users.id, colourSheets.ownerId))
    .leftJoin(classes, eq(classes.id, colourSheets.classId))
    .where(visible)
    .orderBy(desc(colourSheets.updatedAt), desc(colourSheets.id))
    .limit(limit);
}

/** A class's sheets for its page: published ones, and drafts too for those who manage it. */
export async function sheetsOfClass(classId: number, withDrafts: boolean) {
  return db()
    .select({
      id: colourSheets.id,
      title: colourSheets.title,
      status: colourSheets.status,
      publishedAt: colourSheets.publishedAt,
      updatedAt: colourSheets.updatedAt,
    })
    .from(colourSheets)
    .where(and(eq(colourSheets.classId, classId), withDrafts ? undefined : eq(colourSheets.status, 'published')))
    .orderBy(desc(colourSheets.updatedAt), desc(colourSheets.id))
    .limit(50);
}

export async function createSheet(ownerId: string, input: CreateSheetInput): Promise<number> {
  const [result] = await db()
    .insert(colourSheets)
    .values({ ownerId, ...input, intro: input.intro || null, classId: input.classId ?? null });
  return result.insertId;
}

export async function itemsOf(sheetId: number): Promise<SheetItemRow[]> {
  return db().select().from(colourSheetItems).where(eq(colourSheetItems.sheetId, sheetId)).orderBy(asc(colourSheetItems.position));
}

/** A swatch as it is now, with its coupon's heat record and who may see it. */
export interface SwatchSource {
  swatchId: number;
  couponId: number;
  hex: string;
  lab: [number, number, number];
  couponTitle: string;
  ownerId: string;
  visibility: 'private' | 'members' | 'public';
  temperatureC: number | null;
  holdSeconds: number | null;
  volts: number | null;
  process: string;
  atmosphere: 'air' | 'argon' | 'other';
  /** The alloy of the layer the swatch was measured on (null for a whole-photo swatch). */
  layerAlloy: string | null;
}

export async function swatchSources(swatchIds: number[]): Promise<Map<number, SwatchSource>> {
  const found = new Map<number, SwatchSource>();
  if (swatchIds.length === 0) return found;
  const rows = await db()
    .select({
      swatchId: swatches.id,
      couponId: coupons.id,
      hex: swatches.hex,
      labL: swatches.labL,
      labA: swatches.labA,
      labB: swatches.labB,
      couponTitle: coupons.title,
      ownerId: coupons.ownerId,
      visibility: coupons.visibility,
      temperatureC: coupons.temperatureC,
      holdSeconds: coupons.holdSeconds,
      volts: coupons.volts,
      process: coupons.process,
      atmosphere: coupons.atmosphere,
      layerAlloy: alloys.slug,
    })
    .from(swatches)
    .innerJoin(coupons, eq(coupons.id, swatches.couponId))
    .leftJoin(alloys, eq(alloys.id, swatches.alloyId))
    .where(inArray(swatches.id, [...new Set(swatchIds)]));
  for (const { labL, labA, labB, ...row } of rows) found.set(row.swatchId, { ...row, lab: [labL, labA, labB] });
  return found;
}

/** One entry as it will be written: positions come from the list's order. */
export type ItemToWrite =
  | { kind: 'heading'; heading: string }
  | (Omit<Extract<SheetItemInput, { kind: 'swatch' }>, 'itemId' | 'swatchId'> & {
      swatchId: number | null;
      couponId: number | null;
      snapshot: SheetSwatchSnapshot | null;
    });

/**
 * Changes a sheet's settings and, when `items` is given, replaces its entries with the list in
 * its order: one transaction, with the sheet's row locked, so two saves at once land one after
 * the other and never interleave their positions.
 */
export async function updateSheet(id: number, settings: Omit<UpdateSheetInput, 'items' | 'status'>, items: ItemToWrite[] | undefined): Promise<void> {
  await db().transaction(async (tx) => {
    await tx.select({ id: colourSheets.id }).from(colourSheets).where(eq(colourSheets.id, id)).for('update');
    const values = { ...settings, ...(settings.intro !== undefined ? { intro: settings.intro || null } : {}) };
    // Touch updated_at even when only the entries change.
    await tx
      .update(colourSheets)
      .set({ ...values, updatedAt: sql`CURRENT_TIMESTAMP(3)` })
      .where(eq(colourSheets.id, id));
    if (!items) return;
    await tx.delete(colourSheetItems).where(eq(colourSheetItems.sheetId, id));
    if (items.length === 0) return;
    await tx.insert(colourSheetItems).values(
      items.map((item, position) =>
        item.kind === 'heading'
          ? { sheetId: id, position, kind: 'heading' as const, heading: item.heading }
          : {
              sheetId: id,
              position,
              kind: 'swatch' as const,
              swatchId: item.swatchId,
              couponId: item.couponId,
              snapshot: item.snapshot,
              caption: item.caption || null,
              hideTemperature: item.hideTemperature,
              hideHold: item.hideHold,
              hideProcess: item.hideProcess,
              hideAlloy: item.hideAlloy,
            },
      ),
    );
  });
}

/** Publishes a draft; true only for the one request that made the change (so one mail goes out). */
export async function publishSheet(id: number): Promise<boolean> {
  const [result] = await db()
    .update(colourSheets)
    .set({ status: 'published', publishedAt: sql`CURRENT_TIMESTAMP` })
    .where(and(eq(colourSheets.id, id), eq(colourSheets.status, 'draft')));
  return result.affectedRows === 1;
}

export async function unpublishSheet(id: number): Promise<void> {
  await db().update(colourSheets).set({ status: 'draft' }).where(eq(colourSheets.id, id));
}

export async function deleteSheet(id: number): Promise<boolean> {
  const [result] = await db().delete(colourSheets).where(eq(colourSheets.id, id));
  return result.affectedRows === 1;
}

export async function userEmails(userIds: string[]): Promise<{ email: string; name: string | null }[]> {
  if (userIds.length === 0) return [];
  return db().select({ email: users.email, name: users.name }).from(users).where(inArray(users.id, userIds));
}

export const sheetAccessOf = (sheet: SheetRow): SheetAccess => sheet;
