// Synthetic demo photos (invented data, for the demo only): each chosen coupon is drawn as a
// plate of its layers' heat tints beside a grey card, under a slightly warm light, with sensor
// noise; stored in S3 like an upload and measured with a region per layer and the grey card.
import { asc, eq, inArray } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { alloys, couponLayers, coupons, photos } from '../../db/schema';
import type { RegionInput } from '~/lib/photos';
import { developPhoto } from '~/lib/server/photos/attach';
import { newUploadKey } from '~/lib/server/photos/keys';
import { photoTransaction, recordPhoto } from '~/lib/server/photos/records';
import { storeFiles } from '~/lib/server/photos/store';
import { putObject, s3 } from '~/lib/server/storage';
import { anodizeThicknessNm, colourAt, findTintModel, heatThicknessNm, MAX_THICKNESS_NM } from '~/lib/tint';
import { seededChoices } from './random';
import { encodeJpeg, GREY_CARD, renderScene, type Patch } from './synthetic-photos';

const WIDTH = 1200;
const HEIGHT = 800;
/** Photos per owner and visibility; with five owners and three visibilities, at most 30 photos. */
const PER_OWNER_AND_VISIBILITY = 2;
/** A purge of argon keeps the film far thinner than air would (an invented factor, for the demo). */
const ARGON_FACTOR = 0.12;
const BACKGROUND = '#2e2c2a';
const NOISE_SIGMA = 3.5;

/**
 * How much faster (> 1) or slower each alloy's film grows than its model says: invented for the
 * demo and not measured, so the layers of a demo laminate differ the way real ones do (the
 * models give all titanium grades one law) and the library fit has something to find.
 */
const DEMO_GROWTH: Record<string, number> = {
  'ti-grade-1': 1.12,
  'ti-grade-2': 1.08,
  'ti-grade-4': 1.0,
  'ti-grade-5': 0.86,
  'ti-grade-9': 0.94,
  'ti-grade-23': 0.82,
  'steel-1084': 1.0,
  'steel-1095': 1.04,
  'steel-w2': 1.06,
  'steel-15n20': 0.8,
  'steel-o1': 0.9,
  'steel-52100': 0.88,
};

export interface DemoCoupon {
  id: number;
  ownerId: string;
  visibility: string;
  process: string;
  temperatureC: number | null;
  holdSeconds: number | null;
  volts: number | null;
  atmosphere: string;
  layers: { id: number; alloy: string }[];
}

type Random = ReturnType<typeof seededChoices>;

/** The oxide thickness the coupon's heat gives an alloy under its model, or null when the model cannot say. */
function thicknessNm(coupon: DemoCoupon, alloy: string): number | null {
  const model = findTintModel(alloy);
  if (!model?.optics) return null;
  if (coupon.process === 'anodize') return model.anodize && coupon.volts ? anodizeThicknessNm(model.anodize.nmPerVolt.mid, coupon.volts) : null;
  if (!model.heat || coupon.temperatureC === null || !coupon.holdSeconds) return null;
  const law = heatThicknessNm(model.heat.law, coupon.temperatureC, coupon.holdSeconds / 60);
  const grown = law * (DEMO_GROWTH[alloy] ?? 1) * (coupon.atmosphere === 'argon' ? ARGON_FACTOR : 1);
  return Math.min(grown, MAX_THICKNESS_NM);
}

interface DemoPhoto {
  jpeg: Buffer;
  regions: RegionInput[];
}

/**
 * Draws the coupon: a plate with its layers as stripes (a laminate alternates them, as in a
 * billet's cross-section), the film a little thicker towards one end, a grey card to its right.
 */
