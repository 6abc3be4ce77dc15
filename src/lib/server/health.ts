import { pingDatabase } from './db';
import { pingMail } from './mail';
import { pingStorage } from './storage';

export type ServiceState = 'ok' | 'down';
export interface Health {
  status: 'ok' | 'degraded';
  db: ServiceState;
  storage: ServiceState;
  mail: ServiceState;
}

const within = <T>(promise: Promise<T>, ms: number) =>
  Promise.race([promise, new Promise<never>((_, reject) => setTimeout(() => reject(new Error('timeout')), ms))]);

const state = (result: PromiseSettledResult<unknown>): ServiceState => (result.status === 'fulfilled' ? 'ok' : 'down');

/** Checks each backing service with a short timeout. */
export async function checkHealth(timeoutMs = 3000): Promise<Health> {
  const [db, storage, mail] = await Promise.allSettled([
    within(pingDatabase(), timeoutMs),
    within(pingStorage(), timeoutMs),
    within(pingMail(), timeoutMs),
  ]);
  const result = { db: state(db), storage: state(storage), mail: state(mail) };
  const healthy = Object.values(result).every((value) => value === 'ok');
  return { status: healthy ? 'ok' : 'degraded', ...result };
}
