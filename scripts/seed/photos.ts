// Synthetic demo photos (invented data, for the demo only): each chosen coupon — a few of every
// owner and visibility, and every coupon of the test series — is drawn as a plate of its layers'
// heat tints beside a grey card, under a slightly warm light, with sensor noise; stored in S3 like
// an upload and measured with a region per layer and the grey card.
import { asc, eq, inArray } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { alloys, couponLayers, coupons, photos } from '../../db/schema';
import type { RegionInput } from '~/lib/photos';
import { developPhoto } from '~/lib/server/photos/attach';
import { newUploadKey } from '~/lib/server/photos/keys';
import { photoTransaction, recordPhoto } from '~/lib/server/photos/records';
import { storeFiles } from '~/lib/server/photos/store';
import { putObject, s3 } from '~/lib/server/storage';
import { layerShades, thicknessNm, type DemoHeat } from './demo-tints';
import { seededChoices } from './random';
import { encodeJpeg, GREY_CARD, renderScene, type Patch } from './synthetic-photos';

/** The general demo's photos, as a phone camera's, and the test series' smaller ones (they are many). */
const FULL_SIZE = { width: 1200, height: 800 };
const SERIES_SIZE = { width: 600, height: 400 };
/** Photos per owner and visibility; with five owners and three visibilities, at most 30 photos. */
const PER_OWNER_AND_VISIBILITY = 2;
const BACKGROUND = '#2e2c2a';
const NOISE_SIGMA = 3.5;
/** Colour points across the plate, from a little thinner film to a little thicker. */
const COLUMNS = 12;

export interface DemoCoupon extends DemoHeat {
  id: number;
  ownerId: string;
  title: string;
  visibility: string;
  layers: { id: number; alloy: string }[];
}

type Random = ReturnType<typeof seededChoices>;

interface DemoPhoto {
  jpeg: Buffer;
  regions: RegionInput[];
}

/**
 * Draws the coupon: a plate with its layers as stripes (a laminate alternates them, as in a
 * billet's cross-section), each layer's colour across the plate as `shades` give it, a grey card
 * to its right. The layout is that of a 1200 × 800 photo, scaled to `size`.
 */
export async function drawScene(coupon: DemoCoupon, shades: string[][], random: Random, size = FULL_SIZE): Promise<DemoPhoto> {
  const scale = (value: number) => Math.round((value * size.width) / FULL_SIZE.width);
  const warmth = random.between(0, 1);
  const cast = [1, 1 - 0.07 * warmth, 1 - 0.22 * warmth] as const;
  const plate = { x: scale(90), y: scale(150), width: scale(720), height: scale(500) };
  const grey = { x: scale(880), y: scale(200), width: scale(230), height: scale(400) };
  const stripes = coupon.layers.length === 1 ? 1 : coupon.layers.length * 3;
  const stripeHeight = Math.floor(plate.height / stripes);
  const columnX = (column: number) => plate.x + Math.round((column * plate.width) / COLUMNS);
  const patches: Patch[] = [];
  for (let stripe = 0; stripe < stripes; stripe += 1) {
    const y = plate.y + stripe * stripeHeight;
    // The last stripe takes the rows the division left over.
    const height = stripe === stripes - 1 ? plate.y + plate.height - y : stripeHeight;
    for (let column = 0; column < COLUMNS; column += 1) {
      const x = columnX(column);
      patches.push({ region: { x, y, width: columnX(column + 1) - x, height }, colour: shades[stripe % coupon.layers.length][column] });
    }
  }
  patches.push({ region: grey, colour: GREY_CARD });
  const image = renderScene({
    width: size.width,
    height: size.height,
    background: BACKGROUND,
    patches,
    cast,
    noise: { sigma: NOISE_SIGMA, random: random.next, sampling: 'row' },
  });
  const jpeg = await encodeJpeg(image, 90);
  const inset = scale(24);
  const layerInset = Math.min(inset, Math.floor(stripeHeight / 4));
  const regions: RegionInput[] = coupon.layers.map((layer, index) => ({
    kind: 'layer',
    layerId: layer.id,
    x: plate.x + inset,
    y: plate.y + index * stripeHeight + layerInset,
    width: plate.width - 2 * inset,
    height: stripeHeight - 2 * layerInset,
  }));
  regions.push({ kind: 'grey', x: grey.x + inset, y: grey.y + inset, width: grey.width - 2 * inset, height: grey.height - 2 * inset });
  return { jpeg, regions };
}

async function demoCoupons(db: Database): Promise<DemoCoupon[]> {
  const rows = await db
    .select({
      id: coupons.id,
      ownerId: coupons.ownerId,
      title: coupons.title,
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

/** Each layer's colours across the coupon, or null when the demo has no colour for one of them. */
function shadesOf(coupon: DemoCoupon): string[][] | null {
  const shades = coupon.layers.map((layer) => layerShades(coupon, layer.alloy, COLUMNS));
  return coupon.layers.length > 0 && shades.every((shade) => shade !== null) ? (shades as string[][]) : null;
}

/**
 * Gives demo coupons synthetic photos: every coupon of the test series (named by `seriesTitles`),
 * and, for every owner and visibility, the first other coupons whose layers all have a tint model
 * for their process. Returns how many photos were stored.
 */
export async function seedDemoPhotos(db: Database, seriesTitles: ReadonlySet<string>): Promise<number> {
  const random = seededChoices(20261202);
  const taken = new Map<string, number>();
  // Scenes are drawn in order (the random draws stay the same); three are stored at a time (two
  // develop while the third's files and rows are written).
  const storing = new Set<Promise<void>>();
  let stored = 0;
  const store = async (coupon: DemoCoupon, scene: DemoPhoto) => {
    const work: Promise<void> = storeDemoPhoto(db, coupon, scene).then(() => {
      storing.delete(work);
      stored += 1;
    });
    storing.add(work);
    if (storing.size >= 3) await Promise.race(storing);
  };
  try {
    // A seed that stopped half-way is finished on the next start: coupons with photos count as done.
    const done = new Set((await db.selectDistinct({ couponId: photos.couponId }).from(photos)).map((row) => row.couponId));
    const all = await demoCoupons(db);
    for (const coupon of all.filter((candidate) => !seriesTitles.has(candidate.title))) {
      const slot = `${coupon.ownerId}/${coupon.visibility}`;
      if ((taken.get(slot) ?? 0) >= PER_OWNER_AND_VISIBILITY) continue;
      if (done.has(coupon.id)) {
        taken.set(slot, (taken.get(slot) ?? 0) + 1);
        continue;
      }
      const thicknesses = coupon.layers.map((layer) => thicknessNm(coupon, layer.alloy));
      if (coupon.layers.length === 0 || thicknesses.some((thickness) => thickness === null || thickness < 5)) continue;
      taken.set(slot, (taken.get(slot) ?? 0) + 1);
      await store(coupon, await drawScene(coupon, shadesOf(coupon)!, random));
    }
    for (const coupon of all.filter((candidate) => seriesTitles.has(candidate.title) && !done.has(candidate.id))) {
      const shades = shadesOf(coupon);
      // Each series photo draws from its own seed, so a seed finished later draws the same scenes.
      if (shades) await store(coupon, await drawScene(coupon, shades, seededChoices(20261203 + coupon.id), SERIES_SIZE));
    }
    await Promise.all(storing);
  } finally {
    s3().destroy();
  }
  return stored;
}
