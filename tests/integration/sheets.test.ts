import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { alloys, classes, classMembers, colourSheets, coupons, photos, swatches, users } from '../../db/schema';
import { api, newJar, type Jar } from '../support/app';
import { confirmedAccount, demo, signedIn, type TestAccount } from '../support/auth';
import { testDatabase } from '../support/database';
import { couponsChanged } from '../fixtures/library-coupons';
import { countMail, waitForMail } from '../support/mail';
import { deleteTestCoupons, insertCoupon, userIdOf } from '../support/photos';
import { libraryPickQuery, libraryPicks, noLibraryFilters, type LibraryCouponAnswer } from '~/lib/sheets/library-picks';

/**
 * Colour sheets over HTTP against the built app and MariaDB: who sees which sheet, the order kept
 * exactly, swatches whose coupons stop being shared, the publish mail, and the PDF read back with
 * poppler-utils (pdfinfo, pdffonts, pdftotext).
 */

const { db, pool } = testDatabase();
type Who = 'visitor' | 'member' | 'student' | 'otherMember' | 'owner' | 'otherInstructor' | 'admin';
const jars = {} as Record<Who, Jar>;
let student: TestAccount;
let otherInstructor: TestAccount;
let classId: number;
const couponIds: number[] = [];
const sheetIds: number[] = [];

interface SheetBody {
  id: number;
  title: string;
  status: string;
  audience: string;
  note: string | null;
  entries: ({ kind: 'heading'; id: number; text: string } | { kind: 'swatch'; id: number; swatchId: number | null; hex: string; available: boolean })[];
}

/** A coupon of `ownerEmail` with one photo and swatches of exactly these colours (inserted directly). */
async function couponWithSwatches(ownerEmail: string, visibility: 'private' | 'members' | 'public', hexes: string[]) {
  const coupon = await insertCoupon(db, ownerEmail, ['ti-grade-2'], visibility);
  couponIds.push(coupon.id);
  const ownerId = await userIdOf(db, ownerEmail);
  const [photo] = await db
    .insert(photos)
    .values({ couponId: coupon.id, ownerId, originalKey: 'x', displayKey: 'x', thumbKey: 'x', contentType: 'image/jpeg', byteSize: 1, width: 1, height: 1 })
    .$returningId();
  const ids: number[] = [];
  for (const [rank, hex] of hexes.entries()) {
    const [row] = await db
      .insert(swatches)
      .values({
        photoId: photo.id,
        couponId: coupon.id,
        layerId: coupon.layerIds[0],
        rank,
        share: 0.5,
        spread: 1,
        hex,
        labL: 50,
        labA: 10,
        labB: 20,
        oklabL: 0.5,
        oklabA: 0,
        oklabB: 0,
      })
      .$returningId();
    ids.push(row.id);
  }
  await couponsChanged(db, [coupon.id]);
  return { couponId: coupon.id, swatchIds: ids };
}

async function newSheet(body: Record<string, unknown>): Promise<number> {
  const response = await api('/api/sheets', { jar: jars.owner, json: body });
  expect(response.status).toBe(201);
  const { id } = (await response.json()) as SheetBody;
  sheetIds.push(id);
  return id;
}

const patch = (id: number, body: unknown, jar = jars.owner) => api(`/api/sheets/${id}`, { method: 'PATCH', jar, json: body });
const read = async (id: number, jar: Jar) => (await (await api(`/api/sheets/${id}`, { jar })).json()) as SheetBody;
const swatchItem = (swatchId: number) => ({ kind: 'swatch', swatchId });

