import { asc, eq, sql } from 'drizzle-orm';
import { users } from '../../../db/schema';
import { normaliseEmail, type RoleName } from '~/lib/account';
import { db } from './db';
import { alloysOfOwner, bumpLibraryVersions } from './library-versions';

export interface UserRecord {
  id: string;
  name: string | null;
  email: string;
  role: RoleName;
  emailVerified: Date | null;
  createdAt: Date;
}

const publicColumns = {
  id: users.id,
  name: users.name,
  email: users.email,
  role: users.role,
  emailVerified: users.emailVerified,
  createdAt: users.createdAt,
};

export async function findUserById(id: string): Promise<UserRecord | undefined> {
  const [user] = await db().select(publicColumns).from(users).where(eq(users.id, id));
  return user;
}

/** The account whose stored address is exactly this one once normalised; none for an address the app refuses. */
export async function findUserByEmail(email: string): Promise<UserRecord | undefined> {
  const normalised = normaliseEmail(email);
  if (!normalised) return undefined;
  const [user] = await db().select(publicColumns).from(users).where(eq(users.email, normalised));
  return user;
}

/** The stored hash, for sign-in and password changes only; never leaves the server. */
export async function passwordHashOf(id: string): Promise<string | null> {
  const [row] = await db().select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, id));
  return row?.passwordHash ?? null;
}

export async function createUser(input: { name: string; email: string; passwordHash: string }): Promise<string> {
  const email = normaliseEmail(input.email);
  if (!email) throw new Error('createUser: the address was not validated.');
  const id = crypto.randomUUID();
  await db().insert(users).values({ id, name: input.name, email, passwordHash: input.passwordHash });
  return id;
}

export async function markEmailVerified(id: string): Promise<void> {
  await db()
    .update(users)
    .set({ emailVerified: sql`COALESCE(${users.emailVerified}, UTC_TIMESTAMP(3))` })
    .where(eq(users.id, id));
}

/** A new display name; the library shows it beside the person's public coupons, so their alloys' versions go up. */
export async function updateName(id: string, name: string): Promise<void> {
  await db().transaction(async (tx) => {
    await tx.update(users).set({ name }).where(eq(users.id, id));
    await bumpLibraryVersions(tx, await alloysOfOwner(tx, id));
  });
}

export async function updatePasswordHash(id: string, passwordHash: string): Promise<void> {
  await db().update(users).set({ passwordHash }).where(eq(users.id, id));
}

export async function listUsers(): Promise<UserRecord[]> {
  return db().select(publicColumns).from(users).orderBy(asc(users.email));
}

export type RoleChange = 'changed' | 'not-found' | 'last-admin';

/**
 * Changes a role, refusing to demote the last admin. The check and the update run in one
 * transaction with the admin rows locked, so two demotions at once can't both pass.
 */
export async function changeRole(id: string, role: RoleName): Promise<RoleChange> {
  return db().transaction(async (tx) => {
    const admins = await tx.select({ id: users.id }).from(users).where(eq(users.role, 'admin')).for('update');
    const [target] = await tx.select({ role: users.role }).from(users).where(eq(users.id, id)).for('update');
    if (!target) return 'not-found';
    if (target.role === 'admin' && role !== 'admin' && admins.length <= 1) return 'last-admin';
    await tx.update(users).set({ role }).where(eq(users.id, id));
    return 'changed';
  });
}
