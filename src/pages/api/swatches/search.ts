import type { APIRoute } from 'astro';
import { colourSearchSchema } from '~/lib/library/colour-search';
import { json, parseValue } from '~/lib/server/http';
import { searchSwatches } from '~/lib/server/library/colour-search';

/**
 * Swatches of coupons the caller may see within a ΔE00 limit of a colour, nearest first. Each hit's
 * `deltaE00` is to the swatch's stored CIELAB (`lab`); its `hex` is that colour rounded to sRGB, so a
 * swatch's own hex searched finds it a few tenths away, not at 0.
 */
export const GET: APIRoute = async (context) => {
  const query = parseValue(Object.fromEntries(context.url.searchParams), colourSearchSchema);
  if (!query.ok) return query.response;
  const hits = await searchSwatches(context.locals.user, query.data);
  return json({ hex: query.data.hex, maxDeltaE: query.data.maxDeltaE, hits });
};
