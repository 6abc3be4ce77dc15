import type { RoleName } from '~/lib/account';
import type { Visibility } from '~/lib/coupons';

/**
 * Who may see and who may change a coupon, written out by hand for every kind of viewer.
 * Source: the product's roles (BRIEF.md, "Who uses it": a visitor reads the public library; a
 * member chooses each coupon's visibility, private / members / public — "Only me", "Members",
 * "Everyone" on the coupon form; an instructor can do all a member can; an admin moderates), and
 * the answers tests/integration/authorisation-matrix.test.ts pins over HTTP (an admin opens and
 * changes a member's private coupon; an instructor gets a 404 for it and a 403 for changing a
 * members-only one).
 */
export interface WhoSeesWhat {
  viewer: string;
  /** null: signed out. */
  role: RoleName | null;
  /** Whether the viewer owns the coupon. */
  owns: boolean;
  sees: Record<Visibility, boolean>;
  mayChange: boolean;
}

export const whoSeesWhat: WhoSeesWhat[] = [
  { viewer: 'a visitor', role: null, owns: false, sees: { private: false, members: false, public: true }, mayChange: false },
  { viewer: 'the owner, a member', role: 'member', owns: true, sees: { private: true, members: true, public: true }, mayChange: true },
  { viewer: 'another member', role: 'member', owns: false, sees: { private: false, members: true, public: true }, mayChange: false },
  { viewer: 'an instructor', role: 'instructor', owns: false, sees: { private: false, members: true, public: true }, mayChange: false },
  { viewer: 'the owner, an instructor', role: 'instructor', owns: true, sees: { private: true, members: true, public: true }, mayChange: true },
  { viewer: 'an admin', role: 'admin', owns: false, sees: { private: true, members: true, public: true }, mayChange: true },
  { viewer: 'the owner, an admin', role: 'admin', owns: true, sees: { private: true, members: true, public: true }, mayChange: true },
];

export const everyVisibility: Visibility[] = ['private', 'members', 'public'];
