// Requests to an app process other than the suite's own (tests/support/app-process.ts), with the
// same habits as tests/support/app.ts: Origin on writes, a cookie jar, redirects not followed.
import type { Jar } from './app';
import { clientAddress } from './app';

export interface OtherRequest {
  method?: string;
  jar?: Jar;
  json?: unknown;
  form?: Record<string, string>;
  from?: string;
  headers?: Record<string, string>;
  signal?: AbortSignal;
}

export async function callApp(base: string, pathname: string, options: OtherRequest = {}): Promise<Response> {
  const { jar, json, form, from = clientAddress } = options;
  const method = options.method ?? (json !== undefined || form ? 'POST' : 'GET');
  const headers = new Headers(options.headers);
  if (method !== 'GET' && method !== 'HEAD') headers.set('origin', base);
  headers.set('x-forwarded-for', from);
  let body: string | undefined;
  if (json !== undefined) {
    headers.set('content-type', 'application/json');
    body = JSON.stringify(json);
  } else if (form) {
    headers.set('content-type', 'application/x-www-form-urlencoded');
    body = new URLSearchParams(form).toString();
  }
  if (jar?.cookies.size) headers.set('cookie', [...jar.cookies].map(([name, value]) => `${name}=${value}`).join('; '));
  const response = await fetch(new URL(pathname, base), { method, headers, body, redirect: 'manual', signal: options.signal });
  if (jar) {
    for (const line of response.headers.getSetCookie()) {
      const [pair, ...attributes] = line.split(';');
      const index = pair.indexOf('=');
      const name = pair.slice(0, index).trim();
      const value = pair.slice(index + 1).trim();
      if (value === '' || attributes.some((attribute) => /max-age=0|expires=thu, 01 jan 1970/i.test(attribute.trim()))) jar.cookies.delete(name);
      else jar.cookies.set(name, value);
    }
  }
  return response;
}
