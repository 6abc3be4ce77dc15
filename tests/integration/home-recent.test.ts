// The front page's "Recent in the library": the newest public coupons with measured colours,
// grouped by alloy pair, whoever asks. Coupons with swatches are inserted directly (invented data);
// the page and the query module are checked against a reading of the tables written in the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import { createHash } from 'node:crypto';
import { converter } from 'culori';
import { api, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { couponsChanged, deleteCoupons } from '../fixtures/library-coupons';
import { alloys, couponLayers, coupons, photos, swatches, users } from '../../db/schema';
import { db as appDb } from '~/lib/server/db';
import { recentPublicPairs, type RecentPair } from '~/lib/server/library/recent';

const { db, pool } = testDatabase();
const toLab = converter('lab65');
const toOklab = converter('oklab');

/** A pair no demo coupon and no other test uses, so its group is this file's alone. */
const PAIR = ['niobium', 'zirconium-702'] as const;
const PAIR_KEY = PAIR.join('+');
/** Dated a day ahead, so this pair is the newest on the front page while the file runs. */
const AHEAD = Date.now() + 24 * 3600 * 1000;

interface Inserted {
  id: number;
  /** The dominant (largest-share, non-mean) hex of each layer, in layer order. */
  dominant: string[];
  /** The layers' mean hexes, which are never a dominant swatch. */
  means: string[];
}

const inserted: Inserted[] = [];
const publicCoupons: Inserted[] = [];
let hidden: Inserted[] = [];

/** A distinct made-up colour for coupon `n`, layer `layer`, kind `kind`. */
const hexFor = (n: number, layer: number, kind: number) =>
  `#${[40 + n * 9, 60 + layer * 80 + kind * 30, 200 - n * 7].map((v) => v.toString(16).padStart(2, '0')).join('')}`;

async function insertPairCoupon(ownerEmail: string, visibility: 'public' | 'members' | 'private', n: number): Promise<Inserted> {
  const [{ id: ownerId }] = await db.select({ id: users.id }).from(users).where(eq(users.email, ownerEmail));
  const alloyRows = await db
    .select({ id: alloys.id, slug: alloys.slug })
    .from(alloys)
    .where(inArray(alloys.slug, [...PAIR]));
  const alloyId = (slug: string) => alloyRows.find((row) => row.slug === slug)!.id;
  const [{ id: couponId }] = await db
    .insert(coupons)
    .values({
      ownerId,
      title: `Recent-pair test ${visibility} ${n}`,
      layerKey: PAIR_KEY,
      surfacePrep: 'ground',
      process: 'oven',
      temperatureC: 400 + n,
      holdSeconds: 600,
      atmosphere: 'air',
      visibility,
      createdAt: new Date(AHEAD + n * 1000),
    })
    .$returningId();
  const key = `test/${ownerId}/recent-${couponId}`;
  const [{ id: photoId }] = await db
    .insert(photos)
    .values({
      couponId,
      ownerId,
      originalKey: `${key}.jpg`,
      displayKey: `${key}.webp`,
      thumbKey: `${key}-t.webp`,
      contentType: 'image/jpeg',
      byteSize: 1,
      width: 10,
      height: 10,
    })
    .$returningId();
  const result: Inserted = { id: couponId, dominant: [], means: [] };
  for (const [position, slug] of PAIR.entries()) {
    const [{ id: layerId }] = await db
      .insert(couponLayers)
      .values({ couponId, position, alloyId: alloyId(slug) })
      .$returningId();
    const swatch = (hex: string, rank: number, isMean: boolean, share: number) => {
      const lab = toLab(hex)!;
      const oklab = toOklab(hex)!;
      return {
        photoId,
        couponId,
        layerId,
        alloyId: alloyId(slug),
        rank,
        isMean,
        share,
        spread: 1,
        hex,
        labL: lab.l,
        labA: lab.a,
        labB: lab.b,
        oklabL: oklab.l,
        oklabA: oklab.a,
        oklabB: oklab.b,
      };
    };
    const [mean, small, large] = [hexFor(n, position, 0), hexFor(n, position, 1), hexFor(n, position, 2)];
    // The mean has the whole share but is never the dominant swatch; the larger cluster is.
    await db.insert(swatches).values([swatch(mean, 0, true, 1), swatch(small, 1, false, 0.3), swatch(large, 2, false, 0.7)]);
    result.dominant.push(large);
    result.means.push(mean);
  }
  // As every writer of the library does: the front page keeps its recent coupons per library version.
  await couponsChanged(db, [couponId]);
  inserted.push(result);
  return result;
}

/**
 * The expected groups, read with plain queries and put in order here: public coupons of exactly
 * two alloys with a measured layer colour; pairs by their newest coupon (then key), newest six;
 * six coupons each, newest first (then higher id); per alloy, its first layer's largest-share
 * non-mean swatch (ties to the lower id).
 */
async function expectedGroups(): Promise<{ key: string; coupons: { id: number; hexes: string[] }[] }[]> {
  const rows = await db
    .select({ id: coupons.id, key: coupons.layerKey, createdAt: coupons.createdAt })
    .from(coupons)
    .where(
      and(
        eq(coupons.visibility, 'public'),
        sql`exists (select 1 from ${swatches} where ${swatches.couponId} = ${coupons.id} and ${swatches.layerId} is not null and ${swatches.isMean} = false)`,
      ),
    );
  const byKey = new Map<string, typeof rows>();
  for (const row of rows.filter((candidate) => candidate.key.split('+').length === 2)) byKey.set(row.key, [...(byKey.get(row.key) ?? []), row]);
  const newest = (list: typeof rows) => Math.max(...list.map((row) => row.createdAt.getTime()));
  const keys = [...byKey.keys()].sort((a, b) => newest(byKey.get(b)!) - newest(byKey.get(a)!) || (a < b ? -1 : 1)).slice(0, 6);
  const chosen = keys.map((key) => ({
    key,
    ids: byKey
      .get(key)!
      .sort((a, b) => b.createdAt.getTime() - a.createdAt.getTime() || b.id - a.id)
      .slice(0, 6)
      .map((row) => row.id),
  }));
  const ids = chosen.flatMap((group) => group.ids);
  const layers = await db
    .select({ id: couponLayers.id, couponId: couponLayers.couponId, position: couponLayers.position, slug: alloys.slug })
    .from(couponLayers)
    .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
    .where(inArray(couponLayers.couponId, ids));
  const measured = await db
    .select({ id: swatches.id, layerId: swatches.layerId, share: swatches.share, hex: swatches.hex })
    .from(swatches)
    .where(and(inArray(swatches.couponId, ids), isNotNull(swatches.layerId), eq(swatches.isMean, false)));
  const dominantOf = (layerId: number) => measured.filter((swatch) => swatch.layerId === layerId).sort((a, b) => b.share - a.share || a.id - b.id)[0]?.hex;
  return chosen.map(({ key, ids: couponIds }) => ({
    key,
    coupons: couponIds.map((id) => ({
      id,
      hexes: key.split('+').flatMap((slug) => {
        const first = layers.filter((layer) => layer.couponId === id && layer.slug === slug && dominantOf(layer.id)).sort((a, b) => a.position - b.position)[0];
        return first ? [dominantOf(first.id)!] : [];
      }),
    })),
  }));
}

const shapeOf = (pairs: RecentPair[]) =>
  pairs.map((pair) => ({
    key: pair.alloys.map((alloy) => alloy.slug).join('+'),
    coupons: pair.coupons.map((coupon) => ({ id: coupon.id, hexes: coupon.swatches.map((swatch) => swatch.hex) })),
  }));

/** The groups as the front page shows them: each group's pair links and its chips' coupon links and hexes. */
function groupsOnPage(html: string) {
  const section = html.slice(html.indexOf('id="recent-in-the-library"'), html.indexOf('id="what-you-can-do"'));
  return section
    .split('<h3')
    .slice(1)
    .map((group) => ({
      key: /href="\/library\?pair=([^"]+)"/.exec(group)?.[1],
      coupons: [...group.matchAll(/href="\/coupons\/(\d+)"[\s\S]*?font-mono[^>]*>([^<]*)</g)].map((match) => ({
        id: Number(match[1]),
        hexes: match[2].split(' ').filter(Boolean),
      })),
    }));
}

