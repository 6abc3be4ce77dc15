// The library benchmark's data set (invented): 100 000 coupons of a few hundred owners, spread over
// alloys, alloy pairs, processes, heats and visibilities, with photos, one region per layer and
// 1 000 000 swatches, loaded with LOAD DATA LOCAL INFILE from generated tab-separated rows. Seeded,
// so every run makes the same rows. No files in storage: the photo rows name keys nobody reads.
// Alone: `npx tsx scripts/bench/library-database.ts [--fresh]` (the bench profile's database).
import { Readable } from 'node:stream';
import type { Pool, PoolConnection } from 'mysql2/promise';
import { converter, formatHex } from 'culori';
import { alloyCatalogue, layerKeyOf } from '~/lib/alloys';
import { seededRandom } from '~/lib/random';
import { atmospheres, coolings, surfacePreparations, temperatureMethods } from '../../db/schema/enums';

export const LIBRARY_SIZE = { owners: 300, coupons: 100_000, swatches: 1_000_000 } as const;
/** Names the data set in app_settings; change it when the generator changes, so old data is made again. */
export const GENERATED_MARKER = 'bench-library-v1';

export const ownerId = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
export const benchAdminId = ownerId(999_999);

const NULL = '\\N';
type Cell = string | number | null;
const line = (cells: Cell[]) => `${cells.map((cell) => (cell === null ? NULL : String(cell))).join('\t')}\n`;
const stamp = (ms: number) => new Date(ms).toISOString().slice(0, 23).replace('T', ' ');

const toOklab = converter('oklab');

