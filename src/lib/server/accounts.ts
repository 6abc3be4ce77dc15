import type { SignUpInput } from '~/lib/account';
import { sendAlreadyRegisteredMail, sendNoAccountMail, sendResetMail, sendVerificationMail } from './account-mail';
import { config } from './config';
import { limits } from './limits';
import { hashPassword, verifyPassword } from './passwords';
import { hit, hitAll, refund, type LimitResult } from './rate-limit';
import { closeAllSessions } from './session';
import { consumeToken, issueToken, voidTokens, type TokenCheck } from './tokens';
import { createUser, findUserByEmail, findUserById, markEmailVerified, passwordHashOf, updatePasswordHash, type UserRecord } from './users';

const link = (path: string, token?: string) => {
  const url = new URL(path, config().APP_URL);
  if (token) url.searchParams.set('token', token);
  return url.toString();
};

export type Limited<T> = T | { status: 'limited'; retryAfterSeconds: number };
const limited = (result: LimitResult) => (result.allowed ? null : { status: 'limited' as const, retryAfterSeconds: result.retryAfterSeconds });

/**
 * Signs someone up. The answer is the same whether or not the address already has an account
 * (no enumeration); the address's owner is told by e-mail either way.
 */
export async function signUp(input: SignUpInput, address: string): Promise<Limited<{ status: 'sent' }>> {
  const stop = limited(
    await hitAll([
      [limits.signUpPerAddress, address],
      [limits.signUpPerEmail, input.email],
    ]),
  );
  if (stop) return stop;
  const existing = await findUserByEmail(input.email);
  if (existing) {
    await sendAlreadyRegisteredMail(existing.email, link('/sign-in'), link('/forgot-password'));
    return { status: 'sent' };
  }
  let id: string;
  try {
    id = await createUser({ name: input.name, email: input.email, passwordHash: await hashPassword(input.password) });
  } catch (error) {
    // Two sign-ups for one address at once: the loser is treated like an existing account.
    if ((error as { code?: string }).code === 'ER_DUP_ENTRY') return { status: 'sent' };
    throw error;
  }
  await sendVerificationMail(input.email, input.name, link('/confirm-email', await issueToken(id, 'verify-email')));
  return { status: 'sent' };
}

export type EmailConfirmation = { status: 'confirmed'; user: UserRecord } | { status: Exclude<TokenCheck['status'], 'valid'> };

export async function confirmEmail(token: string): Promise<EmailConfirmation> {
  const check = await consumeToken(token, 'verify-email');
  if (check.status !== 'valid') return { status: check.status };
  await markEmailVerified(check.userId);
  const user = await findUserById(check.userId);
  return user ? { status: 'confirmed', user } : { status: 'unknown' };
}

/** Always the same answer; a reset link goes only to an address that has an account. */
export async function requestPasswordReset(email: string, address: string): Promise<Limited<{ status: 'sent' }>> {
  const stop = limited(
    await hitAll([
      [limits.resetPerAddress, address],
      [limits.resetPerEmail, email],
    ]),
  );
  if (stop) return stop;
  const user = await findUserByEmail(email);
  if (user) await sendResetMail(user.email, link('/reset-password', await issueToken(user.id, 'reset-password')));
  else await sendNoAccountMail(email, link('/sign-up'));
  return { status: 'sent' };
}

export type PasswordReset = { status: 'reset'; user: UserRecord } | { status: Exclude<TokenCheck['status'], 'valid'> };

/**
 * Sets a new password from a reset link; following the link also proves the address. Every
 * session of the account ends (whoever took it over is out); the route signs in the browser that
 * reset it with a new session.
 */
export async function resetPassword(token: string, password: string): Promise<PasswordReset> {
  const check = await consumeToken(token, 'reset-password');
  if (check.status !== 'valid') return { status: check.status };
  await updatePasswordHash(check.userId, await hashPassword(password));
  await closeAllSessions(check.userId);
  await markEmailVerified(check.userId);
  await voidTokens(check.userId, 'reset-password');
  const user = await findUserById(check.userId);
  return user ? { status: 'reset', user } : { status: 'unknown' };
}

export type PasswordChange = Limited<{ status: 'changed' | 'wrong-password' }>;

/**
 * Changes the password given the current one. Wrong current passwords are counted per account
 * (a right one takes its try back), so a stolen session can't guess its way to the password.
 * Every session of the account ends; the caller signs the changing browser in again.
 */
export async function changePassword(userId: string, currentPassword: string, newPassword: string): Promise<PasswordChange> {
  const stop = limited(await hit(limits.passwordChangePerAccount, userId));
  if (stop) return stop;
  if (!(await verifyPassword(await passwordHashOf(userId), currentPassword))) return { status: 'wrong-password' };
  await refund(limits.passwordChangePerAccount, userId);
  await updatePasswordHash(userId, await hashPassword(newPassword));
  await closeAllSessions(userId);
  return { status: 'changed' };
}
