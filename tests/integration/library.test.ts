import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { api, newJar, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { couponsChanged, deleteCoupons } from '../fixtures/library-coupons';
import { alloys, couponLayers, coupons, photos, swatches, users } from '../../db/schema';

/**
 * The library's filters, sort and keyset paging over GET /api/coupons and /library. Every query is
 * fenced to a temperature (or voltage) band only this file's coupons use, so coupons other test
 * files add and delete meanwhile never change a count; the expected counts are direct SQL written
 * here, with the visibility rule spelled out in SQL again (not our query builder).
 */
const { db, pool } = testDatabase();

// A band of heats no other test or the demo uses (fractional °C), and one of voltages.
const BAND = { low: 1500.25, high: 1599.75 };
const VOLT_BAND = { low: 900.25, high: 999.75 };
const fence = `tempMin=${BAND.low}&tempMax=${BAND.high}`;

type Who = 'visitor' | 'member' | 'member2' | 'instructor' | 'admin';
const jars = {} as Record<Who, Jar>;
const userIds = {} as Record<Who, string>;
const created: number[] = [];

interface Spec {
  owner: 'member' | 'member2';
  visibility: 'private' | 'members' | 'public';
  layers: string[];
  temperatureC?: number | null;
  holdSeconds?: number | null;
  volts?: number | null;
  process?: 'oven' | 'torch' | 'anodize';
  atmosphere?: 'air' | 'argon';
  surfacePrep?: 'ground' | 'polished';
  title?: string;
  /** Swatch shares per layer: the largest is the layer's dominant colour. */
  swatchHexes?: string[];
}

const alloyIdOf = async (slug: string) => (await db.select({ id: alloys.id }).from(alloys).where(eq(alloys.slug, slug)))[0].id;

async function insertCoupon(spec: Spec): Promise<number> {
  const layerKey = [...new Set(spec.layers)].sort().join('+');
  const process = spec.process ?? 'oven';
  const [{ id }] = await db
    .insert(coupons)
    .values({
      ownerId: userIds[spec.owner],
      title: spec.title ?? `Library fixture ${spec.layers.join('/')}`,
      layerKey,
      surfacePrep: spec.surfacePrep ?? 'ground',
      process,
      temperatureC: spec.temperatureC === undefined ? null : spec.temperatureC,
      holdSeconds: spec.holdSeconds === undefined ? null : spec.holdSeconds,
      volts: spec.volts ?? null,
      atmosphere: spec.atmosphere ?? 'air',
      argonFlowLpm: spec.atmosphere === 'argon' ? 10 : null,
      visibility: spec.visibility,
    })
    .$returningId();
  created.push(id);
  for (const [position, slug] of spec.layers.entries()) {
    const alloyId = await alloyIdOf(slug);
    const [{ id: layerId }] = await db.insert(couponLayers).values({ couponId: id, position, alloyId }).$returningId();
    if (spec.swatchHexes) {
      const key = `test/library/${id}-${position}`;
      const [{ id: photoId }] = await db
        .insert(photos)
        .values({
          couponId: id,
          ownerId: userIds[spec.owner],
          originalKey: `${key}.jpg`,
          displayKey: `${key}.webp`,
          thumbKey: `${key}-t.webp`,
          contentType: 'image/jpeg',
          byteSize: 1,
          width: 1,
          height: 1,
        })
        .$returningId();
      const base = { photoId, couponId: id, layerId, alloyId, spread: 1, labL: 50, labA: 0, labB: 0, oklabL: 0.5, oklabA: 0, oklabB: 0 };
      // A mean (share 1, not a cluster), a minor cluster, and the dominant one: the dominant is the largest *cluster*.
      await db.insert(swatches).values([
        { ...base, rank: 0, isMean: true, share: 1, hex: '#808080' },
        { ...base, rank: 2, isMean: false, share: 0.3, hex: '#000000' },
        { ...base, rank: 1, isMean: false, share: 0.7, hex: spec.swatchHexes[position] },
      ]);
    }
  }
  await couponsChanged(db, [id]);
  return id;
}

beforeAll(async () => {
  jars.visitor = newJar();
  for (const who of ['member', 'member2', 'instructor', 'admin'] as const) {
    jars[who] = await signedIn(demo[who]);
    userIds[who] = (await db.select({ id: users.id }).from(users).where(eq(users.email, demo[who])))[0].id;
  }
  const temps = [1510, 1520.5, 1530, 1530, 1545, 1550, 1560, 1575, 1590, 1599];
  for (const [index, temperatureC] of temps.entries()) {
    await insertCoupon({
      owner: index % 3 === 2 ? 'member2' : 'member',
      visibility: (['private', 'members', 'public'] as const)[index % 3],
      layers: index % 2 ? ['ti-grade-5', 'ti-grade-2'] : index % 4 === 0 ? ['ti-grade-2', 'ti-grade-5'] : ['steel-1084'],
      temperatureC,
      holdSeconds: index % 4 === 3 ? null : 60 * (5 + index * 5),
      process: index % 5 === 0 ? 'torch' : 'oven',
      atmosphere: index % 3 === 1 ? 'argon' : 'air',
      surfacePrep: index % 2 ? 'polished' : 'ground',
      swatchHexes: index % 2 ? ['#3050a0', '#c0a040'] : undefined,
    });
  }
  // Someone else's private and members-only coupons, and anodized ones in the voltage band.
  await insertCoupon({ owner: 'member2', visibility: 'private', layers: ['niobium'], temperatureC: 1555, holdSeconds: 600 });
  await insertCoupon({ owner: 'member2', visibility: 'members', layers: ['niobium'], temperatureC: 1556, holdSeconds: 600 });
  await insertCoupon({
    owner: 'member',
    visibility: 'public',
    layers: ['steel-1084'],
    temperatureC: 1580,
    holdSeconds: 60,
    title: '=HYPERLINK("http://x.example"),\nsecond line',
  });
  for (const volts of [910, 950, 990]) await insertCoupon({ owner: 'member', visibility: 'public', layers: ['niobium'], process: 'anodize', volts });
});

afterAll(async () => {
  await deleteCoupons(db, created);
  await pool.end();
});

/** The visibility rule written out in SQL for a caller. */
function visibleSql(who: Who) {
  if (who === 'admin') return sql`true`;
  if (who === 'visitor') return sql`c.visibility = 'public'`;
  return sql`(c.visibility in ('public', 'members') or c.owner_id = ${userIds[who]})`;
}

async function sqlIds(who: Who, condition: ReturnType<typeof sql>, order = sql`c.id`): Promise<number[]> {
  const [rows] = (await db.execute(sql`select c.id from coupons c where ${visibleSql(who)} and ${condition} order by ${order}`)) as unknown as [
    { id: number }[],
  ];
  return rows.map((row) => Number(row.id));
}

interface ListBody {
  coupons: {
    id: number;
    visibility: string;
    temperatureC: number | null;
    holdSeconds: number | null;
    dominantSwatches: { position: number; alloy: string; hex: string }[];
  }[];
  total: number;
  nextCursor: string | null;
}

async function list(who: Who, params: string): Promise<ListBody> {
  const response = await api(`/api/coupons?${params}`, { jar: jars[who] });
  expect(response.status, await response.clone().text()).toBe(200);
  return response.json();
}

async function allPages(who: Who, params: string, between?: () => Promise<void>): Promise<number[]> {
  const ids: number[] = [];
  let cursor: string | null = null;
  for (let guard = 0; guard < 50; guard += 1) {
    const body: ListBody = await list(who, `${params}${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`);
    ids.push(...body.coupons.map((coupon) => coupon.id));
    if (!body.nextCursor) return ids;
    cursor = body.nextCursor;
    if (between) await between();
  }
  throw new Error('paging did not end');
}

const inBand = sql`c.temperature_c between ${BAND.low} and ${BAND.high}`;

describe('GET /api/coupons library filters', () => {
  it.each([
    [
      'alloy on any layer',
      'alloy=ti-grade-5',
      sql`exists (select 1 from coupon_layers l join alloys a on a.id = l.alloy_id where l.coupon_id = c.id and a.slug = 'ti-grade-5')`,
    ],
    ['an alloy pair, one order', 'pair=ti-grade-5%2Bti-grade-2', sql`c.layer_key = 'ti-grade-2+ti-grade-5'`],
    ['an alloy pair, the other order, as two fields', 'pairA=ti-grade-2&pairB=ti-grade-5', sql`c.layer_key = 'ti-grade-2+ti-grade-5'`],
    ['process', 'process=torch', sql`c.process = 'torch'`],
    ['atmosphere', 'atmosphere=argon', sql`c.atmosphere = 'argon'`],
    ['surface preparation', 'prep=polished', sql`c.surface_prep = 'polished'`],
    ['hold range in minutes', 'holdMin=10&holdMax=30', sql`c.hold_seconds between 600 and 1800`],
    ['has photos', 'photos=1', sql`exists (select 1 from photos p where p.coupon_id = c.id)`],
    ['mine only', 'mine=1', null],
  ])('%s matches a direct SQL count', async (_label, params, condition) => {
    for (const who of condition ? (['member', 'member2', 'admin'] as const) : (['member', 'member2'] as const)) {
      const where = condition ?? sql`c.owner_id = ${userIds[who]}`;
      const expected = await sqlIds(who, sql`${inBand} and ${where}`);
      expect(expected.length, 'the fixture covers this filter').toBeGreaterThan(0);
      const body = await list(who, `${fence}&${params}&limit=100`);
      expect(body.coupons.map((coupon) => coupon.id).sort((a, b) => a - b)).toEqual(expected);
      expect(body.total).toBe(expected.length);
    }
  });

  it('filters anodized coupons by voltage range', async () => {
    const expected = await sqlIds('visitor', sql`c.volts between 920 and 999.75`);
    expect(expected.length).toBe(2);
    const body = await list('visitor', `voltsMin=920&voltsMax=${VOLT_BAND.high}&limit=100`);
    expect(body.coupons.map((coupon) => coupon.id).sort((a, b) => a - b)).toEqual(expected);
  });

  it('takes the temperature range in °F when asked', async () => {
    // Source: NIST SP 811 (2008) appendix B.8: t/°C = (t/°F − 32)/1.8, so 2768 °F = 1520 °C and 2822 °F = 1550 °C.
    const fromF = (f: number) => ((f - 32) * 5) / 9;
    expect(fromF(2768)).toBeCloseTo(1520, 9);
    const expected = await sqlIds('admin', sql`c.temperature_c between ${fromF(2768)} and ${fromF(2822)}`);
    expect(expected.length).toBeGreaterThan(2);
    const body = await list('admin', 'unit=F&tempMin=2768&tempMax=2822&limit=100');
    expect(body.coupons.map((coupon) => coupon.id).sort((a, b) => a - b)).toEqual(expected);
    // The same numbers read as °C select nothing of ours (and nothing at all: above the 1600 °C cap).
    expect((await list('admin', 'tempMin=2768&tempMax=2822')).total).toBe(0);
  });

  it('sorts by temperature and by hold, rows without one last, as SQL orders them', async () => {
    for (const [params, order] of [
      ['sort=temperature', sql`c.temperature_c is null, c.temperature_c, c.id`],
      ['sort=temperature&order=desc', sql`c.temperature_c is null, c.temperature_c desc, c.id desc`],
      ['sort=hold', sql`c.hold_seconds is null, c.hold_seconds, c.id`],
      ['sort=hold&order=desc', sql`c.hold_seconds is null, c.hold_seconds desc, c.id desc`],
      ['sort=date', sql`c.created_at desc, c.id desc`],
    ] as const) {
      const expected = await sqlIds('member', inBand, order);
      expect(await allPages('member', `${fence}&${params}&limit=4`)).toEqual(expected);
    }
  });

  it('gives each layer its dominant swatch: the cluster with the largest share, not the mean', async () => {
    const body = await list('admin', `${fence}&photos=1&limit=100`);
    expect(body.coupons.length).toBeGreaterThan(0);
    for (const coupon of body.coupons) {
      expect(coupon.dominantSwatches.map((swatch) => [swatch.position, swatch.hex])).toEqual([
        [0, '#3050a0'],
        [1, '#c0a040'],
      ]);
    }
  });

  it.each([
    ['alloy=unobtainium', 'alloy'],
    ['pair=ti-grade-2', 'pair'],
    ['pairA=ti-grade-2', 'pairB'],
    ['process=smelting', 'process'],
    ['tempMin=hot', 'tempMin'],
    ['tempMin=600&tempMax=500', 'tempMax'],
    ['unit=K', 'unit'],
    ['sort=colour-of-money', 'sort'],
    ['limit=0', 'limit'],
    ['cursor=bm90LWEtY3Vyc29y', 'cursor'],
  ])('refuses %s with a 400 naming %s', async (params, field) => {
    const response = await api(`/api/coupons?${params}`, { jar: jars.member });
    expect(response.status).toBe(400);
    expect((await response.json()).field).toBe(field);
  });

  it('refuses a cursor made for another sort', async () => {
    const { nextCursor } = await list('admin', `${fence}&sort=temperature&limit=1`);
    expect(nextCursor).toEqual(expect.any(String));
    const response = await api(`/api/coupons?${fence}&sort=hold&cursor=${encodeURIComponent(nextCursor!)}`, { jar: jars.admin });
    expect(response.status).toBe(400);
  });
});

describe('keyset paging', () => {
  it('returns every row exactly once while rows are inserted between pages', async () => {
    for (const sort of ['sort=temperature', 'sort=date', 'sort=hold&order=desc']) {
      const before = await sqlIds('member', inBand);
      let temperature = 1511;
      const seen = await allPages('member', `${fence}&${sort}&limit=3`, async () => {
        // New rows both before and after where paging stands.
        await insertCoupon({ owner: 'member', visibility: 'public', layers: ['steel-1095'], temperatureC: temperature, holdSeconds: 60 });
        temperature += 41;
      });
      expect(new Set(seen).size, 'no row twice').toBe(seen.length);
      for (const id of before) expect(seen).toContain(id);
    }
  });
});

describe('visibility in the library', () => {
  it.each(['visitor', 'member', 'member2', 'instructor', 'admin'] as const)('%s sees exactly what the rule allows', async (who) => {
    const expected = await sqlIds(who, inBand);
    const body = await list(who, `${fence}&limit=100`);
    expect(body.coupons.map((coupon) => coupon.id).sort((a, b) => a - b)).toEqual(expected);
    const all = (await sqlIds('admin', inBand)).length;
    if (who !== 'admin') expect(expected.length).toBeLessThan(all);
    // Someone else's private coupon never shows, members-only only to the signed in.
    const [othersPrivate] = await sqlIds('admin', sql`${inBand} and c.visibility = 'private' and c.owner_id = ${userIds.member2}`);
    const [othersMembers] = await sqlIds('admin', sql`${inBand} and c.visibility = 'members' and c.owner_id = ${userIds.member2}`);
    const ids = body.coupons.map((coupon) => coupon.id);
    expect(ids.includes(othersPrivate)).toBe(who === 'admin' || who === 'member2');
    expect(ids.includes(othersMembers)).toBe(who !== 'visitor');
  });

  it('asks a visitor to sign in for "mine only"', async () => {
    expect((await api('/api/coupons?mine=1', { jar: jars.visitor })).status).toBe(401);
  });
});

describe('the /library page', () => {
  it('lists the same coupons as the API, in the caller’s unit, without JavaScript', async () => {
    const body = await list('member', `${fence}&sort=temperature&limit=100`);
    // The same band typed in °F (t/°F = 1.8·t/°C + 32, NIST SP 811 appendix B.8).
    const toF = (celsius: number) => celsius * 1.8 + 32;
    const html = await (
      await api(`/library?tempMin=${toF(BAND.low)}&tempMax=${toF(BAND.high)}&sort=temperature&limit=100&unit=F`, { jar: jars.member })
    ).text();
    for (const coupon of body.coupons) expect(html).toContain(`href="/coupons/${coupon.id}"`);
    // Source: NIST SP 811 appendix B.8: 1510 °C = 2750 °F.
    expect(html).toContain('2750 °F');
    expect(html).toContain('<form method="get" action="/library"');
  });

  it('ignores a bad cursor with a note and a bad filter with a note naming it', async () => {
    const response = await api(`/library?cursor=nonsense&alloy=unobtainium`, { jar: jars.visitor });
    expect(response.status).toBe(200);
    const html = await response.text();
    expect(html).toContain('Showing the first page');
    expect(html).toContain('alloy: ');
  });

  it('shows the swatch grid view', async () => {
    const html = await (await api(`/library?${fence}&view=grid&photos=1`, { jar: jars.admin })).text();
    expect(html).toContain('aria-label="Coupons as swatches"');
    expect(html).toContain('background:#3050a0');
  });
});

describe('GET /api/library/export', () => {
  it('exports the view as CSV: a header, one row per visible coupon, formulas neutralised', async () => {
    const expected = await sqlIds('visitor', inBand);
    const response = await api(`/api/library/export?format=csv&${fence}&sort=temperature`, { jar: jars.visitor });
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toMatch(/^text\/csv/);
    const text = await response.text();
    // Source: OWASP "CSV Injection" (leading apostrophe) and RFC 4180 §2 (quoted field, quotes doubled, line break inside quotes).
    expect(text).toContain(`"'=HYPERLINK(""http://x.example""),\nsecond line"`);
    const ids = [...text.matchAll(/\r\n(\d+),/g)].map((match) => Number(match[1]));
    expect(ids.sort((a, b) => a - b)).toEqual(expected);
    expect(text.startsWith('id,title,layers,')).toBe(true);
  });

  it('exports the same view as JSON for each role, never someone else’s private coupon', async () => {
    for (const who of ['member', 'member2', 'admin'] as const) {
      const expected = await sqlIds(who, inBand);
      const body = await (await api(`/api/library/export?format=json&${fence}`, { jar: jars[who] })).json();
      expect(body.coupons.map((coupon: { id: number }) => coupon.id).sort((a: number, b: number) => a - b)).toEqual(expected);
    }
  });

  it('refuses an unknown format or filter with a 400 naming it', async () => {
    expect((await (await api('/api/library/export?format=xlsx', { jar: jars.member })).json()).field).toBe('format');
    expect((await (await api('/api/library/export?format=csv&process=magic', { jar: jars.member })).json()).field).toBe('process');
  });
});
