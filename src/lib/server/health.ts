import { pingDatabase } from './db';
import { pingMail } from './mail';
import { pingStorage } from './storage';

export type ServiceState = 'ok' | 'down';
export type Service = 'db' | 'storage' | 'mail';
export type HealthChecks = Record<Service, () => Promise<void>>;

export interface HealthReport {
  /** Up when every backing service answered its last check. */
  up: boolean;
  services: Record<Service, ServiceState>;
  /** When the database and storage were checked. */
  checkedAt: Date;
  /** When the mail server was last checked (it is checked less often). */
  mailCheckedAt: Date;
}

export interface HealthOptions {
  /** Answers come from a report at most this old. */
  maxAgeMs: number;
  /** The mail server is asked at most this often, and never while a request waits (after the first check). */
  mailEveryMs: number;
  /** A service that hasn't answered by then is down. */
  timeoutMs: number;
  now?: () => number;
}

/** Runs a check; 'down' when it fails or hasn't answered within `ms`. */
function within(check: () => Promise<void>, ms: number): Promise<ServiceState> {
  return new Promise<ServiceState>((resolve) => {
    const timer = setTimeout(() => resolve('down'), ms);
    new Promise<void>((done) => done(check()))
      .then(
        () => 'ok' as const,
        () => 'down' as const,
      )
      .then((state) => {
        clearTimeout(timer);
        resolve(state);
      });
  });
}

/**
 * Health of the backing services for /api/health, cached: many requests at once share one check,
 * a report is reused while younger than maxAgeMs, and the SMTP server (a connection per check) is
 * checked in the background at most every mailEveryMs.
 */
export function createHealthMonitor(checks: HealthChecks, options: HealthOptions) {
  const now = options.now ?? Date.now;
  let report: HealthReport | undefined;
  let pending: Promise<HealthReport> | undefined;
  let mail: { state: ServiceState; checkedAt: number } | undefined;
  let mailPending: Promise<void> | undefined;

  function checkMail(): Promise<void> {
    mailPending ??= within(checks.mail, options.timeoutMs)
      .then((state) => {
        mail = { state, checkedAt: now() };
      })
      .finally(() => {
        mailPending = undefined;
      });
    return mailPending;
  }

  async function refresh(): Promise<HealthReport> {
    // Only the very first report waits for the mail server; later ones use its last answer.
    const firstMailCheck = mail ? undefined : checkMail();
    if (mail && now() - mail.checkedAt >= options.mailEveryMs) void checkMail();
    const [db, storage] = await Promise.all([within(checks.db, options.timeoutMs), within(checks.storage, options.timeoutMs), firstMailCheck]);
    const services = { db, storage, mail: mail!.state };
    return { up: Object.values(services).every((state) => state === 'ok'), services, checkedAt: new Date(now()), mailCheckedAt: new Date(mail!.checkedAt) };
  }

  return {
    report(): Promise<HealthReport> {
      if (report && now() - report.checkedAt.getTime() < options.maxAgeMs) return Promise.resolve(report);
      pending ??= refresh()
        .then((fresh) => (report = fresh))
        .finally(() => {
          pending = undefined;
        });
      return pending;
    },
  };
}

/** The app's monitor: reports up to 5 s old, the mail server asked once a minute, 3 s per check. */
export const health = createHealthMonitor(
  { db: pingDatabase, storage: pingStorage, mail: pingMail },
  { maxAgeMs: 5_000, mailEveryMs: 60_000, timeoutMs: 3_000 },
);
