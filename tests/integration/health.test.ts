import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { api } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { alloyCatalogue } from '~/lib/alloys';

/** SMTP sessions the mail fake saw close without sending a message (connection checks), from its log. */
function mailProbes(): number {
  return readFileSync(path.join(process.env.OXBLOOM_MAIL_DIR!, 'sessions.log'), 'utf8')
    .split('\n')
    .filter((line) => line.endsWith(' probe')).length;
}

describe('GET /api/health', () => {
  it('tells a visitor only that the app is up, and nothing about its services', async () => {
    const response = await api('/api/health');
    expect(response.status).toBe(200);
    expect(response.headers.get('cache-control')).toBe('no-store');
    expect(await response.json()).toEqual({ status: 'up' });
  });

  it('tells a member no more than a visitor', async () => {
    const response = await api('/api/health', { jar: await signedIn(demo.member) });
    expect(await response.json()).toEqual({ status: 'up' });
  });

  it('shows a signed-in admin every backing service up, and when each was checked', async () => {
    const response = await api('/api/health', { jar: await signedIn(demo.admin) });
    expect(response.status).toBe(200);
    const health = await response.json();
    expect(health).toEqual({
      status: 'up',
      services: { db: 'ok', storage: 'ok', mail: 'ok' },
      checkedAt: expect.any(String),
      mailCheckedAt: expect.any(String),
    });
    // The mail check runs apart from the others, and no more often.
    expect(Date.parse(health.mailCheckedAt)).toBeLessThanOrEqual(Date.parse(health.checkedAt));
  });

  it('answers many requests from one check a few seconds old', async () => {
    const admin = await signedIn(demo.admin);
    const answers = await Promise.all(Array.from({ length: 10 }, () => api('/api/health', { jar: admin }).then((response) => response.json())));
    const checkedAt = new Set(answers.map((answer) => answer.checkedAt));
    // Ten requests at once may straddle one expiry of the cached result, never more.
    expect(checkedAt.size).toBeLessThanOrEqual(2);
    for (const answer of answers) expect(Date.now() - Date.parse(answer.checkedAt)).toBeLessThan(15_000);
  });

  it('never opens a mail connection per request', async () => {
    const admin = await signedIn(demo.admin);
    const before = mailProbes();
    for (let request = 0; request < 20; request += 1) await api('/api/health', { jar: request % 2 ? admin : undefined });
    // The fake logs a session when it closes; give the last one a moment.
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(mailProbes() - before).toBeLessThanOrEqual(1);
  });
});

describe('GET /api/alloys', () => {
  it('lists the whole catalogue with slug, name, family and UNS number', async () => {
    const response = await api('/api/alloys');
    expect(response.status).toBe(200);
    const alloys = await response.json();
    expect(alloys).toEqual(alloyCatalogue.map(({ slug, name, family, uns }) => ({ slug, name, family, uns })));
  });

  it.each([
    // Source: UNS designations per ASTM E527 / SAE J1086 (Grade 2 and Grade 5 titanium, 304 stainless, C11000 copper).
    ['ti-grade-2', 'R50400'],
    ['ti-grade-5', 'R56400'],
    ['steel-304', 'S30400'],
    ['copper-c11000', 'C11000'],
  ])('%s carries UNS %s', async (slug, uns) => {
    const alloys: { slug: string; uns: string }[] = await (await api('/api/alloys')).json();
    expect(alloys.find((alloy) => alloy.slug === slug)?.uns).toBe(uns);
  });
});

describe('unknown routes', () => {
  it('answer 404, not 500', async () => {
    expect((await api('/api/no-such-route')).status).toBe(404);
    expect((await api('/no-such-page')).status).toBe(404);
  });
});
