import { z } from 'zod';
import { problem } from './http';

/**
 * A route id exactly as we write it in URLs: digits with no leading zero, no sign, exponent, hex
 * prefix, decimal point or spaces (Number() would take all of those), and within a signed INT.
 */
const idSchema = z
  .string()
  .regex(/^[1-9][0-9]{0,9}$/)
  .transform(Number)
  .pipe(z.number().max(2 ** 31 - 1));

/** The id in a route parameter, or null when it is not one. */
export function parseRouteId(value: string | undefined): number | null {
  const parsed = idSchema.safeParse(value);
  return parsed.success ? parsed.data : null;
}

/** The numeric `[id]` of a route, or a 404 naming what was looked for. */
export function routeId(params: Record<string, string | undefined>, what: string): number | Response {
  return parseRouteId(params.id) ?? problem(404, `${what} was not found.`);
}
