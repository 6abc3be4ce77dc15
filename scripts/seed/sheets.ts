// The demo instructor's published colour sheet for the demo class (invented): the class's shared
// ladders in teaching order — 1084 from straw to blue, titanium from gold to blue, then a laminate's
// two layers side by side — with the heat planner's band beside each measured swatch. Seeded after
// the photos, since a sheet places measured swatches.
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { alloys, classCoupons, classes, colourSheetItems, colourSheets, couponLayers, coupons, swatches, type SheetSwatchSnapshot } from '../../db/schema';
import { demoClass } from './classes';

export const demoSheet = {
  title: 'Temper and oxide colours: what the class made',
  intro:
    'Every swatch here is one of your own coupons, photographed beside the grey card and measured. Read each ladder from the coolest heat to the hottest: the oxide film thickens and the colour walks from straw through bronze and purple to blue. The small square beside a swatch is the heat planner’s prediction for the same heat in air; where the two agree, the model has your oven right.',
  headings: {
    steel: '1084 carbon steel: straw to blue',
    titanium: 'Titanium Grade 2 in the kiln: straw to light blue',
    /** One heading per laminate coupon, its heat after it, so each pair of layers shares a row. */
    laminate: 'One heat, two alloys: Grade 2 / Grade 5 laminate',
  },
  /** How many coupons of each ladder go on the sheet. */
  take: { steel: 5, titanium: 3, laminate: 2 },
};

/** Captions by ladder and place on it (invented teaching notes, read with the colours the seed draws). */
const captions: Record<keyof typeof demoSheet.headings, string[]> = {
  steel: [
    'Straw: where a kitchen knife’s edge is drawn.',
    'Only 40 °C hotter, held as long, and already deep blue: bronze and purple lie between.',
    'Hotter again for a third of the hold: the same blue. Time trades against heat.',
    'The same 280 °C held an hour moves on to light blue.',
    'Light blue: the end of the temper colours. Hotter still and the film greys.',
  ],
  titanium: [
    'Pale straw: the film is still thin.',
    'Fifty degrees hotter, twice the hold. The model says bronze; the class got deeper.',
    'Light blue: the end of the first order of colours.',
  ],
  laminate: ['Grade 2 leads…', '…and Grade 5 lags behind in the same heat.', 'Fifty degrees hotter, both layers move on…', '…and the gap between them stays.'],
};

/** "One heat, two alloys: Grade 2 / Grade 5 laminate, 600 °C for 10 min". */
export const laminateHeading = (coupon: { temperatureC: number | null; holdSeconds: number | null }) =>
  `${demoSheet.headings.laminate}, ${coupon.temperatureC} °C for ${Math.round((coupon.holdSeconds ?? 0) / 60)} min`;

type Ladder = keyof typeof demoSheet.headings;
const ladderOf = (layerKey: string): Ladder | null =>
  layerKey === 'steel-1084+steel-15n20' ? 'steel' : layerKey === 'ti-grade-2' ? 'titanium' : layerKey === 'ti-grade-2+ti-grade-5' ? 'laminate' : null;

interface Measured {
  swatchId: number;
  hex: string;
  lab: [number, number, number];
  alloy: string;
  alloyName: string;
  position: number;
}

