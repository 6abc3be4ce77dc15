import { afterAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { verify } from '@node-rs/argon2';
import { eq, inArray, lt, sql } from 'drizzle-orm';
import { testDatabase } from '../support/database';
import { alloys, appSettings, couponLayers, coupons, users } from '../../db/schema';
import { demoPassword, demoPeople } from '../../scripts/seed/people';
import { alloyCatalogue } from '~/lib/alloys';

const { db, pool } = testDatabase();
afterAll(() => pool.end());

const countOf = async (table: typeof coupons | typeof users | typeof alloys | typeof couponLayers) =>
  Number((await db.select({ count: sql<number>`count(*)` }).from(table))[0].count);

describe('the demo seed', () => {
  it('has the whole alloy catalogue', async () => {
    const rows = await db.select({ slug: alloys.slug }).from(alloys);
    expect(rows.map((row) => row.slug).sort()).toEqual(alloyCatalogue.map((alloy) => alloy.slug).sort());
  });

  it('has the four named demo accounts with their roles and the demo password', async () => {
    for (const email of ['member@oxbloom.test', 'member2@oxbloom.test', 'instructor@oxbloom.test', 'admin@oxbloom.test']) {
      const [user] = await db.select().from(users).where(eq(users.email, email));
      expect(user, email).toBeDefined();
      expect(user.role).toBe(demoPeople.find((person) => person.email === email)!.role);
      expect(await verify(user.passwordHash!, demoPassword)).toBe(true);
    }
  });

  it('has about two hundred and fifty coupons (the general demo and its test series), every one with at least one layer', async () => {
    // Other tests add coupons while this runs; the demo's are dated before the seed's marker.
    const [marker] = await db.select().from(appSettings).where(eq(appSettings.key, 'demo-seeded'));
    const [{ seeded }] = await db
      .select({ seeded: sql<number>`count(*)` })
      .from(coupons)
      .where(lt(coupons.createdAt, marker.createdAt));
    // Enough to browse, few enough that the seed stays quick.
    expect(Number(seeded)).toBeGreaterThanOrEqual(200);
    expect(Number(seeded)).toBeLessThanOrEqual(300);
    const [{ bare }] = await db
      .select({ bare: sql<number>`count(*)` })
      .from(coupons)
      .where(sql`not exists (select 1 from ${couponLayers} where ${couponLayers.couponId} = ${coupons.id})`);
    expect(Number(bare)).toBe(0);
  });

  it('gives each demo member coupons in every visibility', async () => {
    const rows = await db
      .select({ email: users.email, visibility: coupons.visibility, count: sql<number>`count(*)` })
      .from(coupons)
      .innerJoin(users, eq(users.id, coupons.ownerId))
      .groupBy(users.email, coupons.visibility);
    for (const email of ['member@oxbloom.test', 'member2@oxbloom.test']) {
      const visibilities = rows
        .filter((row) => row.email === email)
        .map((row) => row.visibility)
        .sort();
      expect(visibilities, email).toEqual(['members', 'private', 'public']);
    }
  });

  it('runs again without duplicating or losing anything', async () => {
    // Counted so that what other tests add meanwhile doesn't count: the demo's own rows.
    const [marker] = await db.select().from(appSettings).where(eq(appSettings.key, 'demo-seeded'));
    const demoRows = async () => ({
      coupons: Number(
        (
          await db
            .select({ count: sql<number>`count(*)` })
            .from(coupons)
            .where(lt(coupons.createdAt, marker.createdAt))
        )[0].count,
      ),
      people: Number(
        (
          await db
            .select({ count: sql<number>`count(*)` })
            .from(users)
            .where(
              inArray(
                users.email,
                demoPeople.map((person) => person.email),
              ),
            )
        )[0].count,
      ),
      alloys: await countOf(alloys),
    });
    const before = await demoRows();
    const run = spawnSync(process.execPath, ['node_modules/tsx/dist/cli.mjs', 'scripts/seed/seed.ts'], { encoding: 'utf8', env: process.env });
    expect(run.status, run.stderr).toBe(0);
    expect(run.stdout).toContain('demo already seeded');
    expect(await demoRows()).toEqual(before);
  });
});