/** Streams rows into a table with LOAD DATA LOCAL INFILE, in chunks of lines. */
async function load(connection: PoolConnection, table: string, columns: string[], rows: Iterable<string>): Promise<void> {
  function* chunks() {
    let chunk: string[] = [];
    for (const row of rows) {
      chunk.push(row);
      if (chunk.length === 5000) {
        yield Buffer.from(chunk.join(''));
        chunk = [];
      }
    }
    if (chunk.length) yield Buffer.from(chunk.join(''));
  }
  await connection.query({
    sql: `LOAD DATA LOCAL INFILE '${table}.tsv' INTO TABLE \`${table}\` CHARACTER SET utf8mb4 (${columns.map((column) => `\`${column}\``).join(', ')})`,
    infileStreamFactory: () => Readable.from(chunks()),
  });
}

interface Layer {
  id: number;
  couponId: number;
  position: number;
  alloyId: number;
  /** The layer's film colour (D65 CIELAB), which its clusters scatter around. */
  lab: [number, number, number];
}

interface Region {
  id: number;
  photoId: number;
  layer: Layer;
}

/** Fills an empty library (alloys seeded) with the data set. Returns the seconds it took. */
export async function generateLibrary(pool: Pool): Promise<number> {
  const started = performance.now();
  const random = seededRandom(20_260_101);
  const pick = <T>(items: readonly T[]) => items[Math.floor(random() * items.length)];
  const round = (value: number, places: number) => Math.round(value * 10 ** places) / 10 ** places;

  const [alloyRows] = (await pool.query('SELECT id, slug FROM alloys')) as unknown as [{ id: number; slug: string }[]];
  const alloyId = new Map(alloyRows.map((row) => [row.slug, row.id]));
  const slugs = alloyCatalogue.map((alloy) => alloy.slug).filter((slug) => alloyId.has(slug));
  const titanium = slugs.filter((slug) => slug.startsWith('ti-'));
  // Layers: titanium grades above all (the trade's pairs), then the rest of the catalogue.
  const layerSlug = () => (random() < 0.5 ? pick(titanium) : pick(slugs));

  const connection = await pool.getConnection();
  try {
    await connection.query('SET foreign_key_checks = 0, unique_checks = 0');

    // Owners: 10 instructors and the rest members, and one admin who owns nothing.
    const people = Array.from({ length: LIBRARY_SIZE.owners }, (_, n) => n);
    await load(
      connection,
      'users',
      ['id', 'name', 'email', 'role'],
      [
        ...people.map((n) => line([ownerId(n), `Bench smith ${n}`, `smith-${n}@bench.oxbloom.test`, n < 10 ? 'instructor' : 'member'])),
        line([benchAdminId, 'Bench admin', 'admin@bench.oxbloom.test', 'admin']),
      ],
    );

    const layers: Layer[] = [];
    const photos: { id: number; couponId: number; ownerId: string; created: number }[] = [];
    const couponLines: string[] = [];
    const start = Date.UTC(2023, 0, 1);
    for (let id = 1; id <= LIBRARY_SIZE.coupons; id += 1) {
      // A few people log most coupons.
      const owner = ownerId(Math.floor(LIBRARY_SIZE.owners * random() * random()));
      const count = random() < 0.65 ? 1 : random() < 0.86 ? 2 : 3;
      const slugsOfCoupon = Array.from({ length: count }, layerSlug);
      const anodize = random() < 0.15;
      const process = anodize ? 'anodize' : pick(['oven', 'oven', 'forge', 'torch', 'torch', 'induction'] as const);
      const temperature = anodize || random() < 0.03 ? null : round(200 + random() * 700, 1);
      const hold = anodize || random() < 0.03 ? null : Math.round(10 + random() * random() * 7200);
      const volts = anodize ? round(5 + random() * 105, 1) : null;
      const atmosphere = anodize ? 'air' : random() < 0.8 ? 'air' : pick(atmospheres);
      const prep = pick(surfacePreparations);
      const visibility = random() < 0.45 ? 'public' : random() < 0.64 ? 'members' : 'private';
      const created = start + id * 900_000 + Math.floor(random() * 86_400_000);

      for (const [position, slug] of slugsOfCoupon.entries()) {
        const lab: Layer['lab'] = [25 + random() * 60, -20 + random() * 55, -45 + random() * 110];
        layers.push({ id: layers.length + 1, couponId: id, position, alloyId: alloyId.get(slug)!, lab });
      }
      const photoCount = random() < 0.8 ? (random() < 0.75 ? 1 : 2) : 0;
      for (let p = 0; p < photoCount; p += 1) photos.push({ id: photos.length + 1, couponId: id, ownerId: owner, created: created + 60_000 * (p + 1) });

      couponLines.push(
        line([
          id,
          owner,
          `Bench coupon ${id}: ${slugsOfCoupon.join(' / ')}`,
          layerKeyOf(slugsOfCoupon),
          prep,
          prep === 'ground' ? pick([120, 220, 400, 800]) : null,
          process,
          temperature,
          temperature === null ? null : pick(temperatureMethods),
          hold,
          volts,
          atmosphere,
          atmosphere === 'argon' ? round(5 + random() * 15, 1) : null,
          anodize ? null : pick(coolings),
          visibility,
          stamp(created),
          stamp(created),
        ]),
      );
    }

    // One layer region per layer on every photo of its coupon.
    const layersByCoupon = new Map<number, Layer[]>();
    for (const layer of layers) layersByCoupon.set(layer.couponId, [...(layersByCoupon.get(layer.couponId) ?? []), layer]);
    const regions: Region[] = [];
    for (const photo of photos) for (const layer of layersByCoupon.get(photo.couponId)!) regions.push({ id: regions.length + 1, photoId: photo.id, layer });

    // Swatches: each region's mean (rank 0) and its clusters ranked by share, exactly the million in all.
    const perRegion = Math.floor(LIBRARY_SIZE.swatches / regions.length);
    const extra = LIBRARY_SIZE.swatches - perRegion * regions.length;
    const lightness = new Map<number, { share: number; l: number }>();
    function* swatchLines(): Generator<string> {
      let id = 0;
      for (const [index, region] of regions.entries()) {
        const clusters = perRegion - 1 + (index < extra ? 1 : 0);
        const weights = Array.from({ length: clusters }, () => 0.05 + random());
        const total = weights.reduce((sum, weight) => sum + weight, 0);
        const shares = weights.map((weight) => round(weight / total, 6)).sort((a, b) => b - a);
        const [l0, a0, b0] = region.layer.lab;
        const colours = shares.map(() => [l0 + (random() - 0.5) * 16, a0 + (random() - 0.5) * 16, b0 + (random() - 0.5) * 16] as const);
        const mean = colours.reduce(
          (sum, colour, k) => [sum[0] + colour[0] * shares[k], sum[1] + colour[1] * shares[k], sum[2] + colour[2] * shares[k]],
          [0, 0, 0],
        );
        const rows: [number, boolean, number, readonly number[]][] = [
          [0, true, 1, mean],
          ...shares.map((share, k) => [k + 1, false, share, colours[k]] as [number, boolean, number, readonly number[]]),
        ];
        for (const [rank, isMean, share, [l, a, b]] of rows) {
          id += 1;
          const lab = { mode: 'lab65' as const, l: round(l, 4), a: round(a, 4), b: round(b, 4) };
          const ok = toOklab(lab);
          if (!isMean && region.layer.position === 0) {
            const best = lightness.get(region.layer.couponId);
            // Ties go to the older swatch, as the library's dominant swatch does.
            if (!best || share > best.share) lightness.set(region.layer.couponId, { share, l: lab.l });
          }
          yield line([
            id,
            region.id,
            region.photoId,
            region.layer.couponId,
            region.layer.id,
            region.layer.alloyId,
            rank,
            isMean ? 1 : 0,
            share,
            round(1 + random() * 4, 3),
            formatHex(lab),
            lab.l,
            lab.a,
            lab.b,
            round(ok.l, 6),
            round(ok.a, 6),
            round(ok.b, 6),
          ]);
        }
      }
    }

    await load(
      connection,
      'coupons',
      [
        'id',
        'owner_id',
        'title',
        'layer_key',
        'surface_prep',
        'surface_grit',
        'process',
        'temperature_c',
        'temperature_method',
        'hold_seconds',
        'volts',
        'atmosphere',
        'argon_flow_lpm',
        'cooling',
        'visibility',
        'created_at',
        'updated_at',
      ],
      couponLines,
    );
    await load(
      connection,
      'coupon_layers',
      ['id', 'coupon_id', 'position', 'alloy_id'],
      layers.map((layer) => line([layer.id, layer.couponId, layer.position, layer.alloyId])),
    );
    await load(
      connection,
      'photos',
      ['id', 'coupon_id', 'owner_id', 'original_key', 'display_key', 'thumb_key', 'content_type', 'byte_size', 'width', 'height', 'created_at', 'updated_at'],
      photos.map((photo) => {
        const key = `bench/${photo.ownerId}/photos/${photo.id}`;
        return line([
          photo.id,
          photo.couponId,
          photo.ownerId,
          `${key}/original.jpg`,
          `${key}/display.webp`,
          `${key}/thumb.webp`,
          'image/jpeg',
          2_000_000,
          4000,
          3000,
          stamp(photo.created),
          stamp(photo.created),
        ]);
      }),
    );
    await load(
      connection,
      'regions',
      ['id', 'photo_id', 'kind', 'layer_id', 'x', 'y', 'width', 'height'],
      regions.map((region) => line([region.id, region.photoId, 'layer', region.layer.id, 100 + 1200 * region.layer.position, 200, 1000, 2000])),
    );
    await load(
      connection,
      'swatches',
      [
        'id',
        'region_id',
        'photo_id',
        'coupon_id',
        'layer_id',
        'alloy_id',
        'rank',
        'is_mean',
        'share',
        'spread',
        'hex',
        'lab_l',
        'lab_a',
        'lab_b',
        'oklab_l',
        'oklab_a',
        'oklab_b',
      ],
      swatchLines(),
    );

    // Each coupon's lightness, as the photo writers keep it (library-versions.ts), through a
    // temporary table joined once; then every alloy's library version starts at 1.
    await connection.query('CREATE TEMPORARY TABLE bench_lightness (coupon_id INT PRIMARY KEY, l DOUBLE NOT NULL)');
    await load(
      connection,
      'bench_lightness',
      ['coupon_id', 'l'],
      [...lightness].map(([couponId, { l }]) => line([couponId, l])),
    );
    await connection.query('UPDATE coupons c JOIN bench_lightness b ON b.coupon_id = c.id SET c.dominant_lab_l = b.l, c.updated_at = c.updated_at');
    await connection.query('DROP TEMPORARY TABLE bench_lightness');
    await connection.query('INSERT INTO library_versions (alloy_id, version) SELECT id, 1 FROM alloys ON DUPLICATE KEY UPDATE version = version + 1');
    await connection.query('INSERT INTO app_settings (setting_key, value) VALUES (?, ?)', [
      GENERATED_MARKER,
      JSON.stringify({ ...LIBRARY_SIZE, regions: regions.length }),
    ]);
    await connection.query('ANALYZE TABLE coupons, coupon_layers, photos, regions, swatches');
  } finally {
    await connection.query('SET foreign_key_checks = 1, unique_checks = 1').catch(() => undefined);
    connection.release();
  }
  return (performance.now() - started) / 1000;
}
