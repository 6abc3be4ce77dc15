import type { APIRoute } from 'astro';
import { json, parseJson, problem } from '~/lib/server/http';
import { estimateRequestSchema, estimateResponse, lookUpModel } from '~/lib/tint';

/** Candidate oxide thicknesses for a measured colour, one per interference order that fits, best first. */
export const POST: APIRoute = async ({ request, locals }) => {
  const parsed = await parseJson({ request, locals }, estimateRequestSchema);
  if (!parsed.ok) return parsed.response;
  const lookup = lookUpModel(parsed.data.alloy, 'alloy', ['optics']);
  if (!lookup.ok) return problem(lookup.status, lookup.message, lookup.field);
  return json(estimateResponse(lookup.model, parsed.data));
};