beforeAll(async () => {
  jars.visitor = newJar();
  jars.member = await signedIn(demo.member);
  jars.otherMember = await signedIn(demo.member2);
  jars.owner = await signedIn(demo.instructor);
  jars.admin = await signedIn(demo.admin);
  student = await confirmedAccount();
  jars.student = student.jar;
  otherInstructor = await confirmedAccount();
  await db.update(users).set({ role: 'instructor' }).where(eq(users.id, otherInstructor.id));
  jars.otherInstructor = otherInstructor.jar;
  const [row] = await db
    .insert(classes)
    .values({ instructorId: await userIdOf(db, demo.instructor), name: 'Saltmarsh spring heat colours' })
    .$returningId();
  classId = row.id;
  await db.insert(classMembers).values({ classId, userId: student.id, role: 'student' });
}, 60_000);

afterAll(async () => {
  if (sheetIds.length) await db.delete(colourSheets).where(inArray(colourSheets.id, sheetIds));
  await deleteTestCoupons(db, couponIds);
  await db.delete(classes).where(eq(classes.id, classId));
  await pool.end();
});

describe('who sees a sheet', () => {
  const everyone: Who[] = ['visitor', 'member', 'student', 'otherMember', 'owner', 'otherInstructor', 'admin'];
  const cases: { sheet: 'draft' | 'class' | 'public'; expect: Record<Who, number> }[] = [
    { sheet: 'draft', expect: { visitor: 404, member: 404, student: 404, otherMember: 404, owner: 200, otherInstructor: 404, admin: 200 } },
    { sheet: 'class', expect: { visitor: 404, member: 404, student: 200, otherMember: 404, owner: 200, otherInstructor: 404, admin: 200 } },
    { sheet: 'public', expect: { visitor: 200, member: 200, student: 200, otherMember: 200, owner: 200, otherInstructor: 200, admin: 200 } },
  ];
  const ids = {} as Record<'draft' | 'class' | 'public', number>;

  beforeAll(async () => {
    const { swatchIds } = await couponWithSwatches(demo.instructor, 'public', ['#b98c4e']);
    ids.draft = await newSheet({ title: 'Draft sheet', classId });
    ids.class = await newSheet({ title: 'Class sheet', classId, audience: 'class' });
    ids.public = await newSheet({ title: 'Public sheet', audience: 'public' });
    for (const id of Object.values(ids)) expect((await patch(id, { items: [swatchItem(swatchIds[0])] })).status).toBe(200);
    expect((await patch(ids.class, { status: 'published' })).status).toBe(200);
    expect((await patch(ids.public, { status: 'published' })).status).toBe(200);
  });

  it.each(cases.flatMap((row) => everyone.map((who) => ({ ...row, who, status: row.expect[who] }))))(
    'GET the $sheet sheet as $who → $status, its PDF the same, and the list agrees',
    async ({ sheet, who, status }) => {
      expect((await api(`/api/sheets/${ids[sheet]}`, { jar: jars[who] })).status).toBe(status);
      expect((await api(`/api/sheets/${ids[sheet]}/pdf`, { jar: jars[who] })).status).toBe(status);
      const { sheets } = (await (await api('/api/sheets', { jar: jars[who] })).json()) as { sheets: { id: number }[] };
      expect(sheets.some((listed) => listed.id === ids[sheet])).toBe(status === 200);
    },
  );

  it('changes: only the owner and admins; a student of the class who may see it gets 403, others 404, a visitor 401', async () => {
    const statuses = Object.fromEntries(await Promise.all(everyone.map(async (who) => [who, (await patch(ids.class, { title: '' }, jars[who])).status])));
    expect(statuses).toEqual({ visitor: 401, member: 404, student: 403, otherMember: 404, owner: 400, otherInstructor: 404, admin: 400 });
  });

  it('creating: instructors and admins only', async () => {
    const body = { title: '' };
    expect((await api('/api/sheets', { jar: jars.visitor, json: body })).status).toBe(401);
    expect((await api('/api/sheets', { jar: jars.member, json: body })).status).toBe(403);
    expect((await api('/api/sheets', { jar: jars.student, json: body })).status).toBe(403);
    const refused = await api('/api/sheets', { jar: jars.otherInstructor, json: body });
    expect(refused.status).toBe(400);
    expect(((await refused.json()) as { field: string }).field).toBe('title');
  });

  it('another instructor may not put a sheet in a class they do not teach', async () => {
    const response = await api('/api/sheets', { jar: jars.otherInstructor, json: { title: 'Borrowed class', classId } });
    expect(response.status).toBe(400);
    expect(((await response.json()) as { field: string }).field).toBe('classId');
  });
});

