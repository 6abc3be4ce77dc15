import { deltaE2000, type Lab } from '~/lib/colour';
import { airLnPrediction, atmosphereBasis, type ArgonFactorFit } from './atmosphere';
import type { GrowthFit } from './fit';
import { referenceColourAt, tintNameAt } from './ladder';
import type { TintModel } from './models';
import { MIN_LIBRARY_COUPONS, ModelUnavailableError, namedFilmLimitNm, NoPredictionError } from './predict';
import type { TintName } from './tint-names';
import { heatWarnings, type Atmosphere, type HeatWarning } from './warnings';

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
  /** True when the heat lies outside the temperatures a layer's data cover (only in a widened search). */
  outsideCalibrated: boolean;
  /** The warnings a single prediction of either layer would carry at this heat, each once. */
  warnings: HeatWarning[];
}

export interface PairPlanOptions {
  /** The wanted colours of the two layers (CIELAB D65); without it the planner maximises contrast. */
  target?: readonly [Lab, Lab];
  temperatureC?: Range;
  holdMinutes?: Range;
  fits?: readonly [GrowthFit | null | undefined, GrowthFit | null | undefined];
  /** Each layer's argon factor, for a heat under argon. */
  argon?: readonly [ArgonFactorFit | null | undefined, ArgonFactorFit | null | undefined];
  atmosphere?: Atmosphere;
  /** Search beyond the temperatures both layers' data cover; every suggestion out there says so. */
  widen?: boolean;
  limit?: number;
}

/** Raised when a requested temperature range leaves what both layers' data cover and no wider search was asked for. */
export class PairRangeError extends Error {}

export const DEFAULT_HOLD_MINUTES: Range = { min: 1, max: 120 };
/** For an alloy whose heat law comes from the library alone. */
const FALLBACK_TEMPERATURE_C: Range = { min: 200, max: 800 };
const TEMPERATURE_STEPS = 200;
const HOLD_STEPS = 24;
/** Two suggestions whose layers both lie within this ΔE00 of each other count as the same look. */
const SAME_LOOK_DELTA_E = 3;

/** The temperatures a layer's heat law is calibrated on: its reference data, widened by the library coupons it rests on. */
export function calibratedRange(model: TintModel, fit: GrowthFit | null | undefined): Range | null {
  const prior = model.heat?.calibratedC ?? null;
  const heatFit = fit?.heat;
  const library = heatFit && heatFit.couponCount >= MIN_LIBRARY_COUPONS ? (heatFit.temperatureSpanC ?? null) : null;
  if (prior && library) return { min: Math.min(prior.min, library.min), max: Math.max(prior.max, library.max) };
  return prior ?? library;
}

/** Temperatures both layers' data cover (null when they do not overlap). */
export function calibratedIntersection(models: readonly [TintModel, TintModel], fits?: PairPlanOptions['fits']): Range | null {
  const [a, b] = models.map((model, i) => calibratedRange(model, fits?.[i]));
  if (!a || !b) return null;
  const overlap = { min: Math.max(a.min, b.min), max: Math.min(a.max, b.max) };
  return overlap.min <= overlap.max ? overlap : null;
}

/** A wider search: the planner ranges of both layers where they overlap, or the span of both. */
export function widenedTemperatureRange(first: TintModel, second: TintModel): Range {
  const a = first.heat?.plannerC ?? FALLBACK_TEMPERATURE_C;
  const b = second.heat?.plannerC ?? FALLBACK_TEMPERATURE_C;
  const overlap = { min: Math.max(a.min, b.min), max: Math.min(a.max, b.max) };
  return overlap.min <= overlap.max ? overlap : { min: Math.min(a.min, b.min), max: Math.max(a.max, b.max) };
}

const rangeText = ({ min, max }: Range) => `${min}–${max} °C`;

/**
 * The temperatures to search: inside the intersection of both layers' calibrated ranges unless a
 * wider search is asked for. Throws PairRangeError for a requested range outside it, and
 * NoPredictionError when the layers' data share no temperature at all.
 */
