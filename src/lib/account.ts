import { z } from 'zod';
import { plainText } from './text';
import { emailSchema } from './email-address';

/** Account rules shared by forms, islands and routes. */
export const PASSWORD_MIN_LENGTH = 10;
export const PASSWORD_MAX_LENGTH = 200;
export const DELETE_CONFIRMATION = 'delete my account';

// E-mail addresses: one normalising rule for every route (see email-address.ts).
export { emailSchema, normaliseEmail } from './email-address';

export const passwordSchema = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN_LENGTH, { error: `Use at least ${PASSWORD_MIN_LENGTH} characters.` })
  .max(PASSWORD_MAX_LENGTH, { error: `Use at most ${PASSWORD_MAX_LENGTH} characters.` });

export const nameSchema = z
  .string({ error: 'Enter your name.' })
  .trim()
  .min(1, { error: 'Enter your name.' })
  .max(120, { error: 'Use at most 120 characters.' })
  .check(plainText());

export const signUpSchema = z.object({ name: nameSchema, email: emailSchema, password: passwordSchema });
export type SignUpInput = z.infer<typeof signUpSchema>;

export const forgotPasswordSchema = z.object({ email: emailSchema });

export const tokenSchema = z.string({ error: 'The link is incomplete.' }).regex(/^[A-Za-z0-9_-]{32,128}$/, { error: 'The link is incomplete.' });

export const resetPasswordSchema = z.object({ token: tokenSchema, password: passwordSchema });

export const changeNameSchema = z.object({ name: nameSchema });

export const changePasswordSchema = z.object({
  currentPassword: z
    .string({ error: 'Enter your current password.' })
    .min(1, { error: 'Enter your current password.' })
    .max(PASSWORD_MAX_LENGTH, { error: `Use at most ${PASSWORD_MAX_LENGTH} characters.` }),
  newPassword: passwordSchema,
});

export const deleteAccountSchema = z.object({
  confirmation: z
    .string()
    .max(100, { error: 'Use at most 100 characters.' })
    .refine((value) => value.trim().toLowerCase() === DELETE_CONFIRMATION, { error: `Type “${DELETE_CONFIRMATION}” to confirm.` }),
});

export const roleSchema = z.enum(['member', 'instructor', 'admin'], { error: 'Role must be member, instructor or admin.' });
export const changeRoleSchema = z.object({ role: roleSchema });
export type RoleName = z.infer<typeof roleSchema>;

const rank: Record<RoleName, number> = { member: 0, instructor: 1, admin: 2 };

/** Roles nest: an admin can do what an instructor can, who can do what a member can. */
export function hasRole(role: RoleName, needed: RoleName): boolean {
  return rank[role] >= rank[needed];
}
