import type { APIRoute } from 'astro';
import { health } from '~/lib/server/health';
import { json } from '~/lib/server/http';

/**
 * Up or down, from a report a few seconds old (lib/server/health.ts): enough for a load balancer.
 * A signed-in admin also sees each service and when it was checked.
 */
export const GET: APIRoute = async ({ locals }) => {
  const report = await health.report();
  const status = report.up ? 'up' : 'down';
  const body =
    locals.user?.role === 'admin'
      ? { status, services: report.services, checkedAt: report.checkedAt.toISOString(), mailCheckedAt: report.mailCheckedAt.toISOString() }
      : { status };
  return json(body, report.up ? 200 : 503, { 'cache-control': 'no-store', ...(report.up ? {} : { 'retry-after': '5' }) });
};
