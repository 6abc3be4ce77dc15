import type { APIRoute } from 'astro';
import { json, parseJson, problem } from '~/lib/server/http';
import { ladderRequestSchema, ladderResponse, lookUpModel } from '~/lib/tint';

/** The tint ladder of an alloy: colour and tint band against oxide thickness. */
export const POST: APIRoute = async ({ request }) => {
  const parsed = await parseJson(request, ladderRequestSchema);
  if (!parsed.ok) return parsed.response;
  const lookup = lookUpModel(parsed.data.alloy, 'alloy', ['optics']);
  if (!lookup.ok) return problem(lookup.status, lookup.message, lookup.field);
  return json(ladderResponse(lookup.model, parsed.data));
};
