import type { APIRoute } from 'astro';
import { colourSearchSchema } from '~/lib/library/colour-search';
import { json, parseValue } from '~/lib/server/http';
import { searchSwatches } from '~/lib/server/library/colour-search';

/** Swatches of coupons the caller may see within a ΔE00 limit of a colour, nearest first. */
export const GET: APIRoute = async (context) => {
  const query = parseValue(Object.fromEntries(context.url.searchParams), colourSearchSchema);
  if (!query.ok) return query.response;
  const hits = await searchSwatches(context.locals.user, query.data);
  return json({ hex: query.data.hex, maxDeltaE: query.data.maxDeltaE, hits });
};
