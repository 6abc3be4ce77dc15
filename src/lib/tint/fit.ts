import type { Lab } from '~/lib/colour';
import { applyMatrix, invertMatrix, quadraticForm } from '~/lib/matrix';
import { anodizeThicknessNm, arrheniusTerm, type AnodizeGrowth, type HeatGrowthLaw } from './growth';
import { mostLikelyCandidate, thicknessCandidates } from './inverse';
import { findTintModel, type HeatGrowthPrior, type TintModel } from './models';

/** One coupon's heat record and its measured film: a thickness, or a swatch colour to invert. */
export type CouponObservation =
  | { process: 'heat'; temperatureC: number; holdMinutes: number; thicknessNm?: number; lab?: Lab; weight?: number }
  | { process: 'anodize'; volts: number; thicknessNm?: number; lab?: Lab; weight?: number };

/**
 * The heat law fitted in log space: ln d = a + b·ln(t/t_ref) + c·(1/RT_ref − 1/RT)·1000, i.e.
 * a = ln d_ref, b = 1/n, c = Q/n in kJ/mol. `covariance` is over [a, b, c] (zero rows for fixed ones).
 */
export interface HeatFit {
  law: HeatGrowthLaw;
  parameters: [number, number, number];
  covariance: number[][];
  /** Robust standard deviation of the coupons about the fit, in ln(thickness). */
  residualSd: number;
  couponCount: number;
  /** Coupons more than three robust standard deviations from the fit. */
  outlierCount: number;
  /** The coldest and hottest coupon heats the fit rests on. */
  temperatureSpanC?: { min: number; max: number };
}

/**
 * Anodic growth fitted as a scale on the published line (offset + slope per volt): a robust mean of
 * ln(d / d_law(V)), with its uncertainty and the coupon scatter. `nmPerVolt` is the scaled slope, for display.
 */
export interface AnodizeFit {
  scale: number;
  nmPerVolt: number;
  lnSd: number;
  residualSd: number;
  couponCount: number;
}

export interface GrowthFit {
  alloy: string;
  heat: HeatFit | null;
  anodize: AnodizeFit | null;
  couponCount: number;
}

/** Coupon scatter assumed before coupons are seen (sd of ln thickness) and its weight in pseudo-coupons. */
const PRIOR_SCATTER = 0.15;
const PRIOR_SCATTER_WEIGHT = 3;
/** Huber's tuning constant: residuals beyond 1.5 σ lose weight in proportion. */
const HUBER_K = 1.5;
const ITERATIONS = 30;
/** Stop when no parameter moves by more than this between iterations. */
const CONVERGED = 1e-7;
const OUTLIER_SDS = 3;
/** Spread of ln(thickness) used only to pick the interference order a prior makes most likely. */
const ORDER_CHOICE_SPREAD = 0.5;
/** Orders are searched from a fifth to five times the prior's expected thickness. */
const ORDER_SEARCH_FACTOR = 5;

/** The regressors [1, ln(t/t_ref), (1/RT_ref − 1/RT) in mol/kJ] of a heat under a law's reference. */
export function heatRegressors(law: HeatGrowthLaw, temperatureC: number, holdMinutes: number): [number, number, number] {
  const { reference } = law;
  return [1, Math.log(holdMinutes / reference.holdMinutes), -arrheniusTerm(temperatureC, reference.temperatureC) * 1000];
}

export function heatPriorParameters(prior: HeatGrowthPrior): { mean: [number, number, number]; sd: [number, number, number] } {
  const { law, sd } = prior;
  return {
    mean: [Math.log(law.reference.thicknessNm), 1 / law.exponent, law.activationEnergyJPerMol / law.exponent / 1000],
    sd: [sd.lnThickness, sd.inverseExponent, sd.activationEnergyJPerMol / law.exponent / 1000],
  };
}

interface Point {
  x: number[];
  y: number;
  weight: number;
}

/**
 * Maximum a posteriori fit of y = x·θ with a Gaussian prior on θ (parameters with zero prior sd are
 * held fixed), Huber weights against outliers and a residual scale pooled with a prior guess.
 */
