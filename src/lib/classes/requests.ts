import { z } from 'zod';
import { emailSchema } from '~/lib/email-address';
import { plainText } from '~/lib/text';

/** What the class routes and forms accept. */

export const CLASS_NAME_MAX = 160;
export const CLASS_TERM_MAX = 80;
export const CLASS_DESCRIPTION_MAX = 2000;
/** Addresses one invitation request may name. */
export const INVITES_PER_REQUEST = 40;

/** An optional text: blank becomes null. */
const optionalText = (max: number, lines: 'single' | 'multi', what: string) =>
  z
    .string({ error: `${what} must be text.` })
    .trim()
    .max(max, { error: `Use at most ${max} characters.` })
    .check(plainText(lines))
    .transform((value) => (value === '' ? null : value))
    .nullable()
    .optional()
    .transform((value) => value ?? null);

export const classNameSchema = z
  .string({ error: 'Give the class a name.' })
  .trim()
  .min(1, { error: 'Give the class a name.' })
  .max(CLASS_NAME_MAX, { error: `Use at most ${CLASS_NAME_MAX} characters.` })
  .check(plainText());

export const classInputSchema = z.object({
  name: classNameSchema,
  term: optionalText(CLASS_TERM_MAX, 'single', 'The term'),
  description: optionalText(CLASS_DESCRIPTION_MAX, 'multi', 'The description'),
});
export type ClassInput = z.infer<typeof classInputSchema>;

/** A change: any of the fields; at least one. */
export const classPatchSchema = z
  .object({
    name: classNameSchema.optional(),
    term: optionalText(CLASS_TERM_MAX, 'single', 'The term'),
    description: optionalText(CLASS_DESCRIPTION_MAX, 'multi', 'The description'),
  })
  .strict();

/** Splits what someone typed or pasted (commas, semicolons, spaces or lines between addresses). */
export function splitAddresses(value: string): string[] {
  return value.split(/[\s,;]+/u).filter((part) => part !== '');
}

/**
 * Addresses to invite: a list (JSON) or one text with several (a form's text area). Each goes
 * through the one e-mail rule; the first refused one is named. Repeats are dropped.
 */
export const inviteSchema = z.object({
  emails: z
    .union([z.string().max(INVITES_PER_REQUEST * 260), z.array(z.string().max(300)).max(INVITES_PER_REQUEST)], {
      error: 'List the e-mail addresses to invite.',
    })
    .transform((value, context) => {
      const raw = typeof value === 'string' ? splitAddresses(value) : value;
      if (raw.length === 0) {
        context.addIssue({ code: 'custom', message: 'List at least one e-mail address.' });
        return z.NEVER;
      }
      if (raw.length > INVITES_PER_REQUEST) {
        context.addIssue({ code: 'custom', message: `Invite at most ${INVITES_PER_REQUEST} people at once.` });
        return z.NEVER;
      }
      const addresses: string[] = [];
      for (const entry of raw) {
        const parsed = emailSchema.safeParse(entry);
        if (!parsed.success) {
          context.addIssue({ code: 'custom', message: `“${entry.slice(0, 80)}”: ${parsed.error.issues[0]?.message ?? 'not an address we accept.'}` });
          return z.NEVER;
        }
        if (!addresses.includes(parsed.data)) addresses.push(parsed.data);
      }
      return addresses;
    }),
});

/** Masks an address for someone who may not be its owner: the first letter of each part. */
export function maskEmail(email: string): string {
  const at = email.lastIndexOf('@');
  if (at < 1) return '•••';
  const local = email.slice(0, at);
  const domain = email.slice(at + 1);
  const dot = domain.lastIndexOf('.');
  const host = dot > 0 ? domain.slice(0, dot) : domain;
  const tld = dot > 0 ? domain.slice(dot) : '';
  return `${local[0]}${'•'.repeat(Math.max(2, Math.min(local.length - 1, 6)))}@${host[0]}${'•'.repeat(Math.max(2, Math.min(host.length - 1, 6)))}${tld}`;
}
