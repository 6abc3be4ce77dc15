import type { APIRoute } from 'astro';
import { json, parseJson, problem } from '~/lib/server/http';
import { libraryFitFor } from '~/lib/server/tint-fit';
import { lookUpModel, planPairRequestSchema, planPairResponse } from '~/lib/tint';

/**
 * One heat for a two-alloy laminate: the best match to a wanted colour pair, or the most contrast.
 * Signed-in people get their library's fits where they have enough coupons; visitors reference data.
 */
export const POST: APIRoute = async ({ request, locals }) => {
  const parsed = await parseJson(request, planPairRequestSchema);
  if (!parsed.ok) return parsed.response;
  const [first, second] = parsed.data.alloys.map((slug, i) => lookUpModel(slug, `alloys.${i}`, ['optics', 'heat']));
  if (!first.ok) return problem(first.status, first.message, first.field);
  if (!second.ok) return problem(second.status, second.message, second.field);
  const [firstFit, secondFit] = await Promise.all(parsed.data.alloys.map((slug) => libraryFitFor(slug, locals.user)));
  return json(planPairResponse([first.model, second.model], parsed.data, [firstFit, secondFit]));
};
