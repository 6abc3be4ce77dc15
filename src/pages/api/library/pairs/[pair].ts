import type { APIRoute } from 'astro';
import { pairParamsSchema } from '~/lib/library/pair-matrix';
import { json, parseValue } from '~/lib/server/http';
import { loadPairMatrix } from '~/lib/server/library/pair-matrix';

/**
 * The heat matrix of an alloy pair (`a+b`, either order; °C, holds in seconds) over the coupons the
 * caller may see, with the model's band per cell. The same alloy twice is refused (400): one alloy
 * has its own matrix at /api/library/alloys/{a}.
 */
export const GET: APIRoute = async ({ params, locals }) => {
  const parsed = parseValue({ pair: params.pair }, pairParamsSchema);
  if (!parsed.ok) return parsed.response;
  const matrix = await loadPairMatrix(locals.user, parsed.data.pair);
  return json({ pair: matrix.alloys, ...matrix });
};
