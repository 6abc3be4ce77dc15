import type { APIRoute } from 'astro';
import { checkHealth } from '../../lib/server/health';
import { json } from '../../lib/server/http';

export const GET: APIRoute = async () => {
  const health = await checkHealth();
  if (health.status === 'ok') return json(health);
  const down = (['db', 'storage', 'mail'] as const).filter((service) => health[service] === 'down');
  return json({ ...health, down }, 503, { 'retry-after': '5' });
};