function robustMapFit(points: readonly Point[], mean: readonly number[], sd: readonly number[]) {
  const free = sd.map((value, i) => (value > 0 ? i : -1)).filter((i) => i >= 0);
  const k = free.length;
  const n = points.length;
  // The free regressors and the response less the fixed parameters' part, as flat arrays.
  const xs = new Float64Array(n * k);
  const ys = new Float64Array(n);
  const weights = new Float64Array(n);
  points.forEach((point, p) => {
    let fixedPart = 0;
    point.x.forEach((value, j) => {
      if (sd[j] <= 0) fixedPart += value * mean[j];
    });
    free.forEach((i, r) => (xs[p * k + r] = point.x[i]));
    ys[p] = point.y - fixedPart;
    weights[p] = point.weight;
  });
  const huber = new Float64Array(n).fill(1);
  const residuals = new Float64Array(n);
  const beta = free.map((i) => mean[i]);
  let sigma = PRIOR_SCATTER;
  let inverse: number[][] = [];
  for (let iteration = 0; iteration < ITERATIONS; iteration += 1) {
    const normal = free.map((i, r) => free.map((_, c) => (r === c ? 1 / sd[i] ** 2 : 0)));
    const rhs = free.map((i) => mean[i] / sd[i] ** 2);
    const scale = 1 / sigma ** 2;
    for (let p = 0; p < n; p += 1) {
      const w = weights[p] * huber[p] * scale;
      for (let r = 0; r < k; r += 1) {
        const xr = xs[p * k + r] * w;
        rhs[r] += xr * ys[p];
        for (let c = 0; c < k; c += 1) normal[r][c] += xr * xs[p * k + c];
      }
    }
    inverse = invertMatrix(normal);
    const solution = applyMatrix(inverse, rhs);
    const change = Math.max(...solution.map((value, r) => Math.abs(value - beta[r])));
    solution.forEach((value, r) => (beta[r] = value));

    let weightedSquares = PRIOR_SCATTER_WEIGHT * PRIOR_SCATTER ** 2;
    let weightSum = PRIOR_SCATTER_WEIGHT;
    for (let p = 0; p < n; p += 1) {
      let fitted = 0;
      for (let r = 0; r < k; r += 1) fitted += xs[p * k + r] * beta[r];
      residuals[p] = ys[p] - fitted;
      weightedSquares += weights[p] * huber[p] * residuals[p] ** 2;
      weightSum += weights[p] * huber[p];
    }
    sigma = Math.sqrt(weightedSquares / weightSum);
    for (let p = 0; p < n; p += 1) {
      const size = Math.abs(residuals[p]);
      huber[p] = size <= HUBER_K * sigma ? 1 : (HUBER_K * sigma) / size;
    }
    if (change < CONVERGED) break;
  }
  const theta = [...mean];
  free.forEach((i, r) => (theta[i] = beta[r]));
  const covariance = mean.map(() => mean.map(() => 0));
  free.forEach((i, r) => free.forEach((j, c) => (covariance[i][j] = inverse[r][c])));
  let outlierCount = 0;
  for (let p = 0; p < n; p += 1) if (Math.abs(residuals[p]) > OUTLIER_SDS * sigma) outlierCount += 1;
  return { theta, covariance, sigma, outlierCount };
}

/** The thickness of a coupon: measured, or from its colour at the order the prior expects. */
function observedThickness(model: TintModel, thicknessNm: number | undefined, lab: Lab | undefined, expectedNm: number) {
  if (thicknessNm !== undefined) return thicknessNm > 0 ? { thicknessNm, match: 1 } : undefined;
  if (!lab || !model.optics) return undefined;
  const candidates = thicknessCandidates(model.optics, lab, {
    maxDeltaE00: 15,
    minThicknessNm: expectedNm / ORDER_SEARCH_FACTOR,
    maxThicknessNm: Math.min(400, expectedNm * ORDER_SEARCH_FACTOR),
    refineBest: 2,
    refineWindowNm: 1,
  });
  const chosen = mostLikelyCandidate(candidates, expectedNm, ORDER_CHOICE_SPREAD);
  if (!chosen || chosen.thicknessNm <= 0) return undefined;
  return { thicknessNm: chosen.thicknessNm, match: 1 / (1 + (chosen.deltaE00 / 5) ** 2) };
}