export async function seedDemoSheet(db: Database): Promise<number | null> {
  const [cls] = await db.select({ id: classes.id, instructorId: classes.instructorId }).from(classes).where(eq(classes.name, demoClass.name));
  if (!cls) return null;
  const shared = await db
    .select({
      id: coupons.id,
      title: coupons.title,
      layerKey: coupons.layerKey,
      temperatureC: coupons.temperatureC,
      holdSeconds: coupons.holdSeconds,
      process: coupons.process,
    })
    .from(classCoupons)
    .innerJoin(coupons, eq(coupons.id, classCoupons.couponId))
    .where(eq(classCoupons.classId, cls.id))
    .orderBy(asc(coupons.temperatureC), asc(coupons.holdSeconds), asc(coupons.id));
  if (shared.length === 0) return null;

  // Each layer's dominant swatch: its largest measured cluster (means left out), as the library reads it.
  const rows = await db
    .select({
      couponId: swatches.couponId,
      swatchId: swatches.id,
      hex: swatches.hex,
      l: swatches.labL,
      a: swatches.labA,
      b: swatches.labB,
      layerId: swatches.layerId,
      alloy: alloys.slug,
      alloyName: alloys.name,
      position: couponLayers.position,
    })
    .from(swatches)
    .innerJoin(couponLayers, eq(couponLayers.id, swatches.layerId))
    .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
    .where(
      and(
        inArray(
          swatches.couponId,
          shared.map((coupon) => coupon.id),
        ),
        eq(swatches.isMean, false),
      ),
    )
    .orderBy(desc(swatches.share), asc(swatches.id));
  const dominant = new Map<number, Measured[]>();
  const seenLayers = new Set<number>();
  for (const row of rows) {
    if (row.layerId === null || seenLayers.has(row.layerId)) continue;
    seenLayers.add(row.layerId);
    const measured = {
      swatchId: row.swatchId,
      hex: row.hex,
      lab: [row.l, row.a, row.b] as [number, number, number],
      alloy: row.alloy,
      alloyName: row.alloyName,
      position: row.position,
    };
    dominant.set(
      row.couponId,
      [...(dominant.get(row.couponId) ?? []), measured].sort((x, y) => x.position - y.position),
    );
  }

  const items: (typeof colourSheetItems.$inferInsert)[] = [];
  for (const ladder of Object.keys(demoSheet.headings) as Ladder[]) {
    const ofLadder = shared.filter((coupon) => ladderOf(coupon.layerKey) === ladder && dominant.has(coupon.id));
    // The laminate's coolest heats barely tint: show its hottest two.
    const chosen = ladder === 'laminate' ? ofLadder.slice(-demoSheet.take[ladder]) : ofLadder.slice(0, demoSheet.take[ladder]);
    if (chosen.length === 0) continue;
    if (ladder !== 'laminate') items.push({ sheetId: 0, position: 0, kind: 'heading', heading: demoSheet.headings[ladder] });
    let place = 0;
    for (const coupon of chosen) {
      if (ladder === 'laminate') items.push({ sheetId: 0, position: 0, kind: 'heading', heading: laminateHeading(coupon) });
      const layers = dominant.get(coupon.id)!;
      // The steel ladder shows the 1084 layer of each billet offcut; the laminate both of its layers.
      const shown = ladder === 'steel' ? layers.filter((layer) => layer.alloy === 'steel-1084') : layers;
      for (const layer of shown) {
        const snapshot: SheetSwatchSnapshot = {
          hex: layer.hex,
          lab: layer.lab,
          couponTitle: coupon.title,
          temperatureC: coupon.temperatureC,
          holdSeconds: coupon.holdSeconds,
          process: coupon.process,
          alloys: layers.map((each) => each.alloyName),
        };
        items.push({
          sheetId: 0,
          position: 0,
          kind: 'swatch',
          swatchId: layer.swatchId,
          couponId: coupon.id,
          snapshot,
          caption: captions[ladder][place] ?? null,
          // Every swatch here was heated in the oven, and the headings name the alloy: keep the cell short.
          hideProcess: true,
          hideAlloy: ladder !== 'laminate',
        });
        place += 1;
      }
    }
  }

  return db.transaction(async (tx) => {
    const [result] = await tx.insert(colourSheets).values({
      ownerId: cls.instructorId,
      classId: cls.id,
      title: demoSheet.title,
      intro: demoSheet.intro,
      units: 'c',
      pageSize: 'a4',
      orientation: 'portrait',
      status: 'published',
      audience: 'class',
      showPrediction: true,
      publishedAt: new Date(),
    });
    const sheetId = result.insertId;
    await tx.insert(colourSheetItems).values(items.map((item, position) => ({ ...item, sheetId, position })));
    return sheetId;
  });
}
