import {
  ladderResponse,
  ladderView,
  lookUpModel,
  predictResponse,
  type Illuminant,
  type LadderRequest,
  type LadderView,
  type PredictRequest,
  type TintModel,
} from '~/lib/tint';
import { BoundedCache, cachedJson, requestKey, type CachedBody } from './http-cache';

/**
 * The tint routes' answers that depend on nothing but their request: the tint ladder and the
 * reference-only prediction a visitor gets (no library fit, no argon fit). Each is worked out once
 * per process, keyed by the request as validated (defaults filled in, keys in one order), and kept
 * with its ETag; a bounded cache, so a stream of distinct requests cannot grow memory.
 */
const ladders = new BoundedCache<string, CachedBody>(256);
const predictions = new BoundedCache<string, CachedBody>(1024);

export type CachedAnswer = { ok: true; answer: CachedBody } | { ok: false; status: number; message: string; field: string };

export function ladderAnswer(request: LadderRequest): CachedAnswer {
  const lookup = lookUpModel(request.alloy, 'alloy', ['optics']);
  if (!lookup.ok) return { ok: false, status: lookup.status, message: lookup.message, field: lookup.field };
  return { ok: true, answer: ladders.remember(requestKey(request), () => cachedJson(ladderResponse(lookup.model, request))) };
}

/** The reference-data prediction (a visitor's): no fit of anyone's library is involved. */
export function referencePredictionAnswer(request: PredictRequest): CachedAnswer {
  const { alloy, ...plan } = request;
  const lookup = lookUpModel(alloy, 'alloy', ['optics', plan.process === 'heat' ? 'heat' : 'anodize']);
  if (!lookup.ok) return { ok: false, status: lookup.status, message: lookup.message, field: lookup.field };
  return { ok: true, answer: predictions.remember(requestKey(request), () => cachedJson(predictResponse(lookup.model, plan, null, null))) };
}

/** The two strips of the tint ladder page: the whole ladder, and the first orders in detail. */
const DETAIL = { toNm: 200, drawStepNm: 1, tickStepNm: 10, labelledTickStepNm: 50 };
const ladderViews = new BoundedCache<string, { view: LadderView; detail: LadderView }>(64);

export function ladderPageViews(model: TintModel, illuminant: Illuminant): { view: LadderView; detail: LadderView } {
  return ladderViews.remember(`${model.alloy.slug}\n${illuminant}`, () => ({
    view: ladderView(model, illuminant),
    detail: ladderView(model, illuminant, DETAIL),
  }));
}
