import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import { alloys, classCoupons, classes, colourSheetItems, colourSheets, couponLayers, coupons, swatches, users } from '../../db/schema';
import { demoClass } from '../../scripts/seed/classes';
import { demoSheet } from '../../scripts/seed/sheets';
import { api, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';

/**
 * The demo instructor's published colour sheet, as seeded: for the demo class, the class's own
 * shared coupons in teaching order, each layer's measured swatch with the heat planner's band.
 */
const { db, pool } = testDatabase();
afterAll(() => pool.end());

interface Entry {
  kind: 'heading' | 'swatch';
  text?: string;
  swatchId: number | null;
  couponId: number | null;
  hex: string;
  heat: { temperatureC: number | null; holdSeconds: number | null };
  prediction: { hex: string; name: string } | null;
}

let sheetId: number;
let classId: number;
let student: Jar;
let entries: Entry[];

beforeAll(async () => {
  const [cls] = await db.select().from(classes).where(eq(classes.name, demoClass.name));
  classId = cls.id;
  const [row] = await db
    .select({ id: colourSheets.id })
    .from(colourSheets)
    .innerJoin(users, eq(users.id, colourSheets.ownerId))
    .where(and(eq(users.email, demo.instructor), eq(colourSheets.title, demoSheet.title)));
  sheetId = row.id;
  // The demo member is one of the class's students (scripts/seed/classes.ts).
  student = await signedIn(demo.member);
  const response = await api(`/api/sheets/${sheetId}`, { jar: student });
  expect(response.status).toBe(200);
  entries = ((await response.json()) as { entries: Entry[] }).entries;
}, 30_000);

const swatchEntries = () => entries.filter((entry) => entry.kind === 'swatch');

describe('the demo colour sheet', () => {
  it('is the demo instructor’s, published to the demo class only', async () => {
    const [sheet] = await db.select().from(colourSheets).where(eq(colourSheets.id, sheetId));
    expect(sheet).toMatchObject({ classId, status: 'published', audience: 'class', showPrediction: true, pageSize: 'a4' });
    expect(sheet.intro?.length).toBeGreaterThan(100);
    // Nobody outside the class sees it: member2 is not in it, visitors are not.
    expect((await api(`/api/sheets/${sheetId}`, { jar: await signedIn(demo.member2) })).status).toBe(404);
    expect((await api(`/api/sheets/${sheetId}`)).status).toBe(404);
  });

  it('has about twelve swatches under headings, every one from a coupon shared with the class', async () => {
    const swatchRows = swatchEntries();
    expect(swatchRows.length).toBeGreaterThanOrEqual(10);
    expect(swatchRows.length).toBeLessThanOrEqual(14);
    expect(entries[0].kind).toBe('heading');
    const headings = entries.filter((entry) => entry.kind === 'heading').map((entry) => entry.text!);
    expect(headings.slice(0, 2)).toEqual([demoSheet.headings.steel, demoSheet.headings.titanium]);
    // Then one heading per laminate coupon, naming its heat, over its two layers.
    expect(headings.length).toBeGreaterThan(2);
    for (const heading of headings.slice(2)) expect(heading).toMatch(new RegExp(`^${demoSheet.headings.laminate}, \\d+ °C for \\d+ min$`));
    const shared = await db.select({ couponId: classCoupons.couponId }).from(classCoupons).where(eq(classCoupons.classId, classId));
    const sharedIds = new Set(shared.map((row) => row.couponId));
    for (const entry of swatchRows) expect(sharedIds.has(entry.couponId!), `coupon ${entry.couponId}`).toBe(true);
  });

  it('places each layer’s dominant swatch: its measured cluster with the largest share', async () => {
    const ids = swatchEntries().map((entry) => entry.swatchId!);
    const placed = await db.select({ id: swatches.id, layerId: swatches.layerId }).from(swatches).where(inArray(swatches.id, ids));
    for (const { id, layerId } of placed) {
      expect(layerId, `swatch ${id} has a layer`).not.toBeNull();
      const [largest] = await db
        .select({ id: swatches.id })
        .from(swatches)
        .where(and(eq(swatches.layerId, layerId!), eq(swatches.isMean, false)))
        .orderBy(desc(swatches.share), asc(swatches.id))
        .limit(1);
      expect(largest.id).toBe(id);
    }
  });

  it('reads in teaching order: under each heading, coolest heat first, then the shorter hold', () => {
    let group: Entry[] = [];
    const groups: Entry[][] = [];
    for (const entry of entries) {
      if (entry.kind === 'heading') groups.push((group = []));
      else group.push(entry);
    }
    for (const swatchesOfGroup of groups) {
      const heats = swatchesOfGroup.map((entry) => [entry.heat.temperatureC!, entry.heat.holdSeconds!]);
      const sorted = [...heats].sort((x, y) => x[0] - y[0] || x[1] - y[1]);
      expect(heats).toEqual(sorted);
    }
  });

  it('the steel ladder runs from straw to blue', async () => {
    // Common practice (temper colour charts, e.g. Dooley 1919): the film runs pale straw → brown →
    // purple → blue as the heat rises; straw is a yellow (CIELAB b* > 0), blue has b* < 0.
    const steelHeading = entries.findIndex((entry) => entry.text === demoSheet.headings.steel);
    const next = entries.findIndex((entry, index) => index > steelHeading && entry.kind === 'heading');
    const steel = entries.slice(steelHeading + 1, next);
    const lightness = await db
      .select({ id: swatches.id, b: swatches.labB })
      .from(swatches)
      .where(
        inArray(
          swatches.id,
          steel.map((entry) => entry.swatchId!),
        ),
      );
    const byId = new Map(lightness.map((row) => [row.id, row]));
    const first = byId.get(steel[0].swatchId!)!;
    const last = byId.get(steel[steel.length - 1].swatchId!)!;
    expect(first.b).toBeGreaterThan(0);
    expect(last.b).toBeLessThan(0);
  });

  it('shows beside each heated swatch the band the heat planner predicts for its layer’s alloy and heat', async () => {
    const layerAlloys = await db
      .select({ id: swatches.id, alloy: alloys.slug })
      .from(swatches)
      .innerJoin(couponLayers, eq(couponLayers.id, swatches.layerId))
      .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
      .where(
        inArray(
          swatches.id,
          swatchEntries().map((entry) => entry.swatchId!),
        ),
      );
    const alloyOf = new Map(layerAlloys.map((row) => [row.id, row.alloy]));
    let predicted = 0;
    for (const entry of swatchEntries()) {
      // The planner as a visitor is asked (the reference data, no library fit), as the sheet is.
      const response = await api('/api/tint/predict', {
        json: {
          alloy: alloyOf.get(entry.swatchId!),
          process: 'heat',
          temperatureC: entry.heat.temperatureC,
          holdMinutes: entry.heat.holdSeconds! / 60,
          atmosphere: 'air',
        },
      });
      const answer = (await response.json()) as { outcome: string; colour?: { hex: string; name: string } };
      if (answer.outcome === 'prediction') {
        expect(entry.prediction, `swatch ${entry.swatchId}`).toMatchObject({ hex: answer.colour!.hex, name: answer.colour!.name });
        predicted += 1;
      } else expect(entry.prediction).toBeNull();
    }
    expect(predicted).toBeGreaterThanOrEqual(8);
  });

  it('prints as an A4 PDF with every swatch’s hex, the safety caution and the colour note', async () => {
    const response = await api(`/api/sheets/${sheetId}/pdf`, { jar: student });
    expect(response.headers.get('content-type')).toBe('application/pdf');
    const file = path.join(mkdtempSync(path.join(tmpdir(), 'oxbloom-demo-sheet-')), 'sheet.pdf');
    writeFileSync(file, new Uint8Array(await response.arrayBuffer()));
    // Source: ISO 216 A4, 210 × 297 mm = 595 × 842 pt.
    expect(execFileSync('pdfinfo', [file], { encoding: 'utf8' })).toMatch(/Page size:\s+595 x 842 pts/);
    const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    for (const entry of swatchEntries()) expect(text).toContain(entry.hex.toUpperCase());
    expect(text).toContain(demoSheet.title);
    expect(text).toMatch(/Screen and print colours differ from the metal/);
  });
});

describe('the demo class’s shares', () => {
  it('are twelve photographed coupons of the class’s ladders, four from each student', async () => {
    const rows = await db
      .select({ id: coupons.id, ownerId: coupons.ownerId, layerKey: coupons.layerKey })
      .from(classCoupons)
      .innerJoin(coupons, eq(coupons.id, classCoupons.couponId))
      .where(eq(classCoupons.classId, classId));
    expect(rows).toHaveLength(demoClass.students.length * demoClass.sharedPerStudent);
    for (const row of rows) expect(demoClass.ladders).toContain(row.layerKey);
    const measured = await db
      .selectDistinct({ couponId: swatches.couponId })
      .from(swatches)
      .where(
        inArray(
          swatches.couponId,
          rows.map((row) => row.id),
        ),
      );
    expect(measured).toHaveLength(rows.length);
    const owners = new Map<string, number>();
    for (const row of rows) owners.set(row.ownerId, (owners.get(row.ownerId) ?? 0) + 1);
    expect([...owners.values()]).toEqual(demoClass.students.map(() => demoClass.sharedPerStudent));
  });

  it('the seeded items keep their order positions without gaps', async () => {
    const positions = await db
      .select({ position: colourSheetItems.position })
      .from(colourSheetItems)
      .where(eq(colourSheetItems.sheetId, sheetId))
      .orderBy(colourSheetItems.position);
    expect(positions.map((row) => row.position)).toEqual(positions.map((_, index) => index));
  });
});
