// Request bodies: a size cap that never reads a large body whole, the content types each kind of
// route accepts, and a cap on every string field.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import http from 'node:http';
import net from 'node:net';
import { eq } from 'drizzle-orm';
import { coupons } from '../../db/schema';
import { api, baseUrl, clientAddress, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { deleteCoupons } from '../fixtures/library-coupons';

const { db, pool } = testDatabase();
afterAll(() => pool.end());

const unique = () => `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 7)}`;
const MEGABYTE = 1024 * 1024;
// The cap under test: 64 kB for any JSON or form body (src/lib/server/request-limits.ts).
const LIMIT = 64 * 1024;

const aCoupon = (title: string) => ({
  title,
  layers: ['ti-grade-2'],
  surfacePrep: 'ground',
  surfaceGrit: 400,
  process: 'oven',
  temperatureC: 540,
  temperatureMethod: 'thermocouple',
  holdSeconds: 1800,
  atmosphere: 'air',
  visibility: 'private',
});

let member: Jar;
beforeAll(async () => {
  member = await signedIn(demo.member);
});

const cookieOf = (jar: Jar) => [...jar.cookies].map(([name, value]) => `${name}=${value}`).join('; ');

/**
 * Sends a JSON body of `total` bytes (`head`, then junk, then a closing `"}`) in 16 kB chunks, with
 * a Content-Length or, when `chunked`, with none (chunked transfer encoding). After the first
 * `holdAfter` bytes it waits up to 5 s for an answer before sending the rest, as a client that
 * reads the answer while still sending (curl) would see it; reports the answer's status and body
 * and how many bytes had been sent when it came.
 */
function sendBody(
  path: string,
  jar: Jar,
  head: string,
  total: number,
  chunked: boolean,
  holdAfter = MEGABYTE,
): Promise<{ status: number; body: string; sentBeforeAnswer: number }> {
  return new Promise((resolve, reject) => {
    const tail = '"}';
    const headers: Record<string, string> = { 'content-type': 'application/json', origin: baseUrl, cookie: cookieOf(jar), 'x-forwarded-for': clientAddress };
    if (chunked) headers['transfer-encoding'] = 'chunked';
    else headers['content-length'] = String(total);
    const request = http.request(new URL(path, baseUrl), { method: 'POST', headers });
    let sent = 0;
    let answered = false;
    let held = false;
    request.on('response', (response) => {
      answered = true;
      const sentBeforeAnswer = sent;
      let body = '';
      response.setEncoding('utf8');
      response.on('data', (chunk) => (body += chunk));
      response.on('end', () => {
        request.destroy();
        resolve({ status: response.statusCode ?? 0, body, sentBeforeAnswer });
      });
    });
    request.on('error', (error) => {
      if (!answered) reject(error);
    });
    const chunk = Buffer.alloc(16 * 1024, 'x');
    const junkBytes = total - head.length - tail.length;
    let junkSent = 0;
    request.write(head);
    sent += head.length;
    const pump = () => {
      while (!answered && junkSent < junkBytes) {
        if (!held && sent >= holdAfter) {
          held = true;
          return void setTimeout(pump, 5_000);
        }
        const piece = junkBytes - junkSent >= chunk.length ? chunk : chunk.subarray(0, junkBytes - junkSent);
        junkSent += piece.length;
        sent += piece.length;
        if (!request.write(piece)) return void request.once('drain', pump);
      }
      if (!answered) request.end(tail);
    };
    pump();
  });
}

describe('the body size cap', () => {
  it.each([
    ['with its Content-Length', false],
    ['streamed with no Content-Length', true],
  ])('refuses a valid coupon with 40 MB of junk beside it, %s: 413 before the body has all arrived, and nothing saved', async (_label, chunked) => {
    const title = `Junk-laden coupon ${unique()}`;
    const head = JSON.stringify(aCoupon(title)).slice(0, -1) + ',"junk":"';
    const result = await sendBody('/api/coupons', member, head, 40 * MEGABYTE, chunked);
    expect(result.status).toBe(413);
    expect(JSON.parse(result.body)).toEqual({ error: expect.stringContaining('64 kB') });
    // The answer came while the client still held back all but the first megabyte.
    expect(result.sentBeforeAnswer).toBeLessThanOrEqual(MEGABYTE + 16 * 1024);
    expect(await db.select().from(coupons).where(eq(coupons.title, title))).toEqual([]);
  });

  it('accepts a body just under the cap and refuses one just over it', async () => {
    const under = { ...aCoupon(`Near the cap ${unique()}`), notes: 'n'.repeat(4000), padding: ' '.repeat(LIMIT - 5000) };
    const underBody = JSON.stringify(under);
    expect(underBody.length).toBeLessThan(LIMIT);
    const accepted = await api('/api/coupons', { method: 'POST', jar: member, headers: { 'content-type': 'application/json' }, body: underBody });
    expect(accepted.status).toBe(201);
    await deleteCoupons(db, [(await accepted.json()).id]);

    const over = JSON.stringify({ ...under, padding: ' '.repeat(LIMIT) });
    expect((await api('/api/coupons', { method: 'POST', jar: member, headers: { 'content-type': 'application/json' }, body: over })).status).toBe(413);
  });

  it('takes no byte past a declared Content-Length as the body: what follows is read as the next request', async () => {
    // Source: RFC 9112 §6.3 (a Content-Length gives the body's length; what follows is the next
    // message) and Node's HTTP parser (llhttp), which skips blank lines before a request line. So a
    // body within the cap by its Content-Length is not counted again (src/lib/server/request-limits.ts).
    const title = `Declared length ${unique()}`;
    const body = JSON.stringify(aCoupon(title));
    const { host } = new URL(baseUrl);
    const head = (method: string, path: string, extra: string) =>
      `${method} ${path} HTTP/1.1\r\nHost: ${host}\r\nOrigin: ${baseUrl}\r\nCookie: ${cookieOf(member)}\r\nX-Forwarded-For: ${clientAddress}\r\n${extra}\r\n`;
    // Twice the cap past the declared body; read as body, the JSON would have broken (400) or been too large (413).
    const past = '\r\n'.repeat(LIMIT) + head('GET', '/api/health', 'Connection: close\r\n');
    const raw = head('POST', '/api/coupons', `Content-Type: application/json\r\nContent-Length: ${Buffer.byteLength(body)}\r\n`) + body + past;
    const answers = await new Promise<string>((resolve, reject) => {
      const socket = net.connect(Number(new URL(baseUrl).port), new URL(baseUrl).hostname, () => socket.write(raw));
      let received = '';
      socket.setEncoding('utf8');
      socket.on('data', (chunk) => (received += chunk));
      socket.on('close', () => resolve(received));
      socket.on('error', reject);
    });
    expect([...answers.matchAll(/^HTTP\/1\.1 (\d{3})/gm)].map((match) => match[1])).toEqual(['201', '200']);
    const saved = await db.select().from(coupons).where(eq(coupons.title, title));
    expect(saved).toHaveLength(1);
    await deleteCoupons(db, [saved[0].id]);
  });

  it('caps form posts to pages too', async () => {
    const response = await api('/sign-up', { form: { name: 'Big', email: `big-${unique()}@oxbloom.test`, password: 'p'.repeat(LIMIT + 1) } });
    expect(response.status).toBe(413);
  });
});

describe('content types', () => {
  const ladder = { alloy: 'ti-grade-2', fromNm: 0, toNm: 50, stepNm: 10 };

  it.each([
    ['text/plain', 'text/plain'],
    ['a form', 'application/x-www-form-urlencoded'],
    ['no content type', undefined],
  ])('a JSON route refuses %s with 415', async (_label, type) => {
    const headers: Record<string, string> = type ? { 'content-type': type } : {};
    const response = await api('/api/tint/ladder', { method: 'POST', headers, body: new TextEncoder().encode(JSON.stringify(ladder)) });
    expect(response.status).toBe(415);
    expect(await response.json()).toEqual({ error: expect.stringContaining('application/json') });
  });

  it('a JSON route takes JSON with a charset', async () => {
    const response = await api('/api/tint/ladder', {
      method: 'POST',
      headers: { 'content-type': 'application/json; charset=utf-8' },
      body: JSON.stringify(ladder),
    });
    expect(response.status).toBe(200);
  });

  /**
   * Posts `bytes` as JSON with a declared length, or `chunked` (no length); as a visitor, or with
   * `cookie`. With `trickle`, two bytes at a time, each its own packet.
   */
  const postJson = (path: string, bytes: Uint8Array, { chunked = false, cookie = '', trickle = false } = {}) =>
    new Promise<{ status: number; body: string }>((resolve, reject) => {
      const headers: Record<string, string> = { 'content-type': 'application/json', origin: baseUrl, 'x-forwarded-for': clientAddress };
      if (cookie) headers.cookie = cookie;
      if (chunked) headers['transfer-encoding'] = 'chunked';
      else headers['content-length'] = String(bytes.length);
      const request = http.request(new URL(path, baseUrl), { method: 'POST', headers });
      request.on('response', (response) => {
        let text = '';
        response.setEncoding('utf8');
        response.on('data', (chunk) => (text += chunk));
        response.on('end', () => resolve({ status: response.statusCode ?? 0, body: text }));
      });
      request.on('error', reject);
      if (!trickle) return void request.end(bytes);
      request.setNoDelay(true);
      let offset = 0;
      const next = () => {
        if (offset >= bytes.length) return void request.end();
        request.write(bytes.subarray(offset, offset + 2));
        offset += 2;
        setTimeout(next, 1);
      };
      next();
    });

  it.each([
    ['with a declared length (read ahead by the server)', false],
    ['chunked, with no declared length (streamed to the route)', true],
  ])('a JSON body reads the same %s, and a leading byte-order mark is dropped', async (_label, chunked) => {
    // Source: WHATWG Fetch, "parse JSON from bytes", which decodes with WHATWG Encoding's "UTF-8
    // decode": a leading byte-order mark (EF BB BF) is removed before the JSON is parsed.
    const plain = Buffer.from(JSON.stringify(ladder), 'utf8');
    const withMark = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), plain]);
    const expected = await postJson('/api/tint/ladder', plain);
    expect(expected.status).toBe(200);
    expect(await postJson('/api/tint/ladder', plain, { chunked })).toEqual(expected);
    expect(await postJson('/api/tint/ladder', withMark, { chunked })).toEqual(expected);
  });

  it('a JSON body whose multi-byte characters arrive split between packets reads exactly as sent', async () => {
    const title = `Straw to blue at 290 °C, ½ hour — “split” ${unique()} 🔥`;
    const bytes = Buffer.from(JSON.stringify(aCoupon(title)), 'utf8');
    // Every character of three or four bytes is cut between packets.
    const { status, body } = await postJson('/api/coupons', bytes, { cookie: cookieOf(member), trickle: true });
    expect(status).toBe(201);
    const { id } = JSON.parse(body) as { id: number };
    const [stored] = await db.select({ title: coupons.title }).from(coupons).where(eq(coupons.id, id));
    expect(stored.title).toBe(title);
    await deleteCoupons(db, [id]);
  });

  it('a route for our no-JavaScript forms takes a form and JSON, and refuses other types with 415', async () => {
    expect((await api('/api/account/forgot-password', { form: { email: `form-${unique()}@oxbloom.test` } })).status).toBe(202);
    expect((await api('/api/account/forgot-password', { json: { email: `json-${unique()}@oxbloom.test` } })).status).toBe(202);
    const plain = await api('/api/account/forgot-password', {
      method: 'POST',
      headers: { 'content-type': 'text/plain' },
      body: `email=plain-${unique()}@oxbloom.test`,
    });
    expect(plain.status).toBe(415);
    expect(await plain.json()).toEqual({ error: expect.any(String) });
  });

  it('the sign-out button (a form post with no fields) still signs out', async () => {
    const jar = await signedIn(demo.member2);
    const response = await api('/api/account/sign-out', {
      jar,
      method: 'POST',
      headers: { accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
      body: '',
    });
    expect(response.status).toBe(303);
    expect((await api('/api/account', { jar })).status).toBe(401);
  });
});

