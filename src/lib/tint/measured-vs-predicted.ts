import * as z from 'zod/mini';
import { deltaE2000, type Lab } from '~/lib/colour';
import { thicknessCandidates, type ThicknessCandidate } from './inverse';
import { ladderView, type LadderView } from './ladder-view';
import type { TintModel } from './models';
import { predictRequestSchema, type PredictRequest } from './planner-requests';
import type { Prediction } from './predict';
import type { Atmosphere } from './warnings';

/**
 * A coupon's measured swatch beside what the heat planner predicts for the coupon's own heat: the
 * planner's request for that heat, the swatch placed on the alloy's tint ladder (at its best
 * matching film thickness), the predicted band on the same strip, and the ΔE00 between the
 * swatch and the band's central colour.
 */

export interface CouponHeat {
  process: 'oven' | 'forge' | 'torch' | 'induction' | 'anodize';
  temperatureC: number | null;
  holdSeconds: number | null;
  volts: number | null;
  atmosphere: Atmosphere;
}

export type PlannerRequestOf = { ok: true; request: PredictRequest } | { ok: false; reason: string };

/**
 * The heat planner's request (POST /api/tint/predict) for a coupon's own heat, or why the model
 * cannot be asked: no voltage for an anodized coupon, no temperature or hold for a heat, or a
 * heat outside what the planner accepts.
 */
export function plannerRequestOf(alloy: string, coupon: CouponHeat): PlannerRequestOf {
  let raw: unknown;
  if (coupon.process === 'anodize') {
    if (coupon.volts === null) return { ok: false, reason: 'The coupon records no anodizing voltage, so the model cannot predict its tint.' };
    raw = { alloy, process: 'anodize', volts: coupon.volts };
  } else {
    const missing = [coupon.temperatureC === null && 'temperature', coupon.holdSeconds === null && 'hold time'].filter(Boolean);
    if (missing.length) return { ok: false, reason: `The coupon records no ${missing.join(' or ')}, so the model cannot predict its tint.` };
    raw = { alloy, process: 'heat', temperatureC: coupon.temperatureC, holdMinutes: coupon.holdSeconds! / 60, atmosphere: coupon.atmosphere };
  }
  const parsed = z.safeParse(predictRequestSchema, raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { ok: false, reason: `The heat planner cannot predict this heat (${issue.path.join('.')} ${issue.message}).` };
  }
  return { ok: true, request: parsed.data };
}

export interface LadderMarker {
  thicknessNm: number;
  percent: number;
  /** ΔE00 between the measured swatch and the ladder's colour at this thickness. */
  deltaE00: number;
  hex: string;
  name: string;
}

export interface PredictedBand {
  lowNm: number;
  midNm: number;
  highNm: number;
  leftPercent: number;
  widthPercent: number;
  midPercent: number;
  /** The band's central colour (at midNm). */
  hex: string;
  lab: Lab;
  name: string;
}

export interface MeasuredOnLadder {
  measured: { hex: string; lab: Lab };
  ladder: LadderView;
  /** The thickness whose colour matches the swatch best; null when nothing on the ladder comes close. */
  best: LadderMarker | null;
  /** Another matching thickness inside the predicted band, when the best one lies outside it. */
  inBand: LadderMarker | null;
  band: PredictedBand | null;
  /** ΔE00 between the measured swatch and the predicted band's central colour. */
  deltaE00: number | null;
  /** Whether the swatch's best matching thickness lies within the predicted band. */
  insideBand: boolean | null;
}

/** Thickest film the inverse searches (as thicknessCandidates does by default). */
const SEARCH_TO_NM = 400;
const MIN_STRIP_NM = 200;
const MAX_STRIP_NM = 1000;

const percentOf = (nm: number, toNm: number) => Number(((Math.min(nm, toNm) / toNm) * 100).toFixed(3));

/** The strip's length: past the best match and the band's top, in whole hundreds of nm. */
export function stripLength(...thicknessesNm: number[]): number {
  const furthest = Math.max(0, ...thicknessesNm);
  return Math.min(MAX_STRIP_NM, Math.max(MIN_STRIP_NM, Math.ceil((furthest * 1.1) / 100) * 100));
}

/**
 * A measured swatch on its alloy's tint ladder (the model must have optics), with the prediction
 * for the coupon's heat when there is one.
 */
export function measuredOnLadder(model: TintModel, measured: { hex: string; lab: Lab }, prediction: Prediction | null): MeasuredOnLadder {
  const optics = model.optics;
  if (!optics) throw new Error(`${model.alloy.name} has no optical film model`);
  const candidates = thicknessCandidates(optics, measured.lab, { maxThicknessNm: SEARCH_TO_NM });
  const [first] = candidates;
  const toNm = stripLength(first?.thicknessNm ?? 0, prediction?.thicknessNm.high ?? 0);
  const ladder = ladderView(model, 'D65', { toNm, tickStepNm: toNm > 400 ? 100 : 50, labelledTickStepNm: toNm > 400 ? 200 : 100, tableStepNm: toNm });
  const marker = (candidate: ThicknessCandidate): LadderMarker => ({ ...candidate, percent: percentOf(candidate.thicknessNm, toNm) });
  const best = first ? marker(first) : null;
  if (!prediction) return { measured, ladder, best, inBand: null, band: null, deltaE00: null, insideBand: null };

  const { low, mid, high } = prediction.thicknessNm;
  const within = (candidate: { thicknessNm: number }) => candidate.thicknessNm >= low && candidate.thicknessNm <= high;
  const insideBand = best !== null && within(best);
  const other = insideBand ? undefined : candidates.find(within);
  const leftPercent = percentOf(low, toNm);
  return {
    measured,
    ladder,
    best,
    inBand: other ? marker(other) : null,
    band: {
      lowNm: low,
      midNm: mid,
      highNm: high,
      leftPercent,
      widthPercent: Number((percentOf(high, toNm) - leftPercent).toFixed(3)),
      midPercent: percentOf(mid, toNm),
      hex: prediction.colour.hex,
      lab: prediction.colour.lab,
      name: prediction.colour.name,
    },
    deltaE00: deltaE2000(measured.lab, prediction.colour.lab),
    insideBand,
  };
}
