import type { APIRoute } from 'astro';
import { json, parseJson, problem } from '../../../lib/server/http';
import { lookUpModel, predictRequestSchema, predictTint } from '../../../lib/tint';

/** The tint band of a planned heat or anodizing run (reference priors until the library fit is wired in). */
export const POST: APIRoute = async ({ request }) => {
  const parsed = await parseJson(request, predictRequestSchema);
  if (!parsed.ok) return parsed.response;
  const { alloy, ...plan } = parsed.data;
  const lookup = lookUpModel(alloy, 'alloy', ['optics', plan.process === 'heat' ? 'heat' : 'anodize']);
  if (!lookup.ok) return problem(lookup.status, lookup.message, lookup.field);
  return json(predictTint(lookup.model, plan));
};
