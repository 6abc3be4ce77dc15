import type { APIContext } from 'astro';
import { hasRole, type RoleName } from '../account';
import { problem } from './http';
import { findUserById, type UserRecord } from './users';

export interface SessionUser {
  id: string;
  name: string | null;
  email: string;
  role: RoleName;
}

type Context = Pick<APIContext, 'locals'>;
type Guarded<T> = T | Response;

export const isResponse = (value: unknown): value is Response => value instanceof Response;

export const unauthenticated = () => problem(401, 'Sign in first.');
export const forbidden = () => problem(403, 'You may not do that.');
export const notFound = (what = 'That') => problem(404, `${what} was not found.`);

/**
 * The signed-in person as the database has them now, or a 401 (signed out, or the account is
 * gone). Use for anything that changes data.
 */
export async function requireCurrentUser(context: Context): Promise<Guarded<UserRecord>> {
  const sessionUser = context.locals.user;
  if (!sessionUser) return unauthenticated();
  return (await findUserById(sessionUser.id)) ?? unauthenticated();
}

/** Like requireCurrentUser, and a 403 unless the role (re-read from the database) is at least `role`. */
export async function requireRole(context: Context, role: RoleName): Promise<Guarded<UserRecord>> {
  const user = await requireCurrentUser(context);
  if (isResponse(user)) return user;
  return hasRole(user.role, role) ? user : forbidden();
}

export interface Owned {
  ownerId: string | null;
  visibility?: 'private' | 'members' | 'public';
}

/** Who may see an object: its owner, an admin, and anyone its visibility lets in. */
export function canSee(user: Pick<SessionUser, 'id' | 'role'> | null, object: Owned): boolean {
  if (object.visibility === 'public') return true;
  if (!user) return false;
  if (user.role === 'admin' || object.ownerId === user.id) return true;
  return object.visibility === 'members';
}

/** Who may change an object: its owner or an admin. */
export function canChange(user: Pick<SessionUser, 'id' | 'role'>, object: Owned): boolean {
  return user.role === 'admin' || object.ownerId === user.id;
}

/**
 * The ownership check every route uses: 404 when the object doesn't exist or may not be seen
 * (so existence doesn't leak), 403 when it may be seen but not changed.
 */
export function checkAccess(user: Pick<SessionUser, 'id' | 'role'> | null, object: Owned | undefined, action: 'see' | 'change', what = 'That'): Response | null {
  if (!object || !canSee(user, object)) return notFound(what);
  if (action === 'change' && (!user || !canChange(user, object))) return user ? forbidden() : unauthenticated();
  return null;
}
