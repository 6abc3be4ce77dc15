import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { api, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { couponsChanged, deleteCoupons } from '../fixtures/library-coupons';
import { alloys, couponLayers, coupons, photos, swatches, users } from '../../db/schema';
import { db as appDb } from '~/lib/server/db';
import { refreshCouponLightness } from '~/lib/server/library-versions';

/**
 * The library's sort by colour lightness (the first layer's dominant swatch's L*, kept in
 * coupons.dominant_lab_l by the photo writers) over GET /api/coupons. The coupons are fenced to a
 * temperature band only this file uses; the expected order is direct SQL written here that picks
 * each coupon's dominant swatch from the swatches themselves, not from the stored column.
 */
const { db, pool } = testDatabase();
const BAND = { low: 2600.25, high: 2699.75 };
const fence = `tempMin=${BAND.low}&tempMax=${BAND.high}`;
const created: number[] = [];
let member: Jar;
let memberId: string;

/** A coupon whose first layer has clusters of these L* and shares (none: no photo), and a second layer that must not count. */
async function insertCoupon(temperatureC: number, clusters: [number, number][], visibility: 'public' | 'members' = 'public'): Promise<number> {
  const [{ id: alloyId }] = await db.select({ id: alloys.id }).from(alloys).where(eq(alloys.slug, 'ti-grade-2'));
  const [{ id }] = await db
    .insert(coupons)
    .values({
      ownerId: memberId,
      title: 'Lightness fixture',
      layerKey: 'ti-grade-2',
      surfacePrep: 'ground',
      process: 'oven',
      temperatureC,
      holdSeconds: 600,
      visibility,
    })
    .$returningId();
  created.push(id);
  const layerIds: number[] = [];
  for (const position of [0, 1]) layerIds.push((await db.insert(couponLayers).values({ couponId: id, position, alloyId }).$returningId())[0].id);
  if (clusters.length) {
    const key = `test/lightness/${id}`;
    const [{ id: photoId }] = await db
      .insert(photos)
      .values({
        couponId: id,
        ownerId: memberId,
        originalKey: `${key}.jpg`,
        displayKey: `${key}.webp`,
        thumbKey: `${key}-t.webp`,
        contentType: 'image/jpeg',
        byteSize: 1,
        width: 1,
        height: 1,
      })
      .$returningId();
    const base = { photoId, couponId: id, alloyId, spread: 1, labA: 0, labB: 0, oklabL: 0.5, oklabA: 0, oklabB: 0, hex: '#808080' };
    await db.insert(swatches).values([
      // A mean with share 1 and L* 99 (never the dominant), the clusters, and a brighter, larger cluster on the second layer.
      { ...base, layerId: layerIds[0], rank: 0, isMean: true, share: 1, labL: 99 },
      ...clusters.map(([labL, share], rank) => ({ ...base, layerId: layerIds[0], rank: rank + 1, isMean: false, share, labL })),
      { ...base, layerId: layerIds[1], rank: 1, isMean: false, share: 0.99, labL: 98 },
    ]);
  }
  // What the photo writers do after writing swatches.
  await refreshCouponLightness(appDb(), id);
  await couponsChanged(db, [id]);
  return id;
}

beforeAll(async () => {
  member = await signedIn(demo.member);
  memberId = (await db.select({ id: users.id }).from(users).where(eq(users.email, demo.member)))[0].id;
  const specs: [number, [number, number][]][] = [
    [
      2610,
      [
        [40, 0.6],
        [70, 0.4],
      ],
    ],
    [2620, [[40.5, 0.7]]],
    [2630, []],
    [
      2640,
      [
        [20, 0.5],
        [80, 0.5],
      ],
    ], // a tie in share: the older swatch (lower id, L* 20) is dominant
    [2650, [[40, 0.9]]], // the same L* as the first: id breaks the tie
    [2660, []],
    [
      2670,
      [
        [65, 0.8],
        [10, 0.2],
      ],
    ],
  ];
  for (const [temperature, clusters] of specs) await insertCoupon(temperature, clusters);
});

afterAll(async () => {
  await deleteCoupons(db, created);
  await pool.end();
});

/** Each fenced coupon's first-layer dominant L*, picked from the swatches in SQL written here; null without one. */
async function expectedOrder(order: 'asc' | 'desc'): Promise<number[]> {
  const [rows] = (await pool.query(
    `select c.id, (select s.lab_l from swatches s join coupon_layers l on l.id = s.layer_id
       where l.coupon_id = c.id and l.position = 0 and s.is_mean = false order by s.share desc, s.id asc limit 1) as l
     from coupons c where c.temperature_c between ? and ?`,
    [BAND.low, BAND.high],
  )) as unknown as [{ id: number; l: number | null }[]];
  const sign = order === 'asc' ? 1 : -1;
  // Rows without a lightness last in either order; ties by id in the sort's direction.
  return rows
    .sort((x, y) => ((x.l === null) !== (y.l === null) ? (x.l === null ? 1 : -1) : x.l !== y.l ? sign * (x.l! - y.l!) : sign * (x.id - y.id)))
    .map((row) => row.id);
}

async function walk(order: 'asc' | 'desc', limit: number): Promise<number[]> {
  const seen: number[] = [];
  let cursor: string | null = null;
  do {
    const response = await api(`/api/coupons?${fence}&sort=lightness&order=${order}&limit=${limit}${cursor ? `&cursor=${cursor}` : ''}`, { jar: member });
    expect(response.status).toBe(200);
    const body = await response.json();
    seen.push(...body.coupons.map((coupon: { id: number }) => coupon.id));
    cursor = body.nextCursor;
  } while (cursor);
  return seen;
}

describe('the library sorted by colour lightness', () => {
  it('stores each coupon’s first-layer dominant L* as the swatches give it', async () => {
    const [rows] = (await pool.query('select id, dominant_lab_l as l from coupons where id in (?) order by id', [created])) as unknown as [
      { id: number; l: number | null }[],
    ];
    // Source: the fixtures above — the largest-share cluster of layer 1 (ties to the older swatch), never the mean or layer 2.
    expect(rows.map((row) => row.l)).toEqual([40, 40.5, null, 20, 40, null, 65]);
  });

  it('orders lightest last (ascending) and first (descending), coupons without a swatch last, as SQL does', async () => {
    for (const order of ['asc', 'desc'] as const) {
      const response = await api(`/api/coupons?${fence}&sort=lightness&order=${order}&limit=100`, { jar: member });
      const body = await response.json();
      expect(body.coupons.map((coupon: { id: number }) => coupon.id)).toEqual(await expectedOrder(order));
    }
  });

  it('pages by keyset, returning every coupon exactly once, also while one is added between pages', async () => {
    for (const order of ['asc', 'desc'] as const) expect(await walk(order, 2)).toEqual(await expectedOrder(order));
    const first = await api(`/api/coupons?${fence}&sort=lightness&limit=3`, { jar: member });
    const { coupons: page, nextCursor } = await first.json();
    // A coupon darker than anything on the first page: it sorts before the cursor, so it is not shown again or twice.
    await insertCoupon(2680, [[5, 0.9]]);
    const rest: number[] = [];
    let cursor: string | null = nextCursor;
    while (cursor) {
      const body = await (await api(`/api/coupons?${fence}&sort=lightness&limit=3&cursor=${cursor}`, { jar: member })).json();
      rest.push(...body.coupons.map((coupon: { id: number }) => coupon.id));
      cursor = body.nextCursor;
    }
    const all = [...page.map((coupon: { id: number }) => coupon.id), ...rest];
    expect(new Set(all).size).toBe(all.length);
    expect(all.length).toBe(created.length - 1);
  });
});
