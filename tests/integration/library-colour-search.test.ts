import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { converter, formatHex } from 'culori';
import { eq, inArray, sql } from 'drizzle-orm';
import { api, newJar, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { couponsChanged, deleteCoupons } from '../fixtures/library-coupons';
import { alloys, couponLayers, coupons, photos, swatches, users } from '../../db/schema';
import { seededRandom } from '~/lib/random';
// ΔE00 as checked against Sharma, Wu & Dalal (2005) Table 1 in tests/unit/colour/delta-e.test.ts.
import { deltaE2000 } from '~/lib/colour';

/**
 * GET /api/swatches/search against a brute-force ΔE00 scan written here over the same rows (every
 * visible measured swatch in the database), so recall must be 1.0 and the order exact. The fixture
 * colours sit around a saturated green no tint or other test uses.
 */
const { db, pool } = testDatabase();
const toLab = converter('lab65');
const CENTRE = '#22c83c';
const centreLab = (() => {
  const { l, a, b } = toLab(CENTRE)!;
  return { l, a, b };
})();

type Who = 'visitor' | 'member' | 'member2' | 'instructor' | 'admin';
const jars = {} as Record<Who, Jar>;
const userIds = {} as Record<Who, string>;
const created: number[] = [];

beforeAll(async () => {
  jars.visitor = newJar();
  for (const who of ['member', 'member2', 'instructor', 'admin'] as const) {
    jars[who] = await signedIn(demo[who]);
    userIds[who] = (await db.select({ id: users.id }).from(users).where(eq(users.email, demo[who])))[0].id;
  }
  const alloyIds = Object.fromEntries(
    (
      await db
        .select({ id: alloys.id, slug: alloys.slug })
        .from(alloys)
        .where(inArray(alloys.slug, ['ti-grade-2', 'niobium']))
    ).map((row) => [row.slug, row.id]),
  );
  const random = seededRandom(4242);
  const plan = [
    ['member', 'private'],
    ['member', 'members'],
    ['member', 'public'],
    ['member2', 'private'],
    ['member2', 'members'],
    ['member2', 'public'],
  ] as const;
  for (const [index, [owner, visibility]] of plan.entries()) {
    const slug = index % 2 ? 'niobium' : 'ti-grade-2';
    const [{ id: couponId }] = await db
      .insert(coupons)
      .values({
        ownerId: userIds[owner],
        title: `Colour search fixture ${index}`,
        layerKey: slug,
        surfacePrep: 'ground',
        process: 'oven',
        temperatureC: 400 + index,
        holdSeconds: 600,
        visibility,
      })
      .$returningId();
    created.push(couponId);
    const [{ id: layerId }] = await db.insert(couponLayers).values({ couponId, position: 0, alloyId: alloyIds[slug] }).$returningId();
    const [{ id: photoId }] = await db
      .insert(photos)
      .values({
        couponId,
        ownerId: userIds[owner],
        originalKey: `test/colour/${couponId}.jpg`,
        displayKey: 'x',
        thumbKey: 'x',
        contentType: 'image/jpeg',
        byteSize: 1,
        width: 1,
        height: 1,
      })
      .$returningId();
    const rows = Array.from({ length: 12 }, (_, rank) => {
      // Spread from very close to well outside the largest limit tested.
      const radius = 0.5 + random() * 14;
      const lab = {
        l: centreLab.l + (random() - 0.5) * radius,
        a: centreLab.a + (random() - 0.5) * radius * 2,
        b: centreLab.b + (random() - 0.5) * radius * 2,
      };
      return {
        photoId,
        couponId,
        layerId,
        alloyId: alloyIds[slug],
        rank: rank + 1,
        isMean: false,
        share: 0.1,
        spread: 1,
        hex: formatHex({ mode: 'lab65', ...lab }),
        labL: lab.l,
        labA: lab.a,
        labB: lab.b,
        oklabL: 0,
        oklabA: 0,
        oklabB: 0,
      };
    });
    // A mean exactly at the centre: means are not searched.
    rows.push({ ...rows[0], rank: 0, isMean: true, labL: centreLab.l, labA: centreLab.a, labB: centreLab.b, hex: CENTRE });
    await db.insert(swatches).values(rows);
  }
  await couponsChanged(db, created);
});

afterAll(async () => {
  await deleteCoupons(db, created);
  await pool.end();
});

function visibleSql(who: Who) {
  if (who === 'admin') return sql`true`;
  if (who === 'visitor') return sql`c.visibility = 'public'`;
  return sql`(c.visibility in ('public', 'members') or c.owner_id = ${userIds[who]})`;
}

/** Every visible measured swatch, ΔE00 to the centre computed here, filtered, sorted, cut. */
async function bruteForce(who: Who, maxDeltaE: number, limit: number, alloy?: string) {
  const [rows] = (await db.execute(
    sql`select s.id, s.lab_l, s.lab_a, s.lab_b, a.slug from swatches s join coupons c on c.id = s.coupon_id left join alloys a on a.id = s.alloy_id where s.is_mean = 0 and ${visibleSql(who)}`,
  )) as unknown as [{ id: number; lab_l: number; lab_a: number; lab_b: number; slug: string | null }[]];
  return rows
    .filter((row) => !alloy || row.slug === alloy)
    .map((row) => ({ id: Number(row.id), deltaE: deltaE2000(centreLab, { l: Number(row.lab_l), a: Number(row.lab_a), b: Number(row.lab_b) }) }))
    .filter((row) => row.deltaE <= maxDeltaE)
    .sort((x, y) => x.deltaE - y.deltaE || x.id - y.id)
    .slice(0, limit);
}

interface Hit {
  swatchId: number;
  hex: string;
  deltaE00: number;
  couponId: number;
  layer: number | null;
  alloy: string | null;
  coupon: { title: string; temperatureC: number | null };
}

async function search(who: Who, params: string): Promise<Hit[]> {
  const response = await api(`/api/swatches/search?${params}`, { jar: jars[who] });
  expect(response.status, await response.clone().text()).toBe(200);
  return ((await response.json()) as { hits: Hit[] }).hits;
}

describe('GET /api/swatches/search', () => {
  it.each([
    ['visitor', 3, 100],
    ['member', 5, 100],
    ['member2', 8, 100],
    ['instructor', 10, 100],
    ['admin', 10, 100],
    ['admin', 6, 7],
    ['member', 10, 1],
    // One or a few hits, so the nearest swatches of private coupons must be passed over batch by batch.
    ['visitor', 10, 1],
    ['member2', 4, 3],
  ] as const)('%s within ΔE00 %d, at most %d hits: the brute-force scan’s hits in its order', async (who, maxDeltaE, limit) => {
    const expected = await bruteForce(who, maxDeltaE, limit);
    expect(expected.length, 'the fixture has colours within the limit').toBeGreaterThan(0);
    const hits = await search(who, `hex=${encodeURIComponent(CENTRE)}&maxDeltaE=${maxDeltaE}&limit=${limit}`);
    expect(hits.map((hit) => hit.swatchId)).toEqual(expected.map((row) => row.id));
    for (const [index, hit] of hits.entries()) expect(hit.deltaE00).toBeCloseTo(expected[index].deltaE, 2);
  });

  it('narrows to one alloy on any layer, and answers each hit with its coupon, layer and heat', async () => {
    const expected = await bruteForce('admin', 10, 100, 'niobium');
    const hits = await search('admin', `hex=22C83C&alloy=niobium&maxDeltaE=10&limit=100`);
    expect(hits.map((hit) => hit.swatchId)).toEqual(expected.map((row) => row.id));
    for (const hit of hits) {
      expect(hit).toMatchObject({ alloy: 'niobium', layer: 0, hex: expect.stringMatching(/^#[0-9a-f]{6}$/) });
      expect(created).toContain(hit.couponId);
      expect(hit.coupon.title).toMatch(/^Colour search fixture/);
    }
  });

  it('never shows someone else’s private swatch, and members-only ones only to the signed in', async () => {
    const owners = async (who: Who) => {
      const hits = await search(who, `hex=${encodeURIComponent(CENTRE)}&maxDeltaE=10&limit=100`);
      const [rows] = (await db.execute(
        sql`select id, owner_id, visibility from coupons where id in (${sql.join(
          hits.map((hit) => sql`${hit.couponId}`),
          sql`, `,
        )})`,
      )) as unknown as [{ owner_id: string; visibility: string }[]];
      return rows;
    };
    for (const row of await owners('visitor')) expect(row.visibility).toBe('public');
    for (const row of await owners('member2')) expect(row.visibility !== 'private' || row.owner_id === userIds.member2).toBe(true);
    expect((await owners('admin')).some((row) => row.visibility === 'private' && row.owner_id === userIds.member2)).toBe(true);
  });

  it.each([
    ['hex=green', 'hex'],
    ['hex=%2312345', 'hex'],
    ['', 'hex'],
    ['hex=%23222222&limit=0', 'limit'],
    ['hex=%23222222&limit=101', 'limit'],
    ['hex=%23222222&limit=2.5', 'limit'],
    ['hex=%23222222&alloy=unobtainium', 'alloy'],
    ['hex=%23222222&maxDeltaE=0', 'maxDeltaE'],
    ['hex=%23222222&maxDeltaE=50', 'maxDeltaE'],
  ])('refuses %s with a 400 naming %s', async (params, field) => {
    const response = await api(`/api/swatches/search?${params}`, { jar: jars.member });
    expect(response.status).toBe(400);
    expect((await response.json()).field).toBe(field);
  });
});

describe('the colour-search page', () => {
  it('shows the same hits as chips with their ΔE00, and names a bad hex', async () => {
    const hits = await search('member', `hex=${encodeURIComponent(CENTRE)}&maxDeltaE=4`);
    const html = await (await api(`/library/search?hex=${encodeURIComponent(CENTRE)}&maxDeltaE=4`, { jar: jars.member })).text();
    for (const hit of hits) expect(html).toContain(`ΔE00 ${hit.deltaE00.toFixed(2)}`);
    const bad = await api('/library/search?hex=not-a-colour', { jar: jars.member });
    expect(bad.status).toBe(200);
    expect(await bad.text()).toContain('hex: Give a colour as a hex code');
  });
});
