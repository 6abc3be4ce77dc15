import { z } from 'zod';

/** Any zod schema, from the full build or from zod/mini. */
type Schema = z.core.$ZodType;

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
export function describeZodError(error: z.core.$ZodError): { message: string; field?: string } {
  const issue = error.issues[0];
  if (!issue) return { message: 'Invalid input' };
  const field = issue.path.join('.');
  return { message: field ? `${field}: ${issue.message}` : issue.message, field: field || undefined };
}

/** Reads a JSON body and validates it; a malformed body or a failed check is a 400 naming the field. */
export async function parseJson<S extends Schema>(request: Request, schema: S): Promise<Parsed<z.output<S>>> {
  let raw: unknown;
  try {
    raw = await request.json();
  } catch {
    return { ok: false, response: problem(400, 'The request body must be JSON.') };
  }
  return parseValue(raw, schema);
}

/** Validates an already-read value (query parameters, route parameters). */
export function parseValue<S extends Schema>(raw: unknown, schema: S): Parsed<z.output<S>> {
  const result = z.safeParse(schema, raw);
  if (result.success) return { ok: true, data: result.data };
  const { message, field } = describeZodError(result.error);
  return { ok: false, response: problem(400, message, field) };
}

const attemptsMessage = (retryAfterSeconds: number) => {
  const minutes = Math.ceil(retryAfterSeconds / 60);
  return `Too many attempts. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`;
};

/** A JSON 429 with Retry-After. */
export function tooManyAttemptsProblem(retryAfterSeconds: number): Response {
  return json({ error: attemptsMessage(retryAfterSeconds) }, 429, { 'retry-after': String(retryAfterSeconds) });
}

/** A 429 with Retry-After; a small page for a page's form post, JSON otherwise. */
export function tooManyAttempts(retryAfterSeconds: number, request: Request): Response {
  if (!wantsHtml(request)) return tooManyAttemptsProblem(retryAfterSeconds);
  return new Response(
    `<!doctype html><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>Too many attempts · Oxbloom</title><p style="font-family:sans-serif;max-width:32rem;margin:3rem auto">${attemptsMessage(retryAfterSeconds)} <a href="/">Back to Oxbloom</a></p>`,
    { status: 429, headers: { 'retry-after': String(retryAfterSeconds), 'content-type': 'text/html; charset=utf-8' } },
  );
}

/** True for a browser's form post or page load, false for fetch/JSON clients. */
export function wantsHtml(request: Request): boolean {
  const accept = request.headers.get('accept') ?? '';
  return accept.includes('text/html');
}

/** Reads a JSON body or, from a plain HTML form, its fields as strings. */
export async function readBody(request: Request): Promise<unknown> {
  const type = request.headers.get('content-type') ?? '';
  if (type.includes('application/x-www-form-urlencoded') || type.includes('multipart/form-data')) {
    return Object.fromEntries((await request.formData()).entries());
  }
  return request.json();
}

/** Like parseJson, for routes that take either JSON or a plain form post. */
export async function parseBody<S extends Schema>(request: Request, schema: S): Promise<Parsed<z.output<S>>> {
  let raw: unknown;
  try {
    raw = await readBody(request);
  } catch {
    return { ok: false, response: problem(400, 'The request body must be JSON or a form.') };
  }
  return parseValue(raw, schema);
}
