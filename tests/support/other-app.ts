// Requests to an app process other than the suite's own (tests/support/app-process.ts), with the
// same habits as tests/support/app.ts (its `api`): Origin on writes, a cookie jar, redirects not followed.
import { api, type Jar } from './app';

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
  return api(pathname, { ...options, base });
}