describe('string fields are capped', () => {
  it('refuses a current password longer than any password we accept', async () => {
    const response = await api('/api/account/password', { jar: member, json: { currentPassword: 'c'.repeat(201), newPassword: 'a long enough password' } });
    expect(response.status).toBe(400);
    expect(await response.json()).toEqual({ error: 'currentPassword: Use at most 200 characters.', field: 'currentPassword' });
  });

  it('refuses an over-long delete confirmation, naming its field and the cap', async () => {
    const response = await api('/api/account', { method: 'DELETE', jar: member, json: { confirmation: 'x'.repeat(5000) } });
    expect(response.status).toBe(400);
    expect(await response.json()).toEqual({ error: expect.stringContaining('at most'), field: 'confirmation' });
  });

  it('refuses an over-long colour in a tint request', async () => {
    const response = await api('/api/tint/estimate', { json: { alloy: 'ti-grade-2', hex: `#${'a'.repeat(3000)}` } });
    expect(response.status).toBe(400);
    expect((await response.json()).field).toBe('hex');
  });

  it('refuses a coupon title that reverses its own reading order, naming the field', async () => {
    const response = await api('/api/coupons', { jar: member, json: aCoupon(`Straw ${unique()} \u202Etset`) });
    expect(response.status).toBe(400);
    expect((await response.json()).field).toBe('title');
  });

  it('refuses a name made only of invisible characters, by the API and by the account page', async () => {
    const response = await api('/api/account', { method: 'PATCH', jar: member, json: { name: '\u200B\u3164' } });
    expect(response.status).toBe(400);
    expect((await response.json()).field).toBe('name');
    expect((await api('/account', { jar: member, form: { intent: 'name', name: '\u200B\u3164' } })).status).toBe(400);
  });

  it('the library page ignores an absurd page number instead of failing', async () => {
    expect((await api('/coupons?page=1e300', { jar: member })).status).toBe(200);
    expect((await api('/coupons?page=99999999999999999999', { jar: member })).status).toBe(200);
  });
});
