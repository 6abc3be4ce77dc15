import { deltaE2000, type Lab } from '~/lib/colour';
import { heatFitPrediction, heatPriorPrediction, type GrowthFit } from './fit';
import { referenceColourAt, tintNameAt } from './ladder';
import type { TintModel } from './models';
import { MIN_LIBRARY_COUPONS, ModelUnavailableError } from './predict';
import type { TintName } from './tint-names';

export interface Range {
  min: number;
  max: number;
}

export interface PairSuggestion {
  temperatureC: number;
  holdMinutes: number;
  layers: { alloy: string; hex: string; name: TintName; thicknessNm: number }[];
  /** With a target: the sum of the two layers' ΔE00 from it (lower is better); without: ΔE00 between the layers. */
  score: number;
}

export interface PairPlanOptions {
  /** The wanted colours of the two layers (CIELAB D65); without it the planner maximises contrast. */
  target?: readonly [Lab, Lab];
  temperatureC?: Range;
  holdMinutes?: Range;
  fits?: readonly [GrowthFit | null | undefined, GrowthFit | null | undefined];
  limit?: number;
}

export const DEFAULT_HOLD_MINUTES: Range = { min: 1, max: 120 };
/** For an alloy whose heat law comes from the library alone. */
const FALLBACK_TEMPERATURE_C: Range = { min: 200, max: 800 };
const TEMPERATURE_STEPS = 200;
const HOLD_STEPS = 24;
/** Two suggestions whose layers both lie within this ΔE00 of each other count as the same look. */
const SAME_LOOK_DELTA_E = 3;

/** Temperatures both layers' reference data cover, or the span of both when they do not overlap. */
export function defaultTemperatureRange(first: TintModel, second: TintModel): Range {
  const a = first.heat?.plannerC ?? FALLBACK_TEMPERATURE_C;
  const b = second.heat?.plannerC ?? FALLBACK_TEMPERATURE_C;
  const overlap = { min: Math.max(a.min, b.min), max: Math.min(a.max, b.max) };
  return overlap.min <= overlap.max ? overlap : { min: Math.min(a.min, b.min), max: Math.max(a.max, b.max) };
}

function temperatureGrid({ min, max }: Range): number[] {
  const step = Math.max(1, Math.ceil((max - min) / TEMPERATURE_STEPS));
  const values: number[] = [];
  for (let t = min; t <= max; t += step) values.push(t);
  return values;
}

/** Hold times spaced evenly in log time, rounded to what a smith would set (0.5 min under 10 min). */
function holdGrid({ min, max }: Range): number[] {
  if (min === max) return [min];
  const values = new Set<number>();
  for (let i = 0; i < HOLD_STEPS; i += 1) {
    const raw = min * (max / min) ** (i / (HOLD_STEPS - 1));
    const rounded = raw < 10 ? Math.round(raw * 2) / 2 : Math.round(raw);
    values.add(Math.min(max, Math.max(min, rounded)));
  }
  return [...values];
}

function thicknessPredictor(model: TintModel, fit: GrowthFit | null | undefined): (temperatureC: number, holdMinutes: number) => number {
  const heatFit = fit?.heat;
  if (heatFit && heatFit.couponCount >= MIN_LIBRARY_COUPONS) {
    return (temperatureC, holdMinutes) => Math.exp(heatFitPrediction(heatFit, temperatureC, holdMinutes).lnMean);
  }
  const prior = model.heat;
  if (!prior) throw new ModelUnavailableError(`${model.alloy.name} has no heat-growth model yet: library data only.`);
  return (temperatureC, holdMinutes) => Math.exp(heatPriorPrediction(prior, temperatureC, holdMinutes).lnMean);
}

/**
 * Searches temperature × hold time for one heat of a two-alloy laminate whose predicted layer
 * colours best match a wanted pair, or, without a target, differ the most (ΔE00 between layers).
 */
export function planPair(models: readonly [TintModel, TintModel], options: PairPlanOptions = {}): PairSuggestion[] {
  for (const model of models) {
    if (!model.optics) throw new ModelUnavailableError(`${model.alloy.name} has no optical film model yet: library data only.`);
  }
  const [first, second] = models;
  const predictors = [thicknessPredictor(first, options.fits?.[0]), thicknessPredictor(second, options.fits?.[1])];
  const temperatures = temperatureGrid(options.temperatureC ?? defaultTemperatureRange(first, second));
  const holds = holdGrid(options.holdMinutes ?? DEFAULT_HOLD_MINUTES);
  const { target } = options;

  const scored: { temperatureC: number; holdMinutes: number; thicknesses: number[]; labs: Lab[]; score: number }[] = [];
  for (const temperatureC of temperatures) {
    for (const holdMinutes of holds) {
      const thicknesses = predictors.map((predict) => predict(temperatureC, holdMinutes));
      const labs = models.map((model, i) => referenceColourAt(model.optics!, thicknesses[i]).lab);
      const score = target ? deltaE2000(labs[0], target[0]) + deltaE2000(labs[1], target[1]) : deltaE2000(labs[0], labs[1]);
      scored.push({ temperatureC, holdMinutes, thicknesses, labs, score });
    }
  }
  scored.sort((a, b) => (target ? a.score - b.score : b.score - a.score));

  const limit = options.limit ?? 5;
  const chosen: typeof scored = [];
  for (const candidate of scored) {
    const sameLook = chosen.some((other) => other.labs.every((lab, i) => deltaE2000(lab, candidate.labs[i]) < SAME_LOOK_DELTA_E));
    if (sameLook) continue;
    chosen.push(candidate);
    if (chosen.length === limit) break;
  }
  return chosen.map(({ temperatureC, holdMinutes, thicknesses, score }) => ({
    temperatureC,
    holdMinutes,
    layers: models.map((model, i) => ({
      alloy: model.alloy.slug,
      hex: referenceColourAt(model.optics!, thicknesses[i]).hex,
      name: tintNameAt(model.optics!, thicknesses[i]),
      thicknessNm: Number(thicknesses[i].toFixed(1)),
    })),
    score: Number(score.toFixed(2)),
  }));
}
