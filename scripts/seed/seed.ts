// Seeds the alloy catalogue (every run, by slug) and the invented demo: people, coupons, the test
// series and their photos (first run only, unless OXBLOOM_DEMO=0). Run with DATABASE_URL set;
// `npm start` and `npm test` do it for you.
import { hash } from '@node-rs/argon2';
import { eq, inArray, sql } from 'drizzle-orm';
import { createDatabase, type Database } from '../../db/client';
import { alloys, appSettings, couponLayers, coupons, users } from '../../db/schema';
import { alloyCatalogue, layerKeyOf } from '~/lib/alloys';
import { demoPassword, demoPeople } from './people';
import { demoCoupons } from './coupons';
import { seedDemoPhotos } from './photos';
import { seriesCoupons } from './series';
import { seedDemoClass } from './classes';
import { seedDemoSheet } from './sheets';

const DEMO_MARKER = 'demo-seeded';
const PHOTOS_MARKER = 'demo-photos-seeded';
const SHEET_MARKER = 'demo-sheet-seeded';

/** Everyone in the demo but the admin owns coupons. */
const demoOwners = () => demoPeople.filter((person) => person.role !== 'admin').map((person) => person.email);

async function seedAlloys(db: Database) {
  for (const alloy of alloyCatalogue) {
    await db
      .insert(alloys)
      .values(alloy)
      .onDuplicateKeyUpdate({ set: { name: alloy.name, family: alloy.family, uns: alloy.uns } });
  }
}

/** People and coupons, with the marker, in one transaction: all of the demo or none of it. */
async function seedDemoRecords(db: Database) {
  const passwordHash = await hash(demoPassword);
  const alloyRows = await db.select({ id: alloys.id, slug: alloys.slug }).from(alloys);
  const alloyIdBySlug = new Map(alloyRows.map((alloy) => [alloy.slug, alloy.id]));
  await db.transaction(async (tx) => {
    for (const person of demoPeople) {
      await tx
        .insert(users)
        .values({ ...person, passwordHash, emailVerified: new Date() })
        .onDuplicateKeyUpdate({ set: { role: person.role } });
    }
    const people = await tx
      .select({ id: users.id, email: users.email })
      .from(users)
      .where(
        inArray(
          users.email,
          demoPeople.map((person) => person.email),
        ),
      );
    const idByEmail = new Map(people.map((person) => [person.email, person.id]));
    const owners = demoOwners();
    const series = seriesCoupons(owners);
    for (const demo of [...demoCoupons(owners), ...series]) {
      const [{ id }] = await tx
        .insert(coupons)
        .values({ ...demo.coupon, ownerId: idByEmail.get(demo.ownerEmail)!, layerKey: layerKeyOf(demo.layers) })
        .$returningId();
      await tx.insert(couponLayers).values(demo.layers.map((slug, position) => ({ couponId: id, position, alloyId: alloyIdBySlug.get(slug)! })));
    }
    await seedDemoClass(tx, idByEmail, new Set(series.map((demo) => demo.coupon.title)));
    await tx.insert(appSettings).values({ key: DEMO_MARKER, value: new Date().toISOString() });
  });
}

const hasMarker = async (db: Database, key: string) => (await db.select().from(appSettings).where(eq(appSettings.key, key))).length > 0;

async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set.');
  const { db, pool } = createDatabase(url, 2);
  try {
    await seedAlloys(db);
    if (!(await hasMarker(db, DEMO_MARKER))) {
      if (process.env.OXBLOOM_DEMO === '0') return console.log('[oxbloom] OXBLOOM_DEMO=0: no demo data.');
      await seedDemoRecords(db);
      const [{ count }] = await db.select({ count: sql<number>`count(*)` }).from(coupons);
      console.log(`[oxbloom] seeded the demo: ${demoPeople.length} people, ${count} coupons.`);
    }
    // Photos need storage too; a start that stopped half-way finishes them next time.
    if (!(await hasMarker(db, PHOTOS_MARKER))) {
      const seriesTitles = new Set(seriesCoupons(demoOwners()).map((demo) => demo.coupon.title));
      console.log(`[oxbloom] demo photos: ${await seedDemoPhotos(db, seriesTitles)} stored and measured.`);
      await db.insert(appSettings).values({ key: PHOTOS_MARKER, value: new Date().toISOString() });
    } else {
      console.log('[oxbloom] demo already seeded; kept as it is.');
    }
    // The instructor's colour sheet places measured swatches, so it follows the photos.
    if (!(await hasMarker(db, SHEET_MARKER))) {
      const sheetId = await seedDemoSheet(db);
      if (sheetId !== null) console.log(`[oxbloom] demo colour sheet ${sheetId} published to the demo class.`);
      await db.insert(appSettings).values({ key: SHEET_MARKER, value: new Date().toISOString() });
    }
  } finally {
    await pool.end();
  }
}

main().catch((error) => {
  console.error(String(error.message).split('\n')[0]);
  process.exit(1);
});
