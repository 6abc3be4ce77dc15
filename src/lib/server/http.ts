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

/** The media type of a request's body, lower-cased and without parameters ("application/json"). */
export function mediaType(request: Request): string {
  return (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
}

const FORM_TYPES = new Set(['application/x-www-form-urlencoded', 'multipart/form-data']);
const isJson = (request: Request) => mediaType(request) === 'application/json';
const isForm = (request: Request) => FORM_TYPES.has(mediaType(request));

/** What a route's body is read from: its request, and the body's text when the server read it ahead. */
export interface BodySource {
  request: Request;
  locals: Pick<App.Locals, 'bodyText'>;
}

/**
 * The body as text: the production server (scripts/serve.mjs) reads a small JSON body for an API
 * route ahead and passes it in `locals.bodyText`, leaving the request without a body stream; any
 * other body (the dev server, a chunked one) is read from the request.
 */
async function bodyText({ request, locals }: BodySource): Promise<string> {
  return locals.bodyText ?? request.text();
}

/**
 * Reads a JSON body and validates it: anything but application/json is a 415, a malformed body or
 * a failed check a 400 naming the field. (The middleware has already capped the body's size.)
 */
export async function parseJson<S extends Schema>(source: BodySource, schema: S): Promise<Parsed<z.output<S>>> {
  if (!isJson(source.request)) return { ok: false, response: problem(415, 'Send the request body as JSON, with Content-Type: application/json.') };
  let raw: unknown;
  try {
    raw = JSON.parse(await bodyText(source));
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
async function readBody(source: BodySource): Promise<unknown> {
  if (isForm(source.request)) return Object.fromEntries((await source.request.formData()).entries());
  return JSON.parse(await bodyText(source));
}

/** Like parseJson, for routes that take either JSON or a plain form post (our pages without JavaScript). */
export async function parseBody<S extends Schema>(source: BodySource, schema: S): Promise<Parsed<z.output<S>>> {
  if (!isJson(source.request) && !isForm(source.request)) {
    return { ok: false, response: problem(415, 'Send the request body as JSON (application/json) or as a form.') };
  }
  let raw: unknown;
  try {
    raw = await readBody(source);
  } catch {
    return { ok: false, response: problem(400, 'The request body must be JSON or a form.') };
  }
  return parseValue(raw, schema);
}
