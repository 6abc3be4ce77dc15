import type { z } from 'zod';

/** A JSON response with the given status. */
export function json(body: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', ...headers },
  });
}

/** A JSON error body `{error, field?}` with a 4xx/5xx status. */
export function problem(status: number, error: string, field?: string): Response {
  return json(field ? { error, field } : { error }, status);
}

type Parsed<T> = { ok: true; data: T } | { ok: false; response: Response };

/** Names the first failing field of a zod error, e.g. "temperatureC: Too big". */
export function describeZodError(error: z.ZodError): { message: string; field?: string } {
  const issue = error.issues[0];
  if (!issue) return { message: 'Invalid input' };
  const field = issue.path.join('.');
  return { message: field ? `${field}: ${issue.message}` : issue.message, field: field || undefined };
}

/** Reads a JSON body and validates it; a malformed body or a failed check is a 400 naming the field. */
export async function parseJson<S extends z.ZodType>(request: Request, schema: S): Promise<Parsed<z.infer<S>>> {
  let raw: unknown;
  try {
    raw = await request.json();
  } catch {
    return { ok: false, response: problem(400, 'The request body must be JSON.') };
  }
  return parseValue(raw, schema);
}

/** Validates an already-read value (query parameters, route parameters). */
export function parseValue<S extends z.ZodType>(raw: unknown, schema: S): Parsed<z.infer<S>> {
  const result = schema.safeParse(raw);
  if (result.success) return { ok: true, data: result.data };
  const { message, field } = describeZodError(result.error);
  return { ok: false, response: problem(400, message, field) };
}
