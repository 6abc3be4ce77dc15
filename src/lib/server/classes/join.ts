import type { Limited } from '../accounts';
import { limits } from '../limits';
import { hashPassword } from '../passwords';
import { hitAll } from '../rate-limit';
import { createUser, findUserByEmail, findUserById, markEmailVerified, type UserRecord } from '../users';
import { acceptInvitation, lookUpInvitation, type Acceptance } from './invitations';

export type JoinBySignUp = Limited<
  { status: 'joined'; classId: number; user: UserRecord } | { status: 'has-account' } | { status: Exclude<Acceptance['status'], 'joined'> }
>;

/**
 * Makes an account from an invitation and joins the class with it. The invitation's own address
 * is the account's (not one typed on the page), and following the e-mailed link has proved it, so
 * the account starts confirmed. An address that has an account already signs in instead.
 */
export async function signUpFromInvitation(token: string, input: { name: string; password: string }, address: string): Promise<JoinBySignUp> {
  const found = await lookUpInvitation(token);
  if (found.state !== 'open' || !found.invitation) return { status: found.state === 'open' ? 'unknown' : found.state };
  const email = found.invitation.email;
  const allowed = await hitAll([
    [limits.signUpPerAddress, address],
    [limits.signUpPerEmail, email],
  ]);
  if (!allowed.allowed) return { status: 'limited', retryAfterSeconds: allowed.retryAfterSeconds };
  if (await findUserByEmail(email)) return { status: 'has-account' };
  let id: string;
  try {
    id = await createUser({ name: input.name, email, passwordHash: await hashPassword(input.password) });
  } catch (error) {
    // Two sign-ups from one invitation at once: the second finds the account made.
    if ((error as { code?: string }).code === 'ER_DUP_ENTRY') return { status: 'has-account' };
    throw error;
  }
  await markEmailVerified(id);
  const user = (await findUserById(id))!;
  const accepted = await acceptInvitation(token, user);
  if (accepted.status !== 'joined') return accepted.status === 'wrong-account' ? { status: 'unknown' } : { status: accepted.status };
  return { status: 'joined', classId: accepted.classId, user };
}
