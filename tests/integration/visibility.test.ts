import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, inArray } from 'drizzle-orm';
import { coupons, users } from '../../db/schema';
import type { Visibility } from '~/lib/coupons';
import { maySee, visibleCoupons, type Viewer } from '~/lib/server/visibility';
import { demo } from '../support/auth';
import { testDatabase } from '../support/database';
import { everyVisibility, whoSeesWhat, type WhoSeesWhat } from '../support/who-sees-what';

/**
 * The SQL form of the visibility rule (visibleCoupons, what lists and the library fit filter by)
 * run on MariaDB, against the hand-written table and the rule for a coupon in hand (maySee).
 * The coupons live in a transaction that is rolled back, so no other test ever sees them.
 */

const { db, pool } = testDatabase();
afterAll(() => pool.end());

/** Owners (existing demo accounts, for the foreign key); viewers need no row of their own. */
const owners = {} as Record<'member' | 'instructor' | 'admin', string>;
beforeAll(async () => {
  const rows = await db
    .select({ id: users.id, email: users.email })
    .from(users)
    .where(inArray(users.email, [demo.member, demo.instructor, demo.admin]));
  const idOf = (email: string) => rows.find((row) => row.email === email)!.id;
  Object.assign(owners, { member: idOf(demo.member), instructor: idOf(demo.instructor), admin: idOf(demo.admin) });
});

/** The coupon's owner: the viewer when they own it, else the demo member. */
const ownerFor = (row: WhoSeesWhat) => (row.owns && row.role ? owners[row.role === 'member' ? 'member' : row.role] : owners.member);
const viewerFor = (row: WhoSeesWhat): Viewer | null => (row.role ? { id: row.owns ? ownerFor(row) : `another-${row.role}`, role: row.role } : null);

class RollBack extends Error {}

/** For each row of the table, the visibilities of that row's coupons that visibleCoupons lets through. */
async function seenBySql(): Promise<Map<WhoSeesWhat, Set<Visibility>>> {
  const seen = new Map<WhoSeesWhat, Set<Visibility>>();
  await db
    .transaction(async (tx) => {
      for (const row of whoSeesWhat) {
        const ownerId = ownerFor(row);
        const ids: number[] = [];
        for (const visibility of everyVisibility) {
          const [{ id }] = await tx
            .insert(coupons)
            .values({
              ownerId,
              title: `Visibility check, ${visibility}`,
              layerKey: 'ti-grade-2',
              surfacePrep: 'ground',
              process: 'oven',
              temperatureC: 500,
              holdSeconds: 600,
              visibility,
            })
            .$returningId();
          ids.push(id);
        }
        const rows = await tx
          .select({ visibility: coupons.visibility })
          .from(coupons)
          .where(and(inArray(coupons.id, ids), visibleCoupons(viewerFor(row))));
        seen.set(row, new Set(rows.map((found) => found.visibility)));
      }
      throw new RollBack();
    })
    .catch((error: unknown) => {
      if (!(error instanceof RollBack)) throw error;
    });
  return seen;
}

describe('visibleCoupons on MariaDB', () => {
  let seen: Map<WhoSeesWhat, Set<Visibility>>;
  beforeAll(async () => {
    seen = await seenBySql();
  });

  // Source: the hand-written table in tests/support/who-sees-what.ts.
  it.each(whoSeesWhat.flatMap((row) => everyVisibility.map((visibility) => ({ row, visibility }))))(
    '$row.viewer, a $visibility coupon: the SQL, the table and maySee agree',
    ({ row, visibility }) => {
      const bySql = seen.get(row)!.has(visibility);
      expect(bySql).toBe(row.sees[visibility]);
      expect(bySql).toBe(maySee(viewerFor(row), { ownerId: ownerFor(row), visibility }));
    },
  );

  it('left nothing behind', async () => {
    const left = await db
      .select({ id: coupons.id })
      .from(coupons)
      .where(
        inArray(
          coupons.title,
          everyVisibility.map((visibility) => `Visibility check, ${visibility}`),
        ),
      );
    expect(left).toEqual([]);
  });
});
