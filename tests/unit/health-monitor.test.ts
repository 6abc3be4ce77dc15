// The health monitor behind /api/health, with checks that count their calls and a clock the test
// moves: answers come from a result a few seconds old, concurrent requests share one check, and
// the mail server is asked at most once per interval (and never while a request waits).
import { describe, expect, it } from 'vitest';
import { createHealthMonitor, type HealthChecks } from '~/lib/server/health';

function setUp(overrides: Partial<HealthChecks> = {}) {
  const calls = { db: 0, storage: 0, mail: 0 };
  let time = 1_000_000;
  const count = (service: keyof typeof calls) => async () => {
    calls[service] += 1;
  };
  const checks: HealthChecks = { db: count('db'), storage: count('storage'), mail: count('mail'), ...overrides };
  const monitor = createHealthMonitor(checks, { maxAgeMs: 5_000, mailEveryMs: 60_000, timeoutMs: 50, now: () => time });
  return { monitor, calls, advance: (ms: number) => (time += ms) };
}

describe('the health monitor', () => {
  it('answers from one check while it is younger than its maximum age', async () => {
    const { monitor, calls, advance } = setUp();
    const first = await monitor.report();
    advance(4_999);
    const second = await monitor.report();
    expect(second).toBe(first);
    expect(calls).toEqual({ db: 1, storage: 1, mail: 1 });
    expect(first).toMatchObject({ up: true, services: { db: 'ok', storage: 'ok', mail: 'ok' } });
  });

  it('checks the database and storage again once the result is old, the mail server only once a minute', async () => {
    const { monitor, calls, advance } = setUp();
    for (let step = 0; step < 12; step += 1) {
      await monitor.report();
      advance(5_000);
    }
    // 12 reports 5 s apart span 55 s: a fresh check each time, and the one mail check of the start.
    expect(calls).toEqual({ db: 12, storage: 12, mail: 1 });
    await monitor.report();
    // 60 s after the first mail check a new one starts in the background.
    await new Promise((resolve) => setTimeout(resolve, 0));
    expect(calls.mail).toBe(2);
  });

  it('lets many requests at once share one check', async () => {
    const { monitor, calls } = setUp();
    const reports = await Promise.all(Array.from({ length: 50 }, () => monitor.report()));
    expect(new Set(reports).size).toBe(1);
    expect(calls).toEqual({ db: 1, storage: 1, mail: 1 });
  });

  it('reports a failing service down, and the app down', async () => {
    const { monitor } = setUp({ storage: async () => Promise.reject(new Error('no bucket')) });
    expect(await monitor.report()).toMatchObject({ up: false, services: { db: 'ok', storage: 'down', mail: 'ok' } });
  });

  it('reports a service that does not answer within the timeout as down', async () => {
    const { monitor } = setUp({ db: () => new Promise<void>(() => {}) });
    expect(await monitor.report()).toMatchObject({ up: false, services: { db: 'down' } });
  });

  it('does not keep a request waiting for a slow mail server after the first check', async () => {
    let mailCalls = 0;
    let release = () => {};
    const { monitor, advance } = setUp({
      mail: () => {
        mailCalls += 1;
        // The first check answers at once; the next one hangs until released.
        return mailCalls === 1 ? Promise.resolve() : new Promise<void>((resolve) => (release = resolve));
      },
    });
    await monitor.report();
    advance(61_000);
    const report = await monitor.report();
    expect(report.services.mail).toBe('ok');
    expect(mailCalls).toBe(2);
    release();
  });
});