export async function drawScene(coupon: DemoCoupon, thicknesses: number[], random: Random): Promise<DemoPhoto> {
  const warmth = random.between(0, 1);
  const cast = [1, 1 - 0.07 * warmth, 1 - 0.22 * warmth] as const;
  const plate = { x: 90, y: 150, width: 720, height: 500 };
  const grey = { x: 880, y: 200, width: 230, height: 400 };
  const stripes = coupon.layers.length === 1 ? 1 : coupon.layers.length * 3;
  const stripeHeight = Math.floor(plate.height / stripes);
  const columns = 12;
  const columnWidth = plate.width / columns;
  // Each layer's colour across the plate, from 3 % thinner to 3 % thicker film.
  const shades = coupon.layers.map((layer, index) =>
    Array.from({ length: columns }, (_, column) => {
      const optics = findTintModel(layer.alloy)!.optics!;
      return colourAt(optics, thicknesses[index] * (0.97 + (0.06 * column) / (columns - 1))).hex;
    }),
  );
  const patches: Patch[] = [];
  for (let stripe = 0; stripe < stripes; stripe += 1) {
    const y = plate.y + stripe * stripeHeight;
    // The last stripe takes the rows the division left over.
    const height = stripe === stripes - 1 ? plate.y + plate.height - y : stripeHeight;
    for (let column = 0; column < columns; column += 1) {
      patches.push({ region: { x: plate.x + column * columnWidth, y, width: columnWidth, height }, colour: shades[stripe % coupon.layers.length][column] });
    }
  }
  patches.push({ region: grey, colour: GREY_CARD });
  const image = renderScene({
    width: WIDTH,
    height: HEIGHT,
    background: BACKGROUND,
    patches,
    cast,
    noise: { sigma: NOISE_SIGMA, random: random.next, sampling: 'row' },
  });
  const jpeg = await encodeJpeg(image, 90);
  const inset = 24;
  const regions: RegionInput[] = coupon.layers.map((layer, index) => ({
    kind: 'layer',
    layerId: layer.id,
    x: plate.x + inset,
    y: plate.y + index * stripeHeight + Math.min(inset, Math.floor(stripeHeight / 4)),
    width: plate.width - 2 * inset,
    height: stripeHeight - 2 * Math.min(inset, Math.floor(stripeHeight / 4)),
  }));
  regions.push({ kind: 'grey', x: grey.x + inset, y: grey.y + inset, width: grey.width - 2 * inset, height: grey.height - 2 * inset });
  return { jpeg, regions };
}

async function demoCoupons(db: Database): Promise<DemoCoupon[]> {
  const rows = await db
    .select({
      id: coupons.id,
      ownerId: coupons.ownerId,
      visibility: coupons.visibility,
      process: coupons.process,
      temperatureC: coupons.temperatureC,
      holdSeconds: coupons.holdSeconds,
      volts: coupons.volts,
      atmosphere: coupons.atmosphere,
    })
    .from(coupons)
    .orderBy(asc(coupons.id));
  const layers = await db
    .select({ couponId: couponLayers.couponId, id: couponLayers.id, alloy: alloys.slug })
    .from(couponLayers)
    .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
    .where(
      inArray(
        couponLayers.couponId,
        rows.map((row) => row.id),
      ),
    )
    .orderBy(asc(couponLayers.couponId), asc(couponLayers.position));
  return rows.map((row) => ({ ...row, layers: layers.filter((layer) => layer.couponId === row.id) }));
}

/** One photo stored and measured as if uploaded and attached with its regions. */
async function storeDemoPhoto(db: Database, coupon: DemoCoupon, scene: DemoPhoto): Promise<void> {
  const key = newUploadKey(coupon.ownerId, 'image/jpeg');
  await putObject(key, scene.jpeg, 'image/jpeg');
  const developed = await developPhoto(scene.jpeg, { regions: scene.regions, layerIds: coupon.layers.map((layer) => layer.id) });
  const files = await storeFiles({ key, byteSize: scene.jpeg.length, contentType: developed.contentType }, developed.derived);
  await photoTransaction(db, (tx) =>
    recordPhoto(tx, { couponId: coupon.id, ownerId: coupon.ownerId, decoded: developed, files, regions: scene.regions, analysis: developed.analysis }),
  );
}

/**
 * Gives demo coupons synthetic photos: for every owner and visibility, the first coupons whose
 * layers all have a tint model for their process. Returns how many photos were stored.
 */
export async function seedDemoPhotos(db: Database): Promise<number> {
  const random = seededChoices(20261202);
  const taken = new Map<string, number>();
  // Scenes are drawn in order (the random draws stay the same); two are stored at a time.
  const storing = new Set<Promise<void>>();
  let stored = 0;
  try {
    // A seed that stopped half-way is finished on the next start: coupons with photos count as done.
    const done = new Set((await db.selectDistinct({ couponId: photos.couponId }).from(photos)).map((row) => row.couponId));
    for (const coupon of await demoCoupons(db)) {
      const slot = `${coupon.ownerId}/${coupon.visibility}`;
      if ((taken.get(slot) ?? 0) >= PER_OWNER_AND_VISIBILITY) continue;
      if (done.has(coupon.id)) {
        taken.set(slot, (taken.get(slot) ?? 0) + 1);
        continue;
      }
      const thicknesses = coupon.layers.map((layer) => thicknessNm(coupon, layer.alloy));
      if (coupon.layers.length === 0 || thicknesses.some((thickness) => thickness === null || thickness < 5)) continue;
      taken.set(slot, (taken.get(slot) ?? 0) + 1);
      const scene = await drawScene(coupon, thicknesses as number[], random);
      const work: Promise<void> = storeDemoPhoto(db, coupon, scene).then(() => {
        storing.delete(work);
        stored += 1;
      });
      storing.add(work);
      if (storing.size >= 2) await Promise.race(storing);
    }
    await Promise.all(storing);
  } finally {
    s3().destroy();
  }
  return stored;
}
