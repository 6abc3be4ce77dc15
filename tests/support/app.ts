/** Where the test harness (scripts/test.mjs) serves the built app, and fetch helpers for it. */
export const baseUrl = process.env.OXBLOOM_TEST_BASE_URL ?? 'http://127.0.0.1:4331';

/**
 * Each test file acts from its own client address (documentation range, RFC 5737), so the
 * per-address rate limits of one file don't reach another. The app trusts X-Forwarded-For in tests.
 */
export const clientAddress = `203.0.113.${1 + Math.floor(Math.random() * 250)}`;

export interface Jar {
  cookies: Map<string, string>;
}

export const newJar = (): Jar => ({ cookies: new Map() });

function remember(jar: Jar | undefined, response: Response) {
  if (!jar) return;
  for (const line of response.headers.getSetCookie()) {
    const [pair, ...attributes] = line.split(';');
    const index = pair.indexOf('=');
    const name = pair.slice(0, index).trim();
    const value = pair.slice(index + 1).trim();
    const expired = attributes.some((attribute) => /max-age=0|expires=thu, 01 jan 1970/i.test(attribute.trim())) || value === '';
    if (expired) jar.cookies.delete(name);
    else jar.cookies.set(name, value);
  }
}

export interface RequestOptions extends RequestInit {
  jar?: Jar;
  json?: unknown;
  form?: Record<string, string>;
  from?: string;
  /** Another app process's address (tests/support/app-process.ts); the suite's own by default. */
  base?: string;
}

/** fetch against the app: sends Origin on writes, keeps cookies in `jar`, never follows redirects. */
export async function api(path: string, options: RequestOptions = {}): Promise<Response> {
  const { jar, json, form, from = clientAddress, base = baseUrl, ...init } = options;
  const headers = new Headers(init.headers);
  const method = init.method ?? (json !== undefined || form ? 'POST' : 'GET');
  if (method !== 'GET' && method !== 'HEAD' && !headers.has('origin')) headers.set('origin', base);
  headers.set('x-forwarded-for', from);
  let body = init.body;
  if (json !== undefined) {
    headers.set('content-type', 'application/json');
    body = JSON.stringify(json);
  } else if (form) {
    headers.set('content-type', 'application/x-www-form-urlencoded');
    body = new URLSearchParams(form).toString();
  }
  if (jar?.cookies.size) headers.set('cookie', [...jar.cookies].map(([name, value]) => `${name}=${value}`).join('; '));
  const response = await fetch(new URL(path, base), { ...init, method, headers, body, redirect: 'manual' });
  remember(jar, response);
  return response;
}
