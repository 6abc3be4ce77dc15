import type { z } from 'zod';

export type FieldErrors = Record<string, string>;

/** Validates a posted form; on failure, one message per field for the page to show. */
export function validateForm<S extends z.ZodType>(form: FormData, schema: S): { ok: true; data: z.infer<S> } | { ok: false; errors: FieldErrors } {
  const result = schema.safeParse(Object.fromEntries(form.entries()));
  if (result.success) return { ok: true, data: result.data };
  const errors: FieldErrors = {};
  for (const issue of result.error.issues) {
    const field = String(issue.path[0] ?? 'form');
    errors[field] ??= issue.message;
  }
  return { ok: false, errors };
}

/** Only same-site paths are followed after sign-in. */
export function safeReturnPath(value: string | null | undefined, fallback = '/account'): string {
  return value && value.startsWith('/') && !value.startsWith('//') && !value.startsWith('/\\') ? value : fallback;
}
