import type { APIRoute } from 'astro';
import { argonFactorFitFor } from '~/lib/server/argon-fit';
import { json, parseJson, problem } from '~/lib/server/http';
import { libraryFitFor } from '~/lib/server/tint-fit';
import { lookUpModel, predictRequestSchema, predictResponse } from '~/lib/tint';

/**
 * The tint band of a planned heat or anodizing run. Signed-in people get the fit to their library
 * when it has enough coupons (basis "library"); visitors get the reference data. A heat under argon
 * rests on the library's argon coupons; without enough of them, and for other atmospheres, the
 * answer says plainly there is no prediction (outcome "none").
 */
export const POST: APIRoute = async ({ request, locals }) => {
  const parsed = await parseJson(request, predictRequestSchema);
  if (!parsed.ok) return parsed.response;
  const { alloy, ...plan } = parsed.data;
  const lookup = lookUpModel(alloy, 'alloy', ['optics', plan.process === 'heat' ? 'heat' : 'anodize']);
  if (!lookup.ok) return problem(lookup.status, lookup.message, lookup.field);
  const fit = await libraryFitFor(alloy, locals.user);
  const argon = plan.process === 'heat' && plan.atmosphere === 'argon' ? await argonFactorFitFor(alloy, locals.user, fit) : null;
  return json(predictResponse(lookup.model, plan, fit, argon));
};