describe('entries', () => {
  it('keeps the order exactly, headings included, and replaces it whole', async () => {
    const { swatchIds } = await couponWithSwatches(demo.instructor, 'public', ['#111111', '#222222', '#333333', '#444444']);
    const id = await newSheet({ title: 'Order' });
    const first = [
      { kind: 'heading', text: 'Straw' },
      swatchItem(swatchIds[2]),
      swatchItem(swatchIds[0]),
      { kind: 'heading', text: 'Blue' },
      swatchItem(swatchIds[3]),
      swatchItem(swatchIds[1]),
    ];
    expect((await patch(id, { items: first })).status).toBe(200);
    const saved = await read(id, jars.owner);
    expect(saved.entries.map((entry) => (entry.kind === 'heading' ? entry.text : entry.swatchId))).toEqual([
      'Straw',
      swatchIds[2],
      swatchIds[0],
      'Blue',
      swatchIds[3],
      swatchIds[1],
    ]);
    // Reversed, keeping the existing entries by id.
    const reversed = [...saved.entries]
      .reverse()
      .map((entry) => (entry.kind === 'heading' ? { kind: 'heading', text: entry.text } : { kind: 'swatch', itemId: entry.id }));
    expect((await patch(id, { items: reversed })).status).toBe(200);
    const again = await read(id, jars.owner);
    expect(again.entries.map((entry) => (entry.kind === 'heading' ? entry.text : entry.swatchId))).toEqual([
      swatchIds[1],
      swatchIds[3],
      'Blue',
      swatchIds[0],
      swatchIds[2],
      'Straw',
    ]);
  });

  it('refuses a swatch the owner may not see, naming the entry', async () => {
    const { swatchIds } = await couponWithSwatches(demo.member, 'private', ['#5a5a5a']);
    const id = await newSheet({ title: 'Someone else’s private swatch' });
    const response = await patch(id, { items: [{ kind: 'heading', text: 'x' }, swatchItem(swatchIds[0])] });
    expect(response.status).toBe(400);
    expect(((await response.json()) as { field: string }).field).toBe('items.1.swatchId');
    expect((await read(id, jars.owner)).entries).toEqual([]);
  });
});

describe('a swatch whose coupon stops being shared', () => {
  it('leaves a note for the owner and is neither shown nor leaked to students', async () => {
    const kept = await couponWithSwatches(demo.member, 'members', ['#a1b2c3']);
    const goingPrivate = await couponWithSwatches(demo.member, 'members', ['#d4e5f6']);
    const deleted = await couponWithSwatches(demo.member, 'members', ['#0f1e2d']);
    const id = await newSheet({ title: 'Changing cohort', classId, audience: 'class' });
    const items = [kept, goingPrivate, deleted].map((coupon) => swatchItem(coupon.swatchIds[0]));
    expect((await patch(id, { items, status: 'published' })).status).toBe(200);
    await db.update(coupons).set({ visibility: 'private' }).where(eq(coupons.id, goingPrivate.couponId));
    await couponsChanged(db, [goingPrivate.couponId]);
    await deleteTestCoupons(db, [deleted.couponId]);

    const owner = await read(id, jars.owner);
    expect(owner.note).toBe('2 swatches were removed: their coupons are no longer shared or were deleted.');
    expect(owner.entries.filter((entry) => entry.kind === 'swatch' && !entry.available)).toHaveLength(2);

    const studentAnswer = await (await api(`/api/sheets/${id}`, { jar: jars.student })).text();
    expect(studentAnswer).toContain('#a1b2c3');
    expect(studentAnswer).not.toContain('#d4e5f6');
    expect(studentAnswer).not.toContain('#0f1e2d');
    expect((JSON.parse(studentAnswer) as SheetBody).note).toBeNull();
    const pdf = new Uint8Array(await (await api(`/api/sheets/${id}/pdf`, { jar: jars.student })).arrayBuffer());
    const text = pdfText(pdf);
    expect(text).toContain('#A1B2C3');
    expect(text).not.toContain('#D4E5F6');
  });
});

