import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { api, newJar, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { couponsChanged, deleteCoupons } from '../fixtures/library-coupons';
import { alloys, couponLayers, coupons, photos, swatches, users } from '../../db/schema';
import { converter } from 'culori';
import { bumpLibraryVersions } from '~/lib/server/library-versions';
import { MIN_LIBRARY_COUPONS } from '~/lib/tint';

/**
 * The heat matrix of an alloy pair (GET /api/library/pairs/{a}+{b}, /library/pairs/…) and of one
 * alloy. The fixture uses a pair (C26000 brass with O1 tool steel) and an alloy alone (Zirconium
 * 702) that neither the demo nor other test files log, so the expected counts — direct SQL written
 * here, with the visibility rule spelled out again — see only this file's coupons.
 */
const { db, pool } = testDatabase();
const toLab = converter('lab65');

const PAIR = ['brass-c26000', 'steel-o1'] as const;
const PAIR_KEY = 'brass-c26000+steel-o1';
const SINGLE = 'zirconium-702';
const marker = `pair-matrix-${Date.now()}`;

type Who = 'visitor' | 'member' | 'member2' | 'instructor' | 'admin';
const everyone: Who[] = ['visitor', 'member', 'member2', 'instructor', 'admin'];
const jars = {} as Record<Who, Jar>;
const userIds = {} as Record<Who, string>;
const created: number[] = [];
const titles = new Map<number, string>();

interface Spec {
  owner: 'member' | 'member2';
  visibility: 'private' | 'members' | 'public';
  layers: string[];
  temperatureC: number | null;
  holdMinutes: number | null;
  process?: 'oven' | 'torch' | 'anodize';
  volts?: number;
  /** The dominant swatch's hex per layer (null: no photo for that layer). */
  hexes?: (string | null)[];
  /** The swatches' CIELAB (a fixed blue-grey unless given). */
  lab?: { l: number; a: number; b: number };
}

const alloyIdOf = async (slug: string) => (await db.select({ id: alloys.id }).from(alloys).where(eq(alloys.slug, slug)))[0].id;

async function insertCoupon(spec: Spec): Promise<number> {
  const process = spec.process ?? 'oven';
  const [{ id }] = await db
    .insert(coupons)
    .values({
      ownerId: userIds[spec.owner],
      title: `${marker} ${spec.owner} ${spec.visibility} ${created.length}`,
      layerKey: [...new Set(spec.layers)].sort().join('+'),
      surfacePrep: 'ground',
      process,
      temperatureC: spec.temperatureC,
      holdSeconds: spec.holdMinutes === null ? null : Math.round(spec.holdMinutes * 60),
      volts: spec.volts ?? null,
      visibility: spec.visibility,
    })
    .$returningId();
  created.push(id);
  titles.set(id, `${marker} ${spec.owner} ${spec.visibility} ${created.length - 1}`);
  for (const [position, slug] of spec.layers.entries()) {
    const alloyId = await alloyIdOf(slug);
    const [{ id: layerId }] = await db.insert(couponLayers).values({ couponId: id, position, alloyId }).$returningId();
    const hex = spec.hexes?.[position];
    if (!hex) continue;
    const key = `test/pairs/${id}-${position}`;
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
    const { l, a, b } = spec.lab ?? { l: 50, a: 10, b: -20 };
    const base = { photoId, couponId: id, layerId, alloyId, spread: 1, labL: l, labA: a, labB: b, oklabL: 0.5, oklabA: 0, oklabB: 0 };
    // A mean (share 1, not a cluster), a minor cluster, and the dominant cluster.
    await db.insert(swatches).values([
      { ...base, rank: 0, isMean: true, share: 1, hex: '#808080' },
      { ...base, rank: 2, isMean: false, share: 0.3, hex: '#000000' },
      { ...base, rank: 1, isMean: false, share: 0.7, hex },
    ]);
  }
  await couponsChanged(db, [id]);
  return id;
}

const heats: [number, number][] = [
  [175, 3], // 150 °C row is 125–175: 175 goes up to the 200 °C row
  [200, 5],
  [224.9, 5.5],
  [300, 45],
  [300, 60],
  [300, 61],
  [449, 600],
];

beforeAll(async () => {
  jars.visitor = newJar();
  for (const who of ['member', 'member2', 'instructor', 'admin'] as const) {
    jars[who] = await signedIn(demo[who]);
    userIds[who] = (await db.select({ id: users.id }).from(users).where(eq(users.email, demo[who])))[0].id;
  }
  let n = 0;
  for (const [temperatureC, holdMinutes] of heats) {
    for (const owner of ['member', 'member2'] as const) {
      const visibility = (['private', 'members', 'public'] as const)[n % 3];
      // Layers in either order in the laminate.
      const layers = n % 2 ? [PAIR[1], PAIR[0]] : [...PAIR];
      // Every O1 layer has a swatch; every fourth brass layer has none.
      const hexes = layers.map((slug) => (slug === 'steel-o1' ? '#3050a0' : n % 4 === 3 ? null : '#c09040'));
      await insertCoupon({ owner, visibility, layers, temperatureC, holdMinutes, hexes });
      n += 1;
    }
  }
  await insertCoupon({ owner: 'member', visibility: 'public', layers: [...PAIR], temperatureC: 250, holdMinutes: null });
  await insertCoupon({ owner: 'member2', visibility: 'members', layers: [...PAIR], temperatureC: null, holdMinutes: null, process: 'anodize', volts: 40 });
  // A three-layer laminate and a single layer of one alloy: not the pair.
  await insertCoupon({ owner: 'member', visibility: 'public', layers: [...PAIR, 'steel-1084'], temperatureC: 300, holdMinutes: 10 });
  await insertCoupon({ owner: 'member', visibility: 'public', layers: [PAIR[0]], temperatureC: 300, holdMinutes: 10 });
  for (const visibility of ['private', 'members', 'public'] as const) {
    await insertCoupon({ owner: 'member2', visibility, layers: [SINGLE], temperatureC: 500, holdMinutes: 20, hexes: ['#6040a0'] });
  }
});

afterAll(async () => {
  await deleteCoupons(db, created);
  await pool.end();
});

/** The visibility rule written out in SQL for a caller. */
function visibleSql(who: Who) {
  if (who === 'admin') return sql`true`;
  if (who === 'visitor' || !userIds[who]) return sql`c.visibility = 'public'`;
  return sql`(c.visibility in ('public', 'members') or c.owner_id = ${userIds[who]})`;
}

async function sqlIds(who: Who, condition: ReturnType<typeof sql>): Promise<number[]> {
  const [rows] = (await db.execute(sql`select c.id from coupons c where ${visibleSql(who)} and ${condition} order by c.id`)) as unknown as [{ id: number }[]];
  return rows.map((row) => Number(row.id));
}

interface Body {
  pair?: string[];
  alloy?: string;
  alloys: string[];
  rows: { index: number; centreC: number; lowC: number; highC: number }[];
  columns: { index: number; minSeconds: number; maxSeconds: number | null }[];
  cells: {
    row: number;
    column: number;
    coupons: { id: number; title: string; visibility: string; layers: { position: number; alloy: string; swatch: { hex: string } | null }[] }[];
  }[];
  predicted: unknown[];
  unavailable: { alloy: string; reason: string }[];
  anodized: { id: number }[];
  unbinned: { id: number }[];
}

async function matrix(who: Who, path: string): Promise<Body> {
  const response = await api(path, { jar: jars[who] });
  expect(response.status, await response.clone().text()).toBe(200);
  return response.json();
}

const cellIds = (body: Body) => body.cells.flatMap((cell) => cell.coupons.map((coupon) => coupon.id)).sort((a, b) => a - b);
const mine = sql`c.title like ${`${marker}%`}`;

describe('GET /api/library/pairs/{a}+{b}', () => {
  it('rows span the family ranges (150–450 °C for brass, 190–340 °C for O1) at a 50 °C step', async () => {
    // Hand-worked: 150–450 °C at 25 °C would need 13 rows (over 12), at 50 °C seven, centred on multiples of 50.
    const body = await matrix('admin', `/api/library/pairs/${PAIR_KEY}`);
    expect(body.pair).toEqual([...PAIR]);
    expect(body.rows.map((row) => row.centreC)).toEqual([150, 200, 250, 300, 350, 400, 450]);
    expect(body.cells).toHaveLength(7 * 6);
  });

  it.each(everyone)('every cell holds what a direct SQL count finds, as %s', async (who) => {
    const body = await matrix(who, `/api/library/pairs/${PAIR_KEY}`);
    for (const cell of body.cells) {
      const row = body.rows[cell.row];
      const column = body.columns[cell.column];
      const hold =
        column.index === 0
          ? sql`c.hold_seconds <= ${column.maxSeconds}`
          : column.maxSeconds === null
            ? sql`c.hold_seconds > ${column.minSeconds}`
            : sql`c.hold_seconds > ${column.minSeconds} and c.hold_seconds <= ${column.maxSeconds}`;
      const expected = await sqlIds(
        who,
        sql`c.layer_key = ${PAIR_KEY} and c.process <> 'anodize' and c.temperature_c >= ${row.lowC} and c.temperature_c < ${row.highC} and ${hold}`,
      );
      expect(
        cell.coupons.map((coupon) => coupon.id).sort((a, b) => a - b),
        `${row.centreC} °C, column ${column.index}`,
      ).toEqual(expected);
    }
    // Every visible heat coupon of the pair with a heat record is in exactly one cell.
    const all = await sqlIds(who, sql`c.layer_key = ${PAIR_KEY} and c.process <> 'anodize' and c.temperature_c is not null and c.hold_seconds is not null`);
    expect(cellIds(body)).toEqual(all);
    expect(all.length, 'the fixture gives this caller coupons').toBeGreaterThan(0);
  });

  it('puts hand-worked heats in their cells', async () => {
    const body = await matrix('admin', `/api/library/pairs/${PAIR_KEY}`);
    const at = (centreC: number, column: number) =>
      body.cells.find((cell) => body.rows[cell.row].centreC === centreC && cell.column === column)!.coupons.filter((coupon) => coupon.title.startsWith(marker))
        .length;
    // 175 °C, 3 min → 200 °C row, "≤ 5 min"; 200 °C, 5 min → the same; 224.9 °C, 5.5 min → 200 °C, "5–15 min".
    expect(at(200, 0)).toBe(4);
    expect(at(200, 1)).toBe(2);
    // 300 °C: 45 and 60 min → "30–60 min", 61 min → "1–2 h"; 449 °C, 10 h → 450 °C, "> 2 h".
    expect(at(300, 3)).toBe(4);
    expect(at(300, 4)).toBe(2);
    expect(at(450, 5)).toBe(2);
  });

  it('shows each layer’s dominant swatch, layers in the pair’s order whatever their position', async () => {
    const body = await matrix('admin', `/api/library/pairs/${PAIR_KEY}`);
    const coupons = body.cells.flatMap((cell) => cell.coupons).filter((coupon) => coupon.title.startsWith(marker));
    for (const coupon of coupons) {
      expect(coupon.layers.map((layer) => layer.alloy)).toEqual([...PAIR]);
      const o1 = coupon.layers[1];
      // Source: the fixture's swatches: the dominant is the largest measured cluster (share 0.7), never the mean.
      expect(o1.swatch?.hex).toBe('#3050a0');
    }
    const positions = new Set(coupons.map((coupon) => coupon.layers[0].position));
    expect(positions).toEqual(new Set([0, 1]));
    expect(coupons.some((coupon) => coupon.layers[0].swatch === null)).toBe(true);
  });

  it('lists anodized and unbinned coupons apart, and leaves out laminates of other alloys', async () => {
    const body = await matrix('admin', `/api/library/pairs/${PAIR_KEY}`);
    expect(body.anodized.map((coupon) => coupon.id)).toEqual(await sqlIds('admin', sql`${mine} and c.layer_key = ${PAIR_KEY} and c.process = 'anodize'`));
    expect(body.unbinned.map((coupon) => coupon.id)).toEqual(
      await sqlIds('admin', sql`${mine} and c.layer_key = ${PAIR_KEY} and c.hold_seconds is null and c.process <> 'anodize'`),
    );
    const shown = new Set([...cellIds(body), ...body.anodized.map((c) => c.id), ...body.unbinned.map((c) => c.id)]);
    for (const other of await sqlIds('admin', sql`${mine} and c.layer_key <> ${PAIR_KEY}`)) expect(shown.has(other)).toBe(false);
  });

  it('says why neither alloy gets a modelled band (no optical constants for their films)', async () => {
    const body = await matrix('visitor', `/api/library/pairs/${PAIR_KEY}`);
    // O1 has an iron-oxide film model and published temper kinetics; C26000 brass has neither.
    expect(body.unavailable.map((entry) => entry.alloy)).toEqual(['brass-c26000']);
    expect(body.predicted.length).toBe(body.rows.length * body.columns.length);
  });

  it('gives the same matrix for the pair in either order', async () => {
    for (const who of ['visitor', 'member'] as const) {
      const forward = await matrix(who, `/api/library/pairs/${PAIR[0]}+${PAIR[1]}`);
      const backward = await matrix(who, `/api/library/pairs/${PAIR[1]}+${PAIR[0]}`);
      const encoded = await matrix(who, `/api/library/pairs/${PAIR[1]}%2B${PAIR[0]}`);
      expect(backward).toEqual(forward);
      expect(encoded).toEqual(forward);
    }
  });

  it('never shows someone else’s private coupon, nor members-only ones to a visitor', async () => {
    const [privateOfMember2] = await sqlIds(
      'admin',
      sql`${mine} and c.layer_key = ${PAIR_KEY} and c.visibility = 'private' and c.owner_id = ${userIds.member2}`,
    );
    const [privateOfMember] = await sqlIds('admin', sql`${mine} and c.layer_key = ${PAIR_KEY} and c.visibility = 'private' and c.owner_id = ${userIds.member}`);
    const membersOnly = await sqlIds('admin', sql`${mine} and c.layer_key = ${PAIR_KEY} and c.visibility = 'members'`);
    const seen = async (who: Who) => {
      const body = await matrix(who, `/api/library/pairs/${PAIR_KEY}`);
      return new Set([...cellIds(body), ...body.anodized.map((c) => c.id), ...body.unbinned.map((c) => c.id)]);
    };
    const visitor = await seen('visitor');
    const member = await seen('member');
    const member2 = await seen('member2');
    const instructor = await seen('instructor');
    const admin = await seen('admin');
    for (const id of [privateOfMember, privateOfMember2, ...membersOnly]) expect(visitor.has(id)).toBe(false);
    expect(member.has(privateOfMember)).toBe(true);
    expect(member.has(privateOfMember2)).toBe(false);
    expect(member2.has(privateOfMember2)).toBe(true);
    expect(member2.has(privateOfMember)).toBe(false);
    expect(instructor.has(privateOfMember) || instructor.has(privateOfMember2)).toBe(false);
    for (const id of membersOnly) for (const set of [member, member2, instructor, admin]) expect(set.has(id)).toBe(true);
    expect(admin.has(privateOfMember) && admin.has(privateOfMember2)).toBe(true);
  });

  it.each([
    ['an unknown alloy', '/api/library/pairs/unobtainium+steel-o1', /unobtainium/],
    ['one alloy only', '/api/library/pairs/steel-o1', /two alloys/],
    ['three alloys', '/api/library/pairs/steel-o1+brass-c26000+niobium', /two alloys/],
    ['the same alloy twice', '/api/library/pairs/steel-o1+steel-o1', /two different alloys/],
    ['a very long name', `/api/library/pairs/${'x'.repeat(300)}`, /longer/],
  ])('answers 400 naming the field for %s', async (_label, path, message) => {
    const response = await api(path);
    expect(response.status).toBe(400);
    const body = (await response.json()) as { error: string; field: string };
    expect(body.field).toBe('pair');
    expect(body.error).toMatch(message);
  });
});

describe('GET /api/library/alloys/{a}', () => {
  it.each(everyone)('holds the coupons of the alloy alone a direct SQL count finds, as %s', async (who) => {
    const body = await matrix(who, `/api/library/alloys/${SINGLE}`);
    expect(body.alloy).toBe(SINGLE);
    expect(cellIds(body)).toEqual(
      await sqlIds(who, sql`c.layer_key = ${SINGLE} and c.process <> 'anodize' and c.temperature_c is not null and c.hold_seconds is not null`),
    );
    // Zirconium 702 has optical constants but no heat kinetics in the sources: library data only.
    expect(body.unavailable).toEqual([{ alloy: SINGLE, reason: expect.stringMatching(/heat-growth kinetics/) }]);
  });

  it.each([
    ['/api/library/alloys/steel', /not an alloy/],
    ['/api/library/alloys/steel-o1+niobium', /one alloy/],
  ])('answers 400 naming the field for %s', async (path, message) => {
    const response = await api(path);
    expect(response.status).toBe(400);
    const body = (await response.json()) as { error: string; field: string };
    expect(body.field).toBe('alloy');
    expect(body.error).toMatch(message);
  });
});

describe('the model’s bands in the matrix', () => {
  // W2 tool steel: modelled for heats, one demo coupon, and no other test file writes it.
  const ALLOY = 'steel-w2';
  type Predicted = {
    temperatureC: number;
    holdMinutes: number;
    layers: { alloy: string; basis: string; couponCount: number; hex: string }[];
  }[];
  const bands = async () => (await matrix('member', `/api/library/alloys/${ALLOY}`)).predicted as Predicted;
  const layersOf = (predicted: Predicted) => predicted.flatMap((cell) => cell.layers);

  it('are predicted afresh once a write bumps the alloy’s library version', async () => {
    const before = await bands();
    const modelled = before.find((cell) => cell.layers.length > 0);
    expect(modelled, 'the model gives W2 a colour somewhere').toBeDefined();
    expect(await bands()).toEqual(before);
    const fittedBefore = layersOf(before)[0].couponCount;
    // Enough measured coupons for the library fit (MIN_LIBRARY_COUPONS), at one cell's heat in the
    // model's own colour there, as photo uploads write them; then the writers' version bump
    // (library-versions.ts), which each such write makes in its transaction.
    const { l, a, b } = toLab(modelled!.layers[0].hex)!;
    const ids: number[] = [];
    for (let n = 0; n < MIN_LIBRARY_COUPONS; n += 1)
      ids.push(
        await insertCoupon({
          owner: 'member',
          visibility: 'members',
          layers: [ALLOY],
          temperatureC: modelled!.temperatureC,
          holdMinutes: modelled!.holdMinutes,
          hexes: [modelled!.layers[0].hex],
          lab: { l, a, b },
        }),
      );
    try {
      await bumpLibraryVersions(db, [await alloyIdOf(ALLOY)]);
      const after = layersOf(await bands());
      // The bands now rest on the library fit, which counts the new coupons.
      for (const layer of after) {
        expect(layer.basis).toBe('library');
        expect(layer.couponCount).toBeGreaterThanOrEqual(fittedBefore + MIN_LIBRARY_COUPONS);
      }
    } finally {
      await deleteCoupons(db, ids);
      for (const id of ids) created.splice(created.indexOf(id), 1);
    }
    expect(layersOf(await bands()).map((layer) => layer.couponCount)).toEqual(layersOf(before).map((layer) => layer.couponCount));
  });
});

describe('the heat matrix pages', () => {
  it('show the caller’s coupons of the pair and no one else’s private ones', async () => {
    const visible = await sqlIds('member', sql`${mine} and c.layer_key = ${PAIR_KEY}`);
    const hidden = await sqlIds(
      'admin',
      sql`${mine} and c.layer_key = ${PAIR_KEY} and c.id not in (${sql.join(
        visible.map((id) => sql`${id}`),
        sql`, `,
      )})`,
    );
    expect(hidden.length).toBeGreaterThan(0);
    const response = await api(`/library/pairs/${PAIR_KEY}`, { jar: jars.member });
    expect(response.status).toBe(200);
    const html = await response.text();
    for (const id of visible) expect(html).toContain(`href="/coupons/${id}"`);
    for (const id of hidden) expect(html).not.toContain(`href="/coupons/${id}"`);
    expect(html).toContain('No coupons yet');
    expect(html).toContain('#3050a0');
    expect(html).toMatch(new RegExp(`/library/search\\?hex=${encodeURIComponent('#3050a0')}&(amp|#38);alloy=steel-o1`));
  });

  it('a visitor sees only public coupons', async () => {
    const html = await (await api(`/library/pairs/${PAIR_KEY}`)).text();
    for (const id of await sqlIds('admin', sql`${mine} and c.visibility <> 'public'`)) expect(html).not.toContain(`href="/coupons/${id}"`);
  });

  it('shows temperatures in °F when asked', async () => {
    // Source: NIST SP 811 (2008) appendix B.8: 300 °C = 572 °F; the row 275–325 °C is 527–617 °F.
    const html = await (await api(`/library/pairs/${PAIR_KEY}?unit=F`)).text();
    expect(html).toContain('572 °F');
    expect(html).toContain('527–617 °F');
  });

  it('sends the other order, the same alloy twice and the picker’s form to the right address', async () => {
    const backward = await api(`/library/pairs/${PAIR[1]}+${PAIR[0]}?unit=F`);
    expect(backward.status).toBe(301);
    expect(new URL(backward.headers.get('location')!, 'http://x').pathname + new URL(backward.headers.get('location')!, 'http://x').search).toBe(
      `/library/pairs/${PAIR_KEY}?unit=F`,
    );
    const twice = await api('/library/pairs/steel-o1+steel-o1');
    expect(twice.status).toBe(302);
    expect(twice.headers.get('location')).toMatch(/\/library\/alloys\/steel-o1$/);
    const picked = await api(`/library/pairs?a=${PAIR[1]}&b=${PAIR[0]}`);
    expect(picked.headers.get('location')).toMatch(new RegExp(`/library/pairs/${PAIR_KEY.replace('+', '\\+')}$`));
    const one = await api(`/library/pairs?a=${SINGLE}&b=&unit=F`);
    expect(one.headers.get('location')).toMatch(new RegExp(`/library/alloys/${SINGLE}\\?unit=F$`));
  });

  it.each(['/library/pairs/unobtainium+steel-o1', '/library/pairs/steel-o1', '/library/alloys/steel', '/library/alloys/steel-o1+niobium'])(
    '%s is not found',
    async (path) => {
      expect((await api(path)).status).toBe(404);
    },
  );

  it('the library links a pair filter to its matrix', async () => {
    const html = await (await api(`/library?pair=${encodeURIComponent(`${PAIR[1]}+${PAIR[0]}`)}`)).text();
    expect(html).toContain(`href="/library/pairs/${PAIR_KEY}"`);
    expect(html).toContain('See this pair as a heat matrix');
  });
});
