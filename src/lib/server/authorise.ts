import type { APIContext } from 'astro';
import { hasRole, type RoleName } from '~/lib/account';
import { problem } from './http';
import { findUserById, type UserRecord } from './users';
import { mayChange, maySee, type CouponAccess, type Viewer } from './visibility';

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

/**
 * The ownership check every route uses, by the rule in visibility.ts: 404 when the coupon (of a
 * photo) doesn't exist or may not be seen (so existence doesn't leak), 403 when it may be seen but
 * not changed, 401 for a visitor who would have to sign in to change it.
 */
export function checkAccess(user: Viewer | null, coupon: CouponAccess | undefined, action: 'see' | 'change', what = 'That'): Response | null {
  if (!coupon || !maySee(user, coupon)) return notFound(what);
  if (action === 'change' && !mayChange(user, coupon)) return user ? forbidden() : unauthenticated();
  return null;
}
