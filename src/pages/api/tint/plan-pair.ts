import type { APIRoute } from 'astro';
import { json, parseJson, problem } from '../../../lib/server/http';
import { lookUpModel, planPairRequestSchema, planPairResponse } from '../../../lib/tint';

/** One heat for a two-alloy laminate: the best match to a wanted colour pair, or the most contrast. */
export const POST: APIRoute = async ({ request }) => {
  const parsed = await parseJson(request, planPairRequestSchema);
  if (!parsed.ok) return parsed.response;
  const [first, second] = parsed.data.alloys.map((slug, i) => lookUpModel(slug, `alloys.${i}`, ['optics', 'heat']));
  if (!first.ok) return problem(first.status, first.message, first.field);
  if (!second.ok) return problem(second.status, second.message, second.field);
  return json(planPairResponse([first.model, second.model], parsed.data));
};
