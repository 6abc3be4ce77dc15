import { toNestErrors } from '@hookform/resolvers';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, type DefaultValues, type FieldError, type FieldErrors, type FieldValues, type Resolver, type ResolverOptions } from 'react-hook-form';
import type { z } from 'zod';

/** How a form's values become a request, and where that request's errors are shown. */
export interface RequestCheck<Form extends FieldValues, Body> {
  schema: z.core.$ZodType;
  requestOf: (form: Form) => Body;
  /** The form field that shows an error found at this path of the body, and its message there. */
  errorAt: (path: string, message: string) => { field: string; message: string };
  /** Only the first error, as the API answers one; it is the form's root error too (for its alert). */
  firstOnly?: boolean;
}

/**
 * A React Hook Form resolver that checks what a form will send — its request body, made from
 * the values as typed — with the API route's own zod schema (full zod or zod/mini), and files
 * each error under the form field that shows it. On success the form's submit handler gets the
 * request body exactly as it was checked.
 */
export function requestResolver<Form extends FieldValues, Body>({
  schema,
  requestOf,
  errorAt,
  firstOnly = false,
}: RequestCheck<Form, Body>): Resolver<Form, unknown, Body> {
  // `raw`: hand on the body as built, not zod's parsed copy; the route parses it again.
  const check = zodResolver(schema as z.core.$ZodType<unknown, FieldValues>, undefined, { raw: true });
  return async (form, context, options) => {
    const body = requestOf(form);
    // Paths of the body are not names of the form's fields: nest errors by path alone.
    const byPath = { ...options, fields: {}, names: [] } as ResolverOptions<FieldValues>;
    const { errors } = await check(body as FieldValues, context, byPath);
    const found: Record<string, FieldError> = {};
    for (const [path, error] of errorsByPath(errors)) {
      const { field, message } = errorAt(path, error.message ?? '');
      found[field] ??= { type: error.type, message };
      if (firstOnly) {
        found.root = { type: error.type, message };
        break;
      }
    }
    if (Object.keys(found).length === 0) return { values: body, errors: {} };
    return { values: {}, errors: toNestErrors<Form>(found, { ...options, names: [] }) };
  };
}

/** A resolver's nested errors as [path, error] pairs, in the order the schema found them. */
function* errorsByPath(errors: FieldErrors, prefix = ''): Generator<[string, FieldError]> {
  for (const [key, value] of Object.entries(errors)) {
    if (!value) continue;
    const path = prefix ? `${prefix}.${key}` : key;
    if (typeof value.type === 'string') yield [path, value as FieldError];
    else yield* errorsByPath(value as FieldErrors, path);
  }
}

/** "temperatureC: must be between 0 and 1600 °C": a message the way the API words it (`describeZodError`). */
export const asTheApiSays = (path: string, message: string) => (path ? `${path}: ${message}` : message);

/**
 * React Hook Form for a form that sends one API request: checked on submit with its request's
 * resolver; messages stay until the next submit (as the API's do), and the page doesn't jump to them.
 */
export function useRequestForm<Form extends FieldValues, Body>(defaultValues: NoInfer<DefaultValues<Form>>, resolver: Resolver<Form, unknown, Body>) {
  return useForm<Form, unknown, Body>({ defaultValues, resolver, reValidateMode: 'onSubmit', shouldFocusError: false });
}
