/** The JSON bodies of the tint routes, built from validated requests (rounded for the wire). */
import { hexToLab } from '~/lib/colour';
import type { GrowthFit } from './fit';
import { thicknessCandidates } from './inverse';
import { buildLadder } from './ladder';
import type { TintModel } from './models';
import { planPair, type PairSuggestion } from './plan-pair';
import { MIN_LIBRARY_COUPONS, roundLab } from './predict';
import { requestLab, type EstimateRequest, type LadderRequest, type PlanPairRequest } from './requests';

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

export function planPairResponse(
  models: readonly [TintModel, TintModel],
  request: PlanPairRequest,
  fits?: readonly [GrowthFit | null, GrowthFit | null],
): { suggestions: PairSuggestion[]; bases: ReturnType<typeof heatBasis>[] } {
  const target = request.target ? ([hexToLab(request.target[0])!, hexToLab(request.target[1])!] as const) : undefined;
  return {
    suggestions: planPair(models, {
      target,
      temperatureC: request.temperatureC,
      holdMinutes: request.holdMinutes,
      fits,
    }),
    bases: models.map((model, i) => heatBasis(model.alloy.slug, fits?.[i])),
  };
}
