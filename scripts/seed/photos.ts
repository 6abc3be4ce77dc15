// Synthetic demo photos (invented data, for the demo only): each chosen coupon is drawn as a
// plate of its layers' heat tints beside a grey card, under a slightly warm light, with sensor
// noise; stored in S3 like an upload and measured with a region per layer and the grey card.
import { asc, eq, inArray } from 'drizzle-orm';
import sharp from 'sharp';
import type { Database } from '../../db/client';
import { alloys, couponLayers, coupons, photos } from '../../db/schema';
import type { RegionInput } from '../../src/lib/photos';
import { analyseRegions } from '../../src/lib/server/photo-analysis';
import { newUploadKey } from '../../src/lib/server/photo-files';
import { insertPhoto, layerAlloys, photoTransaction, writeRegions } from '../../src/lib/server/photo-records';
import { processPhotoInTurn, writeDerivedFiles } from '../../src/lib/server/photo-store';
import { putObject, s3 } from '../../src/lib/server/storage';
import { anodizeThicknessNm, colourAt, findTintModel, heatThicknessNm, MAX_THICKNESS_NM } from '../../src/lib/tint';
import { seededRandom } from './random';

const WIDTH = 1200;
const HEIGHT = 800;
/** Photos per owner and visibility; with five owners and three visibilities, at most 30 photos. */
const PER_OWNER_AND_VISIBILITY = 2;
/** A purge of argon keeps the film far thinner than air would (an invented factor, for the demo). */
const ARGON_FACTOR = 0.12;
const GREY_CARD = { r: 118, g: 118, b: 118 }; // 18 % reflectance: linear 0.18 in sRGB

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

type Random = ReturnType<typeof seededRandom>;

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

const toLinear = (value: number) => (value <= 0.04045 ? value / 12.92 : ((value + 0.055) / 1.055) ** 2.4);
const toEncoded = (value: number) => (value <= 0.0031308 ? value * 12.92 : 1.055 * value ** (1 / 2.4) - 0.055);
const channels = (hex: string) => [1, 3, 5].map((start) => parseInt(hex.slice(start, start + 2), 16));

/** An sRGB colour as a camera under a light of linear-channel gains `cast` records it. */
function underLight(rgb: number[], cast: number[]): number[] {
  return rgb.map((value, channel) => Math.round(Math.min(1, toEncoded(toLinear(value / 255) * cast[channel])) * 255));
}

const NOISE_TABLE_SIZE = 1 << 16;
const NOISE_SIGMA = 3.5;

/** Gaussian noise values (Box–Muller) of NOISE_SIGMA 8-bit steps, drawn once per scene. */
function noiseTable(random: Random): Float32Array {
  const table = new Float32Array(NOISE_TABLE_SIZE);
  for (let i = 0; i < NOISE_TABLE_SIZE; i += 2) {
    const radius = Math.sqrt(-2 * Math.log(1 - random.next())) * NOISE_SIGMA;
    const angle = 2 * Math.PI * random.next();
    table[i] = radius * Math.cos(angle);
    table[i + 1] = radius * Math.sin(angle);
  }
  return table;
}

interface Scene {
  jpeg: Buffer;
  regions: RegionInput[];
}

/**
 * Draws the coupon: a plate with its layers as stripes (a laminate alternates them, as in a
 * billet's cross-section), the film a little thicker towards one end, a grey card to its right.
 */
export async function drawScene(coupon: DemoCoupon, thicknesses: number[], random: Random): Promise<Scene> {
  const warmth = random.between(0, 1);
  const cast = [1, 1 - 0.07 * warmth, 1 - 0.22 * warmth];
  const plate = { x: 90, y: 150, width: 720, height: 500 };
  const grey = { x: 880, y: 200, width: 230, height: 400 };
  const stripes = coupon.layers.length === 1 ? 1 : coupon.layers.length * 3;
  const stripeHeight = Math.floor(plate.height / stripes);
  const columns = 12;
  // Each layer's colour across the plate, from 3 % thinner to 3 % thicker film.
  const shades = coupon.layers.map((layer, index) =>
    Array.from({ length: columns }, (_, column) => {
      const optics = findTintModel(layer.alloy)!.optics!;
      return underLight(channels(colourAt(optics, thicknesses[index] * (0.97 + (0.06 * column) / (columns - 1))).hex), cast);
    }),
  );
  const background = underLight([46, 44, 42], cast);
  const card = underLight([GREY_CARD.r, GREY_CARD.g, GREY_CARD.b], cast);
  const data = new Uint8Array(WIDTH * HEIGHT * 3);
  const noise = noiseTable(random);
  for (let y = 0; y < HEIGHT; y += 1) {
    // Sensor noise: each row reads the table from its own random start.
    let draw = Math.floor(random.next() * NOISE_TABLE_SIZE);
    for (let x = 0; x < WIDTH; x += 1) {
      let rgb = background;
      if (x >= plate.x && x < plate.x + plate.width && y >= plate.y && y < plate.y + plate.height) {
        const stripe = Math.min(stripes - 1, Math.floor((y - plate.y) / stripeHeight));
        const column = Math.min(columns - 1, Math.floor(((x - plate.x) / plate.width) * columns));
        rgb = shades[stripe % coupon.layers.length][column];
      } else if (x >= grey.x && x < grey.x + grey.width && y >= grey.y && y < grey.y + grey.height) {
        rgb = card;
      }
      const offset = (y * WIDTH + x) * 3;
      for (let channel = 0; channel < 3; channel += 1) {
        draw = (draw + 1) & (NOISE_TABLE_SIZE - 1);
        data[offset + channel] = Math.max(0, Math.min(255, Math.round(rgb[channel] + noise[draw])));
      }
    }
  }
  const jpeg = await sharp(data, { raw: { width: WIDTH, height: HEIGHT, channels: 3 } }).jpeg({ quality: 90 }).toBuffer();
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
    .where(inArray(couponLayers.couponId, rows.map((row) => row.id)))
    .orderBy(asc(couponLayers.couponId), asc(couponLayers.position));
  return rows.map((row) => ({ ...row, layers: layers.filter((layer) => layer.couponId === row.id) }));
}

/** One photo stored and measured as if uploaded and attached with its regions. */
async function storeDemoPhoto(db: Database, coupon: DemoCoupon, scene: Scene): Promise<void> {
  const key = newUploadKey(coupon.ownerId, 'image/jpeg');
  await putObject(key, scene.jpeg, 'image/jpeg');
  const processed = await processPhotoInTurn(scene.jpeg);
  const analysis = analyseRegions(processed.analysisImage, scene.regions);
  const files = await writeDerivedFiles(key, scene.jpeg.length, processed);
  await photoTransaction(db, async (tx) => {
    const id = await insertPhoto(tx, { couponId: coupon.id, ownerId: coupon.ownerId, width: processed.width, height: processed.height, exif: processed.exif, ...files });
    await writeRegions(tx, { id, couponId: coupon.id }, scene.regions, analysis, await layerAlloys(tx, coupon.id), { replacing: false });
  });
}

/**
 * Gives demo coupons synthetic photos: for every owner and visibility, the first coupons whose
 * layers all have a tint model for their process. Returns how many photos were stored.
 */
export async function seedDemoPhotos(db: Database): Promise<number> {
  const random = seededRandom(20261202);
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