describe('publishing', () => {
  it('mails the class’s students once, and nobody outside it', async () => {
    const { swatchIds } = await couponWithSwatches(demo.instructor, 'public', ['#c08040']);
    const title = `Temper colours ${Date.now()}`;
    const id = await newSheet({ title, classId, audience: 'class' });
    expect((await patch(id, { items: [swatchItem(swatchIds[0])] })).status).toBe(200);
    const [first, second] = await Promise.all([patch(id, { status: 'published' }), patch(id, { status: 'published' })]);
    expect([first.status, second.status]).toEqual([200, 200]);
    const mail = await waitForMail(student.email, `New colour sheet: ${title}`);
    expect(mail.text).toContain(`/sheets/${id}`);
    await new Promise((resolve) => setTimeout(resolve, 500));
    expect(await countMail(student.email, title)).toBe(1);
    expect(await countMail(otherInstructor.email, title)).toBe(0);
  });

  it('refuses to publish to a class without one, naming the audience', async () => {
    const id = await newSheet({ title: 'No class' });
    const response = await patch(id, { status: 'published', audience: 'class' });
    expect(response.status).toBe(400);
    expect(((await response.json()) as { field: string }).field).toBe('audience');
  });
});

describe('the builder’s library picker', () => {
  it('finds a laminate by the library’s filters and places each layer’s dominant swatch', async () => {
    // A forge-tempered 1084 / 15N20 offcut at a temperature no demo coupon has (287 °C), with two
    // measured clusters per layer; the dominant one is the cluster with the larger share.
    const layers = ['steel-1084', 'steel-15n20'];
    const coupon = await insertCoupon(db, demo.member, layers, 'public');
    couponIds.push(coupon.id);
    await db.update(coupons).set({ process: 'forge', temperatureC: 287, holdSeconds: 300 }).where(eq(coupons.id, coupon.id));
    const [photo] = await db
      .insert(photos)
      .values({
        couponId: coupon.id,
        ownerId: await userIdOf(db, demo.member),
        originalKey: 'x',
        displayKey: 'x',
        thumbKey: 'x',
        contentType: 'image/jpeg',
        byteSize: 1,
        width: 1,
        height: 1,
      })
      .$returningId();
    const cluster = async (layer: number, rank: number, share: number, hex: string) => {
      const [row] = await db
        .insert(swatches)
        .values({
          photoId: photo.id,
          couponId: coupon.id,
          layerId: coupon.layerIds[layer],
          rank,
          share,
          spread: 1,
          hex,
          labL: 50,
          labA: 0,
          labB: 0,
          oklabL: 0.5,
          oklabA: 0,
          oklabB: 0,
        })
        .$returningId();
      return row.id;
    };
    await cluster(0, 1, 0.3, '#6a5030');
    const steelDominant = await cluster(0, 0, 0.6, '#4a3a7a');
    const nickelDominant = await cluster(1, 0, 0.7, '#c9b07a');
    await cluster(1, 1, 0.2, '#a09070');

    const query = libraryPickQuery({ ...noLibraryFilters, pairA: 'steel-15n20', pairB: 'steel-1084', process: 'forge', tempMin: '286', tempMax: '288' });
    const response = await api(`/api/coupons?${query}`, { jar: jars.owner });
    expect(response.status).toBe(200);
    const body = (await response.json()) as { coupons: (LibraryCouponAnswer & { id: number })[] };
    const found = body.coupons.find((listed) => listed.id === coupon.id);
    expect(found?.dominantSwatches.map((swatch) => [swatch.position, swatch.swatchId, swatch.hex])).toEqual([
      [0, steelDominant, '#4a3a7a'],
      [1, nickelDominant, '#c9b07a'],
    ]);
    // Every coupon the filters found is of the pair, forged, at 286–288 °C.
    for (const listed of body.coupons as unknown as { process: string; temperatureC: number; layers: { alloy: string }[] }[]) {
      expect(listed.process).toBe('forge');
      expect(listed.layers.map((layer) => layer.alloy).sort()).toEqual([...layers].sort());
      expect(listed.temperatureC).toBeGreaterThanOrEqual(286);
      expect(listed.temperatureC).toBeLessThanOrEqual(288);
    }

    const picks = libraryPicks([found!]);
    expect(picks.map((pick) => pick.couponTitle)).toEqual([
      expect.stringContaining('1084 carbon steel (287 °C, 5 min)'),
      expect.stringContaining('15N20 nickel steel (287 °C, 5 min)'),
    ]);
    const id = await newSheet({ title: 'Pattern-welded temper', audience: 'public' });
    expect((await patch(id, { items: picks.map((pick) => swatchItem(pick.swatchId)) })).status).toBe(200);
    const saved = await read(id, jars.owner);
    expect(saved.entries.map((entry) => (entry.kind === 'swatch' ? entry.hex : entry.text))).toEqual(['#4a3a7a', '#c9b07a']);
  });

  it('a pair with one alloy chosen is refused, naming the missing one', async () => {
    const response = await api(`/api/coupons?${libraryPickQuery({ ...noLibraryFilters, pairA: 'steel-1084' })}`, { jar: jars.owner });
    expect(response.status).toBe(400);
    expect(((await response.json()) as { field: string }).field).toBe('pairB');
  });
});

