// The sign-in limits in front of Auth.js: whatever way a sign-in request is written, the limit
// per e-mail address counts the address Auth.js will actually check.
import { describe, expect, it } from 'vitest';
import { api, baseUrl, newJar } from '../support/app';
import { csrfToken } from '../support/auth';

const unique = () => `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 7)}`;
const newAddress = () => `limits-${unique()}@oxbloom.test`;
const wrong = 'wrong password here';
// 198.51.100.200–254: a block no other test file signs in from (accounts.test.ts exhausts one of 100–199).
const addressFor = (attempt: number) => `198.51.100.${200 + Math.floor(Math.random() * 40) + attempt}`;

/** Posts a raw body to an Auth.js route with a fresh CSRF token, as another client each time. */
async function postRaw(path: string, contentType: string, body: (token: string) => string, from: string) {
  const jar = newJar();
  const token = await csrfToken(jar, from);
  return api(path, { method: 'POST', jar, from, headers: { 'content-type': contentType }, body: body(token) });
}

describe('sign-in requests other than a plain form', () => {
  // Auth.js 0.37 reads a body as JSON when the content type merely contains "application/json"
  // (node_modules/@auth/core/lib/utils/web.js, getBody), so anything but a plain form is refused.
  it.each([
    ['JSON', 'application/json'],
    ['JSON with a charset', 'application/json; charset=utf-8'],
    ['a form type that also names JSON', 'application/x-www-form-urlencoded; x=application/json'],
    ['plain text', 'text/plain'],
  ])('password sign-in as %s is refused with 415 and never counts as a try', async (_label, contentType) => {
    const email = newAddress();
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 6; attempt += 1) {
      const response = await postRaw(
        '/api/auth/callback/credentials',
        contentType,
        (token) => JSON.stringify({ csrfToken: token, email, password: wrong, callbackUrl: `${baseUrl}/account` }),
        addressFor(attempt),
      );
      statuses.push(response.status);
      if (response.status === 415) expect(await response.json()).toEqual({ error: expect.stringContaining('form') });
    }
    expect(statuses).toEqual([415, 415, 415, 415, 415, 415]);
  });

  it('a link request as JSON is refused with 415', async () => {
    const response = await postRaw(
      '/api/auth/signin/nodemailer',
      'application/json',
      (token) => JSON.stringify({ csrfToken: token, email: newAddress() }),
      addressFor(0),
    );
    expect(response.status).toBe(415);
  });
});

describe('sign-in forms written to slip past the limit', () => {
  it('a repeated e-mail field counts against the address Auth.js checks (the last one)', async () => {
    const victim = newAddress();
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 6; attempt += 1) {
      const response = await postRaw(
        '/api/auth/callback/credentials',
        'application/x-www-form-urlencoded',
        (token) =>
          new URLSearchParams([
            ['csrfToken', token],
            ['email', newAddress()],
            ['email', victim],
            ['password', wrong],
          ]).toString(),
        addressFor(attempt),
      );
      statuses.push(response.status);
    }
    expect(statuses).toEqual([302, 302, 302, 302, 302, 429]);
  });

  it.each([
    ['a trailing slash', '/api/auth/callback/credentials/'],
    ['a doubled slash', '/api/auth/callback//credentials'],
  ])('the route written with %s is limited too (or not served)', async (_label, path) => {
    const email = newAddress();
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 6; attempt += 1) {
      const response = await postRaw(
        path,
        'application/x-www-form-urlencoded',
        (token) => new URLSearchParams({ csrfToken: token, email, password: wrong }).toString(),
        addressFor(attempt),
      );
      statuses.push(response.status);
    }
    // Either Auth.js answers (and the sixth try is limited) or the route is not served at all.
    expect([JSON.stringify([302, 302, 302, 302, 302, 429]), JSON.stringify([404, 404, 404, 404, 404, 404])]).toContain(JSON.stringify(statuses));
  });

  it.each([
    // Auth.js's e-mail provider keeps what is before a second "@" and before a "," after the "@"
    // (node_modules/@auth/core/lib/actions/signin/send-token.js, defaultNormalizer): each of these
    // would mail a link to the same inbox while counting as a different address, or as none.
    ['a comma after the domain', (victim: string, n: number) => `${victim},${n}`],
    ['a second @', (victim: string, n: number) => `${victim}@${n}.example`],
  ])('a link request for an address written with %s is refused, not mailed', async (_label, spell) => {
    const victim = newAddress();
    for (let attempt = 0; attempt < 3; attempt += 1) {
      const response = await postRaw(
        '/api/auth/signin/nodemailer',
        'application/x-www-form-urlencoded',
        (token) => new URLSearchParams({ csrfToken: token, email: spell(victim, attempt) }).toString(),
        addressFor(attempt),
      );
      expect(response.status).toBe(400);
      expect(await response.json()).toEqual({ error: expect.stringContaining('email'), field: 'email' });
    }
  });

  it('a password longer than any we accept is refused before it is checked', async () => {
    const response = await postRaw(
      '/api/auth/callback/credentials',
      'application/x-www-form-urlencoded',
      (token) => new URLSearchParams({ csrfToken: token, email: newAddress(), password: 'x'.repeat(5000) }).toString(),
      addressFor(0),
    );
    expect(response.status).toBe(400);
    expect(await response.json()).toEqual({ error: expect.stringContaining('password'), field: 'password' });
  });

  it('a browser whose sign-in is refused goes back to the sign-in page, which says why and for how long', async () => {
    const email = newAddress();
    for (let attempt = 0; attempt < 5; attempt += 1) {
      await postRaw(
        '/api/auth/callback/credentials',
        'application/x-www-form-urlencoded',
        (token) => new URLSearchParams({ csrfToken: token, email, password: wrong }).toString(),
        addressFor(attempt),
      );
    }
    const jar = newJar();
    const from = addressFor(9);
    const token = await csrfToken(jar, from);
    const refused = await api('/api/auth/callback/credentials', {
      jar,
      from,
      headers: { accept: 'text/html' },
      form: { csrfToken: token, email, password: wrong },
    });
    expect(refused.status).toBe(303);
    const location = new URL(refused.headers.get('location')!, baseUrl);
    expect(location.pathname).toBe('/sign-in');
    expect(location.searchParams.get('error')).toBe('TooManyAttempts');
    // Source: src/lib/server/limits.ts, the rule under test: a 15-minute window.
    expect(Number(location.searchParams.get('retryAfter'))).toBeGreaterThan(14 * 60);
    const page = await (await api(location.pathname + location.search)).text();
    expect(page).toContain('Too many sign-in attempts. Try again in 15 minutes.');
  });
});
