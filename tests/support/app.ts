/** Where the test harness (scripts/test.mjs) serves the built app, and a fetch that sends Origin. */
export const baseUrl = process.env.OXBLOOM_TEST_BASE_URL ?? 'http://127.0.0.1:4331';

export function api(path: string, init: RequestInit = {}): Promise<Response> {
  const headers = new Headers(init.headers);
  if (init.method && init.method !== 'GET' && !headers.has('origin')) headers.set('origin', baseUrl);
  if (init.body && typeof init.body === 'string' && !headers.has('content-type')) headers.set('content-type', 'application/json');
  return fetch(new URL(path, baseUrl), { ...init, headers, redirect: 'manual' });
}
