// Load runs with autocannon (a well-known Node HTTP load generator): as fast as the server answers
// from a fixed number of connections, or at a fixed overall rate; and a burst of photo uploads
// driven the way the browser drives them (presign, PUT to storage, attach with analysis).
import autocannon from 'autocannon';
import { summarise } from './report';

export interface LoadTarget {
  path: string;
  method?: 'GET' | 'POST';
  json?: unknown;
  cookie?: string;
}

export interface LoadResult {
  rate: number;
  p50: number;
  p95: number;
  p99: number;
  requests: number;
  /** Connection errors, time-outs and answers other than 2xx. */
  errors: number;
}

/** What Chromium and Firefox send. */
const BROWSER_ACCEPT_ENCODING = 'gzip, deflate, br, zstd';

/** Runs autocannon against `baseUrl + target.path`; `rate` fixes the overall requests per second. */
export async function load(
  baseUrl: string,
  target: LoadTarget,
  { seconds, connections = 10, rate }: { seconds: number; connections?: number; rate?: number },
): Promise<LoadResult> {
  // Every browser asks for compressed answers; so does every request here (static ones included).
  const headers: Record<string, string> = { 'accept-encoding': BROWSER_ACCEPT_ENCODING };
  if (target.json !== undefined) headers['content-type'] = 'application/json';
  if (target.method === 'POST') headers.origin = baseUrl;
  if (target.cookie) headers.cookie = target.cookie;
  const samples: number[] = [];
  let instance: autocannon.Instance | undefined;
  const done = new Promise<autocannon.Result>((resolve, reject) => {
    instance = autocannon(
      {
        url: new URL(target.path, baseUrl).toString(),
        method: target.method ?? 'GET',
        headers,
        body: target.json === undefined ? undefined : JSON.stringify(target.json),
        connections,
        duration: seconds,
        overallRate: rate,
        timeout: 10,
      },
      (error, result) => (error ? reject(error) : resolve(result)),
    );
  });
  instance!.on('response', (_client, _status, _bytes, responseTime) => samples.push(responseTime));
  const result = await done;
  const timing = summarise(samples.length ? samples : [0]);
  const at = (q: number) => [...samples].sort((a, b) => a - b)[Math.min(samples.length - 1, Math.floor(q * samples.length))] ?? 0;
  return {
    rate: result.requests.total / result.duration,
    p50: timing.median,
    p95: timing.p95,
    p99: at(0.99),
    requests: result.requests.total,
    errors: result.errors + result.timeouts + result.non2xx,
  };
}

/** A cookie header signed in as `email` through Auth.js's password form (CSRF token first). */
export async function signIn(baseUrl: string, email: string, password: string): Promise<string> {
  const jar = new Map<string, string>();
  const keep = (response: Response) => {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const index = pair.indexOf('=');
      jar.set(pair.slice(0, index).trim(), pair.slice(index + 1).trim());
    }
  };
  const cookie = () => [...jar].map(([name, value]) => `${name}=${value}`).join('; ');
  const csrf = await fetch(new URL('/api/auth/csrf', baseUrl));
  keep(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const response = await fetch(new URL('/api/auth/callback/credentials', baseUrl), {
    method: 'POST',
    redirect: 'manual',
    headers: { origin: baseUrl, cookie: cookie(), 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: '/' }).toString(),
  });
  keep(response);
  if (![...jar.keys()].some((name) => name.endsWith('authjs.session-token'))) throw new Error(`Signing in as ${email} failed (${response.status}).`);
  return cookie();
}

export interface UploadResult {
  count: number;
  errors: number;
  seconds: number;
  p50: number;
  p95: number;
  max: number;
}

/**
 * `uploads` photos at once, each through the real upload API: POST /api/uploads (presign), PUT
 * to the storage URL, POST /api/coupons/:id/photos (decode, measure, store derived files).
 */
export async function uploadBurst(baseUrl: string, jobs: { cookie: string; couponId: number; bytes: Buffer }[]): Promise<UploadResult> {
  const step = <T>(what: string, work: Promise<T>) =>
    work.catch((error: unknown) => {
      throw new Error(`${what}: ${describeError(error)}`);
    });
  const one = async (job: (typeof jobs)[number], index: number) => {
    const start = performance.now();
    const headers = { origin: baseUrl, cookie: job.cookie, 'content-type': 'application/json' };
    const ticketResponse = await step(
      'presign',
      fetch(new URL('/api/uploads', baseUrl), {
        method: 'POST',
        headers,
        body: JSON.stringify({ filename: `coupon-${index}.jpg`, contentType: 'image/jpeg', size: job.bytes.length }),
      }),
    );
    if (ticketResponse.status !== 201) throw new Error(`presign answered ${ticketResponse.status}: ${await ticketResponse.text()}`);
    const ticket = (await ticketResponse.json()) as { key: string; url: string; headers: Record<string, string> };
    const put = await step('storage PUT', fetch(ticket.url, { method: 'PUT', headers: ticket.headers, body: new Uint8Array(job.bytes) }));
    if (put.status !== 200) throw new Error(`storage answered ${put.status}`);
    const attach = await step(
      'attach',
      fetch(new URL(`/api/coupons/${job.couponId}/photos`, baseUrl), { method: 'POST', headers, body: JSON.stringify({ key: ticket.key }) }),
    );
    if (attach.status !== 201) throw new Error(`attach answered ${attach.status}: ${await attach.text()}`);
    return performance.now() - start;
  };
  const start = performance.now();
  const settled = await Promise.allSettled(jobs.map(one));
  const seconds = (performance.now() - start) / 1000;
  const times = settled.flatMap((outcome) => (outcome.status === 'fulfilled' ? [outcome.value] : []));
  for (const outcome of settled) if (outcome.status === 'rejected') console.log(`  upload failed: ${describeError(outcome.reason)}`);
  const timing = summarise(times.length ? times : [0]);
  return { count: jobs.length, errors: jobs.length - times.length, seconds, p50: timing.median, p95: timing.p95, max: timing.max };
}

/** An error with its cause (fetch names the real reason, such as a reset connection, only there). */
function describeError(error: unknown): string {
  if (!(error instanceof Error)) return String(error);
  const cause = error.cause instanceof Error ? ` (${error.cause.message})` : '';
  return `${error.message}${cause}`;
}
