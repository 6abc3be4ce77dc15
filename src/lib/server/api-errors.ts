import { problem } from './http';

/**
 * Errors under /api/ as JSON of one shape, `{error, field?}`, whatever made them: Astro's 404 page
 * for an unknown route, its empty 404 for a method a route doesn't export, an error thrown in a
 * route, or a library's plain-text answer.
 */

const METHODS = ['DELETE', 'GET', 'HEAD', 'OPTIONS', 'PATCH', 'POST', 'PUT'] as const;

/** The API routes' modules, loaded only to read which methods they export. */
const routeModules = import.meta.glob<Record<string, unknown>>('../../pages/api/**/*.ts');

/** auth-astro's injected route exports GET and POST. */
const INJECTED_ROUTES: Record<string, string[]> = { '/api/auth/[...auth]': ['GET', 'POST'] };

/** The methods a route pattern answers (HEAD wherever GET is), sorted; undefined when the pattern is not an API route. */
export async function allowedMethods(routePattern: string): Promise<string[] | undefined> {
  let exported = INJECTED_ROUTES[routePattern];
  if (!exported) {
    const load = routeModules[`../../pages${routePattern}.ts`] ?? routeModules[`../../pages${routePattern}/index.ts`];
    if (!load) return undefined;
    exported = Object.keys(await load());
  }
  const methods = new Set(METHODS.filter((method) => exported.includes(method)));
  if (methods.has('GET')) methods.add('HEAD');
  return [...methods].sort();
}

const messages: Record<number, string> = {
  400: 'The request was not understood.',
  401: 'Sign in first.',
  403: 'You may not do that.',
  404: 'There is nothing at this address.',
  405: 'This address does not take that method.',
  413: 'The request is too large.',
  415: 'The request body is of a type this address does not take.',
  429: 'Too many attempts. Try again later.',
};

export const errorMessage = (status: number) =>
  messages[status] ?? (status >= 500 ? 'Something went wrong on our side. Try again in a moment.' : 'The request was refused.');

const isJson = (response: Response) => /^application\/json\b/i.test(response.headers.get('content-type') ?? '');

/** The same error as JSON, keeping its status and headers such as Retry-After and Allow. */
export function asJsonError(response: Response, message = errorMessage(response.status)): Response {
  const json = problem(response.status, message);
  for (const [name, value] of response.headers) {
    if (name === 'set-cookie') json.headers.append(name, value);
    else if (!['content-type', 'content-length', 'content-encoding'].includes(name)) json.headers.set(name, value);
  }
  return json;
}

/** True for an error answer that is not yet JSON (an empty body included). */
export const needsJson = (response: Response) => response.status >= 400 && (response.body === null || !isJson(response));
