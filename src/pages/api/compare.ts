import type { APIRoute } from 'astro';
import { compareQueryFrom, compareQuerySchema, LAYER_MATCHING_RULE } from '~/lib/library/compare';
import { json, parseValue } from '~/lib/server/http';
import { comparisonView, loadComparison } from '~/lib/server/library/compare';

/**
 * Two to four coupons side by side, with the ΔE00 between corresponding layers. Coupons the caller
 * may not see are left out and only counted, the same as ids that name nothing.
 */
export const GET: APIRoute = async ({ url, locals }) => {
  const query = parseValue(compareQueryFrom(url.searchParams), compareQuerySchema);
  if (!query.ok) return query.response;
  const comparison = await loadComparison(locals.user, query.data.ids);
  return json({ ids: query.data.ids, layerMatching: LAYER_MATCHING_RULE, ...comparisonView(comparison) });
};
