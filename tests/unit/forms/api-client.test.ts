import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { callApi, NO_CONNECTION } from '~/components/api-client';
import { json, problem } from '~/lib/server/http';

// The islands' fetch client against a real HTTP server that answers the way our routes do:
// bodies made by the routes' own helpers (json, problem), statuses as HTTP defines them.

let server: Server;
let base: string;

/** Sends a Fetch Response (as our routes build them) through node's HTTP server. */
async function send(response: Response, reply: import('node:http').ServerResponse) {
  reply.writeHead(response.status, Object.fromEntries(response.headers));
  reply.end(await response.text());
}

beforeAll(async () => {
  server = createServer(async (request, reply) => {
    let body = '';
    for await (const chunk of request) body += chunk;
    switch (request.url) {
      case '/api/coupons':
        return send(json({ id: 7, sent: { method: request.method, type: request.headers['content-type'], body: JSON.parse(body) } }, 201), reply);
      case '/api/photos/3':
        // Source: RFC 9110 §15.3.5 — a 204 answer has no content.
        return send(new Response(null, { status: 204 }), reply);
      case '/api/tint/predict':
        return send(problem(400, 'temperatureC: must be between 0 and 1600 °C', 'temperatureC'), reply);
      case '/api/account':
        return send(problem(401, 'Sign in first.'), reply);
      case '/api/uploads':
        // Not our JSON: a proxy's error page in front of the app.
        reply.writeHead(502, { 'content-type': 'text/html' });
        return reply.end('<h1>Bad gateway</h1>');
      default:
        reply.writeHead(404, { 'content-type': 'text/plain' });
        return reply.end('not here');
    }
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

describe('calling the API from an island', () => {
  it('sends JSON and reads the JSON answer', async () => {
    const answer = await callApi<{ id: number; sent: unknown }>(`${base}/api/coupons`, { method: 'POST', body: { title: 'Straw test' } });
    expect(answer).toEqual({ ok: true, status: 201, body: { id: 7, sent: { method: 'POST', type: 'application/json', body: { title: 'Straw test' } } } });
  });

  it('takes an answer with no content', async () => {
    expect(await callApi(`${base}/api/photos/3`, { method: 'DELETE' })).toEqual({ ok: true, status: 204, body: undefined });
  });

  it('reads our error shape: the message and the field it names', async () => {
    expect(await callApi(`${base}/api/tint/predict`, { method: 'POST', body: {} })).toEqual({
      ok: false,
      status: 400,
      message: 'temperatureC: must be between 0 and 1600 °C',
      field: 'temperatureC',
    });
    expect(await callApi(`${base}/api/account`)).toEqual({ ok: false, status: 401, message: 'Sign in first.', field: undefined });
  });

  it.each([
    ['/api/uploads', 502, 'Oxbloom could not finish that just now. Try again in a moment.'],
    ['/nowhere', 404, 'The request was refused (404).'],
  ])('words an answer that is not our JSON (%s, %i)', async (path, status, message) => {
    expect(await callApi(`${base}${path}`)).toEqual({ ok: false, status, message, field: undefined });
  });

  it('turns a lost connection into one message, status 0', async () => {
    // A port nobody listens on: a server opened, then closed again.
    const closed = createServer();
    await new Promise<void>((resolve) => closed.listen(0, '127.0.0.1', resolve));
    const port = (closed.address() as AddressInfo).port;
    await new Promise<void>((resolve) => closed.close(() => resolve()));
    expect(await callApi(`http://127.0.0.1:${port}/api/coupons`, { method: 'POST', body: {} })).toEqual({ ok: false, status: 0, message: NO_CONNECTION });
  });
});
