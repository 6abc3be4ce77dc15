import { describe, expect, it } from 'vitest';
import { mayChange, maySee, type Viewer } from '~/lib/server/visibility';
import { everyVisibility, whoSeesWhat } from '../support/who-sees-what';

// The SQL form of the same rule (visibleCoupons) runs against MariaDB in tests/integration/visibility.test.ts.
const OWNER = 'owner-of-the-coupon';
const viewerOf = (row: (typeof whoSeesWhat)[number]): Viewer | null =>
  row.role ? { id: row.owns ? OWNER : `someone-else-${row.role}`, role: row.role } : null;

describe('who may see a coupon (maySee)', () => {
  // Source: the hand-written table in tests/support/who-sees-what.ts (the product's roles).
  it.each(whoSeesWhat.flatMap((row) => everyVisibility.map((visibility) => ({ ...row, visibility, expected: row.sees[visibility] }))))(
    '$viewer, a $visibility coupon → $expected',
    ({ visibility, expected, ...row }) => {
      expect(maySee(viewerOf(row), { ownerId: OWNER, visibility })).toBe(expected);
    },
  );
});

describe('who may change a coupon (mayChange)', () => {
  it.each(whoSeesWhat.flatMap((row) => everyVisibility.map((visibility) => ({ ...row, visibility }))))(
    '$viewer, a $visibility coupon → $mayChange',
    ({ visibility, ...row }) => {
      expect(mayChange(viewerOf(row), { ownerId: OWNER })).toBe(row.mayChange);
      // Whoever may change a coupon may see it: a route never answers 403 for what it would hide.
      if (mayChange(viewerOf(row), { ownerId: OWNER })) expect(maySee(viewerOf(row), { ownerId: OWNER, visibility })).toBe(true);
    },
  );
});
