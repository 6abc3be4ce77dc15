import type { APIRoute } from 'astro';
import { alloyParamsSchema } from '~/lib/library/pair-matrix';
import { json, parseValue } from '~/lib/server/http';
import { loadPairMatrix } from '~/lib/server/library/pair-matrix';

/** The heat matrix of coupons of one alloy alone (one layer, or layers all of it) the caller may see. */
export const GET: APIRoute = async ({ params, locals }) => {
  const parsed = parseValue({ alloy: params.alloy }, alloyParamsSchema);
  if (!parsed.ok) return parsed.response;
  const matrix = await loadPairMatrix(locals.user, parsed.data.alloy);
  return json({ alloy: matrix.alloys[0], ...matrix });
};
