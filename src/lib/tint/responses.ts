/** The JSON bodies of the tint routes, built from validated requests (rounded for the wire). */
import { hexToLab } from '~/lib/colour';
import type { GrowthFit } from './fit';
import { thicknessCandidates } from './inverse';
import { buildLadder } from './ladder';
import type { TintModel } from './models';
import { MIN_ARGON_COUPONS, type ArgonFactorFit } from './atmosphere';
import { PairRangeError, planPair, searchRange, type PairSuggestion, type Range } from './plan-pair';
import { MIN_LIBRARY_COUPONS, NoPredictionError, predictTint, roundLab, type NoPredictionReason, type PlannedProcess, type Prediction } from './predict';
import { requestLab, type EstimateRequest, type LadderRequest, type PlanPairRequest } from './requests';
import type { Atmosphere, HeatWarning } from './warnings';

export function ladderResponse(model: TintModel, request: LadderRequest) {
  const steps = buildLadder(model.optics!, request, request.illuminant);
  return {
    alloy: model.alloy.slug,
    illuminant: request.illuminant,
    steps: steps.map((step) => ({
      thicknessNm: step.thicknessNm,
      hex: step.hex,
      lab: roundLab(step.lab),
      oklab: roundLab(step.oklab, 4),
      name: step.name,
      outOfGamut: step.outOfGamut,
    })),
  };
}

export function estimateResponse(model: TintModel, request: EstimateRequest) {
  const candidates = thicknessCandidates(model.optics!, requestLab(request));
  return {
    alloy: model.alloy.slug,
    candidates: candidates.map((candidate) => ({ ...candidate, deltaE00: Number(candidate.deltaE00.toFixed(2)) })),
  };
}

/** Which basis the heat law of each layer rests on: the library fit when it has enough coupons. */
export function heatBasis(alloy: string, fit: GrowthFit | null | undefined) {
  const couponCount = fit?.heat?.couponCount ?? 0;
  return couponCount >= MIN_LIBRARY_COUPONS ? { alloy, basis: 'library' as const, couponCount } : { alloy, basis: 'reference' as const, couponCount: 0 };
}

/** A planned heat with no honest prediction: why, the heat's warnings and, under argon, what the library has. */
export interface NoPrediction {
  outcome: 'none';
  alloy: string;
  atmosphere: Atmosphere | null;
  reason: NoPredictionReason;
  message: string;
  warnings: HeatWarning[];
  library: { argonCoupons: NoPredictionError['argonCoupons'] };
}

export type PredictAnswer = (Prediction & { outcome: 'prediction' }) | NoPrediction;

/** The body of POST /api/tint/predict: a prediction, or plainly why there is none. */
export function predictResponse(model: TintModel, plan: PlannedProcess, fit?: GrowthFit | null, argon?: ArgonFactorFit | null): PredictAnswer {
  try {
    return { outcome: 'prediction', ...predictTint(model, plan, fit, argon) };
  } catch (error) {
    if (!(error instanceof NoPredictionError)) throw error;
    return {
      outcome: 'none',
      alloy: model.alloy.slug,
      atmosphere: plan.process === 'heat' ? (plan.atmosphere ?? 'air') : null,
      reason: error.reason,
      message: error.message,
      warnings: error.warnings,
      library: { argonCoupons: error.argonCoupons },
    };
  }
}

export interface PairAnswer {
  suggestions: PairSuggestion[];
  bases: ReturnType<typeof heatBasis>[];
  atmosphere: Atmosphere;
  /** The temperatures searched, and whether the search went beyond what both alloys' data cover. */
  search: { temperatureC: Range | null; widened: boolean };
  /** Why there are no suggestions, when the model cannot search (atmosphere, no shared range). */
  note?: string;
}

export type PairResponse = { ok: true; body: PairAnswer } | { ok: false; status: 422; message: string; field: string };

export function planPairResponse(
  models: readonly [TintModel, TintModel],
  request: PlanPairRequest,
  fits?: readonly [GrowthFit | null, GrowthFit | null],
  argon?: readonly [ArgonFactorFit | null, ArgonFactorFit | null],
): PairResponse {
  const target = request.target ? ([hexToLab(request.target[0])!, hexToLab(request.target[1])!] as const) : undefined;
  const options = {
    target,
    temperatureC: request.temperatureC,
    holdMinutes: request.holdMinutes,
    fits,
    argon,
    atmosphere: request.atmosphere ?? 'air',
    widen: request.widen ?? false,
  };
  const atmosphere = request.atmosphere ?? 'air';
  // Under argon each layer rests on its argon coupons (the air basis only scales them).
  const bases = models.map((model, i) => {
    const layerArgon = atmosphere === 'argon' ? argon?.[i] : null;
    return layerArgon && layerArgon.couponCount >= MIN_ARGON_COUPONS
      ? { alloy: model.alloy.slug, basis: 'library' as const, couponCount: layerArgon.couponCount }
      : heatBasis(model.alloy.slug, fits?.[i]);
  });
  const base = { bases, atmosphere };
  try {
    const temperatureC = searchRange(models, options);
    return { ok: true, body: { ...base, suggestions: planPair(models, options), search: { temperatureC, widened: Boolean(request.widen) } } };
  } catch (error) {
    if (error instanceof PairRangeError) return { ok: false, status: 422, message: `temperatureC: ${error.message}`, field: 'temperatureC' };
    if (error instanceof NoPredictionError) {
      return { ok: true, body: { ...base, suggestions: [], search: { temperatureC: null, widened: Boolean(request.widen) }, note: error.message } };
    }
    throw error;
  }
}