/** Reads two things while other test files may add coupons: retried until a reading is stable. */
async function stable<T>(read: () => Promise<T>, expected: () => Promise<unknown>): Promise<[T, unknown]> {
  for (let attempt = 0; ; attempt += 1) {
    const before = await expected();
    const actual = await read();
    const after = await expected();
    if (JSON.stringify(before) === JSON.stringify(after) || attempt === 4) return [actual, after];
  }
}

const jars: Partial<Record<keyof typeof demo, Jar>> = {};

beforeAll(async () => {
  // Seven public coupons of the pair (one more than a group shows), and a members-only and a private one, newest of all.
  for (let n = 0; n < 7; n += 1) publicCoupons.push(await insertPairCoupon(demo.member, 'public', n));
  hidden = [await insertPairCoupon(demo.member, 'members', 10), await insertPairCoupon(demo.member, 'private', 11)];
  for (const who of ['member', 'member2', 'admin'] as const) jars[who] = await signedIn(demo[who]);
});

afterAll(async () => {
  await deleteCoupons(
    db,
    inserted.map((coupon) => coupon.id),
  );
  await pool.end();
  await appDb().$client.end();
});

describe('the front page’s recent public coupons', () => {
  it.each(['visitor', 'member', 'member2', 'admin'] as const)('never shows a member’s private or members-only coupons, to the %s either', async (who) => {
    const response = await api('/', { jar: who === 'visitor' ? undefined : jars[who] });
    expect(response.status).toBe(200);
    const html = await response.text();
    for (const coupon of hidden) {
      expect(html).not.toContain(`href="/coupons/${coupon.id}"`);
      for (const hex of coupon.dominant) expect(html).not.toContain(hex);
    }
    // The pair's six newest public coupons do show, with each layer's dominant swatch (never the mean).
    const [group] = groupsOnPage(html).filter((candidate) => candidate.key === PAIR_KEY);
    expect(group.coupons).toEqual(
      publicCoupons
        .slice(1)
        .reverse()
        .map((coupon) => ({ id: coupon.id, hexes: coupon.dominant })),
    );
    for (const coupon of publicCoupons) for (const hex of coupon.means) expect(html).not.toContain(hex);
  });

  it('groups by alloy pair as a direct reading of the tables does: six pairs, six coupons each, dominant swatch per alloy', async () => {
    const [actual, expected] = await stable(async () => shapeOf(await recentPublicPairs()), expectedGroups);
    expect(actual).toEqual(expected);
    expect(actual.length).toBeGreaterThan(1);
    expect(actual[0].key).toBe(PAIR_KEY);
  });

  it('shows on the page exactly the groups and chips the query gives', async () => {
    const [onPage, expected] = await stable(async () => groupsOnPage(await (await api('/')).text()), expectedGroups);
    expect(onPage).toEqual(expected);
  });

  it('links each group into the library filtered by its pair, and to the pair’s matrix', async () => {
    const html = await (await api('/')).text();
    expect(html).toContain(`href="/library/pairs/${PAIR_KEY}"`);
    const library = await (await api(`/library?pair=${PAIR_KEY}`)).text();
    for (const coupon of publicCoupons) expect(library).toContain(`/coupons/${coupon.id}"`);
    for (const coupon of hidden) expect(library).not.toContain(`/coupons/${coupon.id}"`);
  });

  it('costs a visitor a 304 on a repeat while the library is unchanged', async () => {
    // Other test files may write to the library meanwhile (a new ETag each time), so a few tries.
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 5 && !statuses.includes(304); attempt += 1) {
      const first = await api('/');
      const etag = first.headers.get('etag');
      expect(etag).toMatch(/^"[\w-]+"$/);
      statuses.push((await api('/', { headers: { 'if-none-match': etag! } })).status);
    }
    expect(statuses).toContain(304);
    // Source: RFC 9110 §8.8.3.3 — a strong validator names the exact bytes; ours is their digest.
    // Asked without compression, so the bytes sent are the text read here.
    const page = await api('/', { headers: { 'accept-encoding': 'identity' } });
    expect(page.headers.get('content-encoding')).toBeNull();
    expect(page.headers.get('etag')).toBe(
      `"${createHash('sha256')
        .update(await page.text())
        .digest('base64url')
        .slice(0, 32)}"`,
    );
  });

  it('shows a write through the app at once, to visitors and members: an edited heat, then a coupon made private', async () => {
    const newest = publicCoupons.at(-1)!;
    const chipOf = (html: string) => new RegExp(`href="/coupons/${newest.id}"[\\s\\S]*?</a>`).exec(html)?.[0] ?? '';
    const visitorBefore = await api('/');
    const etagBefore = visitorBefore.headers.get('etag')!;
    expect(chipOf(await visitorBefore.text())).toContain('406 °C');
    await api('/', { jar: jars.member }); // the member's page also read the library before the write

    expect(
      (await api(`/api/coupons/${newest.id}`, { method: 'PATCH', jar: jars.member, json: { temperatureC: 777, temperatureMethod: 'thermocouple' } })).status,
    ).toBe(200);
    const visitorAfter = await api('/', { headers: { 'if-none-match': etagBefore } });
    expect(visitorAfter.status).toBe(200);
    expect(chipOf(await visitorAfter.text())).toContain('777 °C');
    expect(chipOf(await (await api('/', { jar: jars.member })).text())).toContain('777 °C');

    expect((await api(`/api/coupons/${newest.id}`, { method: 'PATCH', jar: jars.member, json: { visibility: 'private' } })).status).toBe(200);
    for (const jar of [undefined, jars.member, jars.admin]) {
      const html = await (await api('/', { jar })).text();
      expect(html).not.toContain(`href="/coupons/${newest.id}"`);
      for (const hex of newest.dominant) expect(html).not.toContain(hex);
    }
  });
});
