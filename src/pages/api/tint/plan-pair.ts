import type { APIRoute } from 'astro';
import { argonFactorFitFor } from '~/lib/server/argon-fit';
import { json, parseJson, problem } from '~/lib/server/http';
import { libraryFitFor } from '~/lib/server/tint-fit';
import { lookUpModel, planPairRequestSchema, planPairResponse } from '~/lib/tint';

/**
 * One heat for a two-alloy laminate: the best match to a wanted colour pair, or the most contrast,
 * inside the temperatures both alloys' data cover unless a wider search is asked for ("widen").
 * Signed-in people get their library's fits where they have enough coupons; visitors reference data.
 */
export const POST: APIRoute = async ({ request, locals }) => {
  const parsed = await parseJson({ request, locals }, planPairRequestSchema);
  if (!parsed.ok) return parsed.response;
  const [first, second] = parsed.data.alloys.map((slug, i) => lookUpModel(slug, `alloys.${i}`, ['optics', 'heat']));
  if (!first.ok) return problem(first.status, first.message, first.field);
  if (!second.ok) return problem(second.status, second.message, second.field);
  const fits = await Promise.all(parsed.data.alloys.map((slug) => libraryFitFor(slug, locals.user)));
  const argon =
    parsed.data.atmosphere === 'argon' ? await Promise.all(parsed.data.alloys.map((slug, i) => argonFactorFitFor(slug, locals.user, fits[i]))) : [null, null];
  const answer = planPairResponse([first.model, second.model], parsed.data, [fits[0], fits[1]], [argon[0], argon[1]]);
  return answer.ok ? json(answer.body) : problem(answer.status, answer.message, answer.field);
};