function fitHeat(model: TintModel, prior: HeatGrowthPrior, observations: readonly CouponObservation[]): HeatFit | null {
  const { mean, sd } = heatPriorParameters(prior);
  const points: Point[] = [];
  const span = { min: Infinity, max: -Infinity };
  for (const observation of observations) {
    if (observation.process !== 'heat' || !(observation.holdMinutes > 0)) continue;
    const x = heatRegressors(prior.law, observation.temperatureC, observation.holdMinutes);
    const expectedNm = Math.exp(x[0] * mean[0] + x[1] * mean[1] + x[2] * mean[2]);
    const observed = observedThickness(model, observation.thicknessNm, observation.lab, expectedNm);
    if (!observed) continue;
    points.push({ x, y: Math.log(observed.thicknessNm), weight: (observation.weight ?? 1) * observed.match });
    span.min = Math.min(span.min, observation.temperatureC);
    span.max = Math.max(span.max, observation.temperatureC);
  }
  if (points.length === 0) return null;
  const { theta, covariance, sigma, outlierCount } = robustMapFit(points, mean, sd);
  const [a, b, c] = theta;
  return {
    law: {
      exponent: 1 / b,
      activationEnergyJPerMol: (c * 1000) / b,
      reference: { ...prior.law.reference, thicknessNm: Math.exp(a) },
    },
    parameters: [a, b, c],
    covariance,
    residualSd: sigma,
    couponCount: points.length,
    outlierCount,
    temperatureSpanC: span,
  };
}

/** The published slope range is read as an 80 % interval (±1.2816 σ) of ln(scale) on the line. */
export function anodizePrior(growth: AnodizeGrowth): { lnMean: number; lnSd: number } {
  return {
    lnMean: 0,
    lnSd: Math.log(growth.nmPerVolt.high / growth.nmPerVolt.low) / (2 * 1.2816),
  };
}

/** The thickness the published line gives at a voltage. */
export const anodizeLineNm = (growth: AnodizeGrowth, volts: number) => anodizeThicknessNm(growth.nmPerVolt.mid, volts, growth.offsetNm);

function fitAnodize(model: TintModel, growth: AnodizeGrowth, observations: readonly CouponObservation[]): AnodizeFit | null {
  const { lnMean, lnSd } = anodizePrior(growth);
  const points: Point[] = [];
  for (const observation of observations) {
    if (observation.process !== 'anodize' || !(observation.volts > 0)) continue;
    const expectedNm = anodizeLineNm(growth, observation.volts);
    const observed = observedThickness(model, observation.thicknessNm, observation.lab, expectedNm);
    if (!observed) continue;
    points.push({ x: [1], y: Math.log(observed.thicknessNm / expectedNm), weight: (observation.weight ?? 1) * observed.match });
  }
  if (points.length === 0) return null;
  const { theta, covariance, sigma } = robustMapFit(points, [lnMean], [lnSd]);
  const scale = Math.exp(theta[0]);
  return { scale, nmPerVolt: scale * growth.nmPerVolt.mid, lnSd: Math.sqrt(covariance[0][0]), residualSd: sigma, couponCount: points.length };
}

/**
 * Fits an alloy's growth laws to its coupons: the heat law's ln d_ref, Q (and n where the prior
 * lets it move) and the growth per volt, each pulled towards the published prior, robust to
 * outliers, keeping the residual spread for prediction intervals.
 */
export function fitGrowth(alloy: string | TintModel, observations: readonly CouponObservation[]): GrowthFit {
  const model = typeof alloy === 'string' ? findTintModel(alloy) : alloy;
  if (!model) throw new Error(`Unknown alloy: ${String(alloy)}`);
  const heat = model.heat ? fitHeat(model, model.heat, observations) : null;
  const anodize = model.anodize ? fitAnodize(model, model.anodize, observations) : null;
  return {
    alloy: model.alloy.slug,
    heat,
    anodize,
    couponCount: (heat?.couponCount ?? 0) + (anodize?.couponCount ?? 0),
  };
}

/** Predicted ln(thickness) of a heat under a fit: mean and standard deviation (parameters + coupon scatter). */
export function heatFitPrediction(fit: HeatFit, temperatureC: number, holdMinutes: number): { lnMean: number; lnSd: number } {
  const x = heatRegressors(fit.law, temperatureC, holdMinutes);
  const lnMean = x.reduce((sum, value, j) => sum + value * fit.parameters[j], 0);
  return { lnMean, lnSd: Math.sqrt(quadraticForm(fit.covariance, x) + fit.residualSd ** 2) };
}

/** The same from the prior alone: its stated uncertainties already include coupon-to-coupon scatter. */
export function heatPriorPrediction(prior: HeatGrowthPrior, temperatureC: number, holdMinutes: number): { lnMean: number; lnSd: number } {
  const { mean, sd } = heatPriorParameters(prior);
  const x = heatRegressors(prior.law, temperatureC, holdMinutes);
  const lnMean = x.reduce((sum, value, j) => sum + value * mean[j], 0);
  const variance = x.reduce((sum, value, j) => sum + (value * sd[j]) ** 2, 0);
  return { lnMean, lnSd: Math.sqrt(variance) };
}