export function searchRange(models: readonly [TintModel, TintModel], options: PairPlanOptions = {}): Range {
  if (options.widen) return options.temperatureC ?? widenedTemperatureRange(models[0], models[1]);
  const inside = calibratedIntersection(models, options.fits);
  const wanted = options.temperatureC;
  if (!inside) {
    const ranges = models.map((model, i) => calibratedRange(model, options.fits?.[i]));
    const covered = models.map((model, i) => `${model.alloy.name} ${ranges[i] ? rangeText(ranges[i]) : 'no range'}`).join(', ');
    if (wanted) throw new PairRangeError(`no temperature is inside both alloys' data (${covered}); ask for a wider search to look outside them`);
    throw new NoPredictionError(
      `The data of the two alloys share no temperature (${covered}), so no heat is inside what both cover. ` +
        'Ask for a wider search to see heats outside it; each will say which layer is extrapolated.',
      'no-shared-range',
      [],
    );
  }
  if (!wanted) return inside;
  if (wanted.min < inside.min || wanted.max > inside.max) {
    throw new PairRangeError(`outside the temperatures both alloys' data cover (${rangeText(inside)}); ask for a wider search to look beyond them`);
  }
  return wanted;
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

function thicknessPredictor(
  model: TintModel,
  fit: GrowthFit | null | undefined,
  atmosphere: Atmosphere,
  argon: ArgonFactorFit | null | undefined,
): (temperatureC: number, holdMinutes: number) => number {
  if (!model.heat && !(fit?.heat && fit.heat.couponCount >= MIN_LIBRARY_COUPONS)) {
    throw new ModelUnavailableError(`${model.alloy.name} has no heat-growth model yet: library data only.`);
  }
  const basis = atmosphereBasis(atmosphere, argon);
  if (basis.kind === 'none') throw new NoPredictionError(`${model.alloy.name}: ${basis.message}`, basis.reason, [], basis.argon?.coupons ?? []);
  const lnFactor = basis.kind === 'argon-factor' ? basis.fit.lnFactor : 0;
  return (temperatureC, holdMinutes) => Math.exp(airLnPrediction(model, fit, MIN_LIBRARY_COUPONS, temperatureC, holdMinutes)!.lnMean + lnFactor);
}

/** The warnings of a heat for both layers, each once, with the extrapolated layers named first. */
function pairWarnings(models: readonly [TintModel, TintModel], ranges: readonly (Range | null)[], temperatureC: number, atmosphere: Atmosphere) {
  const warnings: HeatWarning[] = [];
  models.forEach((model, i) => {
    const range = ranges[i];
    if (range && (temperatureC < range.min || temperatureC > range.max)) {
      warnings.push({
        code: 'outside-reference-range',
        message: `The data for ${model.alloy.name} cover about ${rangeText(range)}; at ${temperatureC} °C its layer is an extrapolation.`,
        source: model.heat?.source ?? 'The library fit of this alloy.',
      });
    }
  });
  const seen = new Set(warnings.map((warning) => `${warning.code}|${warning.message}`));
  for (const model of models) {
    for (const warning of heatWarnings(model, temperatureC, atmosphere)) {
      const key = `${warning.code}|${warning.message}`;
      if (seen.has(key)) continue;
      seen.add(key);
      warnings.push(warning);
    }
  }
  return warnings;
}

/**
 * Searches temperature × hold time for one heat of a two-alloy laminate whose predicted layer
 * colours best match a wanted pair, or, without a target, differ the most (ΔE00 between layers).
 * By default only inside the temperatures both layers' data cover (searchRange); every suggestion
 * carries the warnings a single prediction of each layer would, and says when it is extrapolated.
 */
export function planPair(models: readonly [TintModel, TintModel], options: PairPlanOptions = {}): PairSuggestion[] {
  for (const model of models) {
    if (!model.optics) throw new ModelUnavailableError(`${model.alloy.name} has no optical film model yet: library data only.`);
  }
  const atmosphere = options.atmosphere ?? 'air';
  const predictors = models.map((model, i) => thicknessPredictor(model, options.fits?.[i], atmosphere, options.argon?.[i]));
  const temperatures = temperatureGrid(searchRange(models, options));
  const holds = holdGrid(options.holdMinutes ?? DEFAULT_HOLD_MINUTES);
  const ranges = models.map((model, i) => calibratedRange(model, options.fits?.[i]));
  const limits = models.map(namedFilmLimitNm);
  const { target } = options;

  const scored: { temperatureC: number; holdMinutes: number; thicknesses: number[]; labs: Lab[]; score: number }[] = [];
  for (const temperatureC of temperatures) {
    for (const holdMinutes of holds) {
      const thicknesses = predictors.map((predict) => predict(temperatureC, holdMinutes));
      // A film past what the model names (steel past its temper range) has no colour to offer: not a suggestion.
      if (thicknesses.some((nm, i) => nm > limits[i])) continue;
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
  return chosen.map(({ temperatureC, holdMinutes, thicknesses, score }) => {
    const outsideCalibrated = ranges.some((range) => !range || temperatureC < range.min || temperatureC > range.max);
    return {
      temperatureC,
      holdMinutes,
      layers: models.map((model, i) => ({
        alloy: model.alloy.slug,
        hex: referenceColourAt(model.optics!, thicknesses[i]).hex,
        name: tintNameAt(model.optics!, thicknesses[i]),
        thicknessNm: Number(thicknesses[i].toFixed(1)),
      })),
      score: Number(score.toFixed(2)),
      outsideCalibrated,
      warnings: pairWarnings(models, ranges, temperatureC, atmosphere),
    };
  });
}