describe('the predicted colour beside a swatch', () => {
  interface Predicted {
    kind: 'swatch';
    swatchId: number;
    prediction: { hex: string; name: string } | null;
  }

  /** What the heat planner tells a visitor for this heat in air: the reference data, no library fit. */
  async function plannerSays(alloy: string, temperatureC: number, holdMinutes: number) {
    const response = await api('/api/tint/predict', { json: { alloy, process: 'heat', temperatureC, holdMinutes, atmosphere: 'air' } });
    expect(response.status).toBe(200);
    const body = (await response.json()) as { outcome: string; colour: { hex: string; name: string } };
    expect(body.outcome).toBe('prediction');
    return body.colour;
  }

  it('uses each layer’s own alloy on a laminate, as the heat planner predicts it for that alloy and heat', async () => {
    // A titanium / 1084 laminate at 320 °C for 10 minutes: the steel sits in its temper range
    // (blue, common practice), the titanium barely tints at all — two clearly different answers.
    const layers = ['ti-grade-2', 'steel-1084'];
    const coupon = await insertCoupon(db, demo.instructor, layers, 'public');
    couponIds.push(coupon.id);
    await db.update(coupons).set({ temperatureC: 320, holdSeconds: 600, atmosphere: 'air' }).where(eq(coupons.id, coupon.id));
    const alloyRows = await db.select({ id: alloys.id, slug: alloys.slug }).from(alloys).where(inArray(alloys.slug, layers));
    const alloyId = (slug: string) => alloyRows.find((row) => row.slug === slug)!.id;
    const [photo] = await db
      .insert(photos)
      .values({
        couponId: coupon.id,
        ownerId: await userIdOf(db, demo.instructor),
        originalKey: 'x',
        displayKey: 'x',
        thumbKey: 'x',
        contentType: 'image/jpeg',
        byteSize: 1,
        width: 1,
        height: 1,
      })
      .$returningId();
    const swatchOf = async (layerId: number | null, slug: string | null, hex: string) => {
      const [row] = await db
        .insert(swatches)
        .values({
          photoId: photo.id,
          couponId: coupon.id,
          layerId,
          alloyId: slug ? alloyId(slug) : null,
          rank: 0,
          share: 0.9,
          spread: 1,
          hex,
          labL: 50,
          labA: 0,
          labB: 0,
          oklabL: 0.5,
          oklabA: 0,
          oklabB: 0,
        })
        .$returningId();
      return row.id;
    };
    const titanium = await swatchOf(coupon.layerIds[0], 'ti-grade-2', '#9a948a');
    const steel = await swatchOf(coupon.layerIds[1], 'steel-1084', '#3a4f8a');
    const wholePhoto = await swatchOf(null, null, '#6a6a6a');

    const id = await newSheet({ title: 'Laminate layers', audience: 'public', showPrediction: true });
    expect((await patch(id, { items: [titanium, steel, wholePhoto].map(swatchItem) })).status).toBe(200);
    const entries = (await read(id, jars.owner)).entries as unknown as Predicted[];
    const bySwatch = new Map(entries.map((entry) => [entry.swatchId, entry.prediction]));

    const [tiPlanned, steelPlanned] = await Promise.all([plannerSays('ti-grade-2', 320, 10), plannerSays('steel-1084', 320, 10)]);
    expect(tiPlanned.hex).not.toBe(steelPlanned.hex);
    expect(bySwatch.get(titanium)).toMatchObject({ hex: tiPlanned.hex, name: tiPlanned.name });
    expect(bySwatch.get(steel)).toMatchObject({ hex: steelPlanned.hex, name: steelPlanned.name });
    // A swatch of the whole photo names no layer: which alloy's band it should sit beside is unknown.
    expect(bySwatch.get(wholePhoto)).toBeNull();
  });

  it('gives none for a heat under argon, where the reference data (all heats in air) do not apply', async () => {
    const coupon = await couponWithSwatches(demo.instructor, 'public', ['#8c7a5a']);
    await db.update(coupons).set({ temperatureC: 320, holdSeconds: 600, atmosphere: 'argon' }).where(eq(coupons.id, coupon.couponId));
    const id = await newSheet({ title: 'Argon', audience: 'public', showPrediction: true });
    expect((await patch(id, { items: [swatchItem(coupon.swatchIds[0])] })).status).toBe(200);
    const [entry] = (await read(id, jars.owner)).entries as unknown as Predicted[];
    expect(entry.prediction).toBeNull();
  });
});

