import type { APIRoute, APIContext } from 'astro';
import { argonFactorFitFor } from '~/lib/server/argon-fit';
import { json, parseJson, parseValue, problem } from '~/lib/server/http';
import { queryObject, sendCached } from '~/lib/server/http-cache';
import { referencePredictionAnswer } from '~/lib/server/tint-answers';
import { libraryFitFor } from '~/lib/server/tint-fit';
import { lookUpModel, predictRequestSchema, predictResponse, type PredictRequest } from '~/lib/tint';

/**
 * The tint band of a planned heat or anodizing run. Signed-in people get the fit to their library
 * when it has enough coupons (basis "library"); visitors get the reference data. A heat under argon
 * rests on the library's argon coupons; without enough of them, and for other atmospheres, the
 * answer says plainly there is no prediction (outcome "none").
 *
 * A visitor's answer depends on the request alone: it is worked out once per process and sent with
 * an ETag. A signed-in answer depends on the library (its fit is cached per library version in
 * lib/server/tint-fit.ts) and is never kept by a cache (the middleware marks it no-store).
 */
async function answer({ request, locals }: APIContext, plan: PredictRequest, cacheControl: string): Promise<Response> {
  if (!locals.user) {
    const reference = referencePredictionAnswer(plan);
    return reference.ok
      ? sendCached(request, reference.answer, cacheControl, { vary: 'cookie' })
      : problem(reference.status, reference.message, reference.field);
  }
  const { alloy, ...rest } = plan;
  const lookup = lookUpModel(alloy, 'alloy', ['optics', rest.process === 'heat' ? 'heat' : 'anodize']);
  if (!lookup.ok) return problem(lookup.status, lookup.message, lookup.field);
  const fit = await libraryFitFor(alloy, locals.user);
  const argon = rest.process === 'heat' && rest.atmosphere === 'argon' ? await argonFactorFitFor(alloy, locals.user, fit) : null;
  return json(predictResponse(lookup.model, rest, fit, argon));
}

export const POST: APIRoute = async (context) => {
  const parsed = await parseJson(context, predictRequestSchema);
  if (!parsed.ok) return parsed.response;
  return answer(context, parsed.data, 'no-cache');
};

/** The same from the query (`?alloy=ti-grade-5&process=heat&temperatureC=400&holdMinutes=30`). */
export const GET: APIRoute = async (context) => {
  const parsed = parseValue(queryObject(context.url, ['temperatureC', 'holdMinutes', 'volts']), predictRequestSchema);
  if (!parsed.ok) return parsed.response;
  return answer(context, parsed.data, 'public, max-age=3600');
};
