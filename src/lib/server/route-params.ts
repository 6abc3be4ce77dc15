import { z } from 'zod';
import { parseValue, problem } from './http';

const idParams = z.object({ id: z.coerce.number().int().positive().max(2 ** 31 - 1) });

/** The numeric `[id]` of a route, or a 404 naming what was looked for. */
export function routeId(params: Record<string, string | undefined>, what: string): number | Response {
  const parsed = parseValue(params, idParams);
  return parsed.ok ? parsed.data.id : problem(404, `${what} was not found.`);
}
