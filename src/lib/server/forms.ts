import type { APIContext } from 'astro';
import type { z } from 'zod';
import type { Limited } from './accounts';
import { clientAddress } from './client-address';
import { tooManyAttempts } from './http';

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

export interface LinkFormOutcome {
  errors: FieldErrors;
  /** The link is on its way. */
  sent: boolean;
  /** What was posted, for the page to show again. */
  form?: FormData;
  /** A 429 for the page to return: the sender is over its limit. */
  refusal?: Response;
}

/**
 * A page's form that e-mails a link (sign-up, password reset): on a POST, validates the form and
 * sends; a field error answers 400 and the page shows it beside the field.
 */
export async function sendLinkFromForm<S extends z.ZodType>(
  page: Pick<APIContext, 'request' | 'clientAddress'> & { response: { status?: number } },
  schema: S,
  send: (input: z.infer<S>, address: string) => Promise<Limited<{ status: 'sent' }>>,
): Promise<LinkFormOutcome> {
  if (page.request.method !== 'POST') return { errors: {}, sent: false };
  const form = await page.request.formData();
  const input = validateForm(form, schema);
  if (!input.ok) {
    page.response.status = 400;
    return { errors: input.errors, sent: false, form };
  }
  const result = await send(input.data, clientAddress(page));
  if (result.status === 'limited') return { errors: {}, sent: false, form, refusal: tooManyAttempts(result.retryAfterSeconds, page.request) };
  return { errors: {}, sent: true, form };
}

/** Only same-site paths are followed after sign-in. */
export function safeReturnPath(value: string | null | undefined, fallback = '/account'): string {
  return value && value.startsWith('/') && !value.startsWith('//') && !value.startsWith('/\\') ? value : fallback;
}