// ---- the PDF, read back with poppler-utils ----

const work = mkdtempSync(path.join(tmpdir(), 'oxbloom-sheet-pdf-'));
function pdfFile(bytes: Uint8Array): string {
  const file = path.join(work, `${Math.random().toString(36).slice(2)}.pdf`);
  writeFileSync(file, bytes);
  return file;
}
const pdfText = (bytes: Uint8Array) => execFileSync('pdftotext', [pdfFile(bytes), '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
function pdfInfo(bytes: Uint8Array) {
  const info = execFileSync('pdfinfo', [pdfFile(bytes)], { encoding: 'utf8' });
  const size = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(info)!;
  return { pages: Number(/Pages:\s+(\d+)/.exec(info)![1]), width: Number(size[1]), height: Number(size[2]) };
}

describe('the PDF', () => {
  // 40 distinct colours, written here: a 6-bit ramp over the three channels.
  const hexes = Array.from(
    { length: 40 },
    (_, i) => `#${[(i * 37) % 256, (i * 71 + 40) % 256, (i * 113 + 90) % 256].map((v) => v.toString(16).padStart(2, '0')).join('')}`,
  );
  let id: number;
  const fetchPdf = async (size: string) => {
    const response = await api(`/api/sheets/${id}/pdf?size=${size}`, { jar: jars.owner });
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('application/pdf');
    return new Uint8Array(await response.arrayBuffer());
  };

  beforeAll(async () => {
    const { swatchIds } = await couponWithSwatches(demo.instructor, 'public', hexes);
    id = await newSheet({ title: 'Forty swatches', intro: 'A short introduction.', audience: 'public' });
    expect((await patch(id, { items: swatchIds.map(swatchItem) })).status).toBe(200);
  }, 30_000);

  // Source: ISO 216 A4 = 210 × 297 mm = 595.28 × 841.89 pt (1 pt = 1/72 in = 25.4/72 mm), written as 595 × 842.
  // Per-page capacity, worked out here from the sheet's printed design (36 pt margins, 64 pt footer,
  // 150 pt title block on page 1, 160 × 118 pt cells with 12 pt gaps):
  //   columns: 3 cells need 3·160 + 2·12 = 504 ≤ 595 − 72 = 523 (4 would need 676).
  //   page 1: 842 − 36 − 64 − (36 + 150) = 556 pt high → 4 rows (4·118 + 3·12 = 508; 5 need 638) → 12.
  //   later pages: 842 − 72 − 64 = 706 → 5 rows (638; 6 need 768) → 15.
  //   40 swatches = 12 + 15 + 13 → 3 pages.
  it('A4 is 595 × 842 pt (ISO 216) and 40 swatches take 3 pages', async () => {
    expect(pdfInfo(await fetchPdf('a4'))).toEqual({ pages: 3, width: 595, height: 842 });
  });

  // Source: ANSI/ASME Y14.1 size A (US Letter) = 8.5 × 11 in = 612 × 792 pt.
  //   columns: 612 − 72 = 540 ≥ 504 → 3.   page 1: 792 − 100 − 186 = 506 → 3 rows (4 need 508) → 9.
  //   later pages: 792 − 136 = 656 → 5 rows → 15.   40 = 9 + 15 + 15 + 1 → 4 pages.
  it('Letter is 612 × 792 pt (ANSI/ASME Y14.1) and 40 swatches take 4 pages', async () => {
    expect(pdfInfo(await fetchPdf('letter'))).toEqual({ pages: 4, width: 612, height: 792 });
  });

  it('landscape swaps the sides', async () => {
    expect((await patch(id, { orientation: 'landscape' })).status).toBe(200);
    const info = pdfInfo(await fetchPdf('a4'));
    expect([info.width, info.height]).toEqual([842, 595]);
    expect((await patch(id, { orientation: 'portrait' })).status).toBe(200);
  });

  it('embeds every font, the app’s own typefaces', async () => {
    const listing = execFileSync('pdffonts', [pdfFile(await fetchPdf('a4'))], { encoding: 'utf8' })
      .trim()
      .split('\n')
      .slice(2);
    expect(listing.length).toBeGreaterThan(0);
    // pdffonts columns: name type encoding emb sub uni object ID; "emb" must be yes for each.
    for (const line of listing) expect(line).toMatch(/\s(yes)\s+(yes|no)\s+(yes|no)\s+\d+\s+\d+$/);
    expect(listing.join('\n')).toMatch(/IBMPlexSans/);
    expect(listing.join('\n')).toMatch(/SourceSerif4/);
  });

  it('prints every hex value, the safety caution and the colour note', async () => {
    const text = pdfText(await fetchPdf('a4'));
    for (const hex of hexes) expect(text).toContain(hex.toUpperCase());
    expect(text).toMatch(/class D extinguisher/);
    expect(text).toMatch(/Screen and print colours differ from the metal/);
  });

  it('refuses an unknown size, naming it', async () => {
    const response = await api(`/api/sheets/${id}/pdf?size=a3`, { jar: jars.owner });
    expect(response.status).toBe(400);
    expect(((await response.json()) as { field: string }).field).toBe('size');
  });
});
