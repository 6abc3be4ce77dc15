import { z } from 'zod';

/**
 * E-mail addresses are identities: every route that finds an account by address (password
 * sign-in, sign-in link, sign-up, forgotten password, invitations) goes through this one rule and
 * then compares exactly (the database column has a binary collation). The rule: trim, allow only
 * printable ASCII, lower-case, and accept one plain `local@domain` address. Anything a case- or
 * accent-folding comparison could confuse with another address (accents, full-width or other
 * look-alike letters, invisible characters) is refused, not folded: folding it would let a
 * look-alike mailbox stand in for an account's own.
 */
export const EMAIL_MAX_LENGTH = 255;

/** Checked before lower-casing, so a character that lower-cases to ASCII (the Kelvin sign → k) can't slip through. */
const PRINTABLE_ASCII = /^[\x21-\x7e]*$/;

export const emailSchema = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .regex(PRINTABLE_ASCII, { error: "Use only the letters a–z, digits and . _ + - ' in an e-mail address." })
  .toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }).max(EMAIL_MAX_LENGTH, { error: 'That e-mail address is too long.' }));

/** The address in the one form the app stores and compares, or undefined when the app refuses it. */
export function normaliseEmail(value: unknown): string | undefined {
  const result = emailSchema.safeParse(value);
  return result.success ? result.data : undefined;
}
