import { config } from './config';
import type { Limit } from './rate-limit';

const minutes = (count: number) => count * 60;
const perAddress = (fallback: number) => config().OXBLOOM_LIMIT_PER_ADDRESS ?? fallback;

/** How often each account action may be tried, per e-mail address and per client address. */
export const limits = {
  signInPerEmail: { name: 'sign-in:email', max: 5, windowSeconds: minutes(15) },
  signInPerAddress: { name: 'sign-in:address', max: perAddress(30), windowSeconds: minutes(15) },
  signUpPerEmail: { name: 'sign-up:email', max: 3, windowSeconds: minutes(60) },
  signUpPerAddress: { name: 'sign-up:address', max: perAddress(10), windowSeconds: minutes(60) },
  resetPerEmail: { name: 'reset:email', max: 3, windowSeconds: minutes(60) },
  resetPerAddress: { name: 'reset:address', max: perAddress(10), windowSeconds: minutes(60) },
  /** Wrong current passwords on the password-change form, per account. */
  passwordChangePerAccount: { name: 'password-change:account', max: 5, windowSeconds: minutes(15) },
  /** Class invitation mails sent by one instructor, and received by one address (sends and resends alike). */
  invitationsPerInviter: { name: 'invite:inviter', max: 200, windowSeconds: minutes(60) },
  invitationsPerEmail: { name: 'invite:email', max: 5, windowSeconds: minutes(60) },
} satisfies Record<string, Limit>;
