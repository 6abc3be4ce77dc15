import { colourFromLab } from '~/lib/colour';
import { heatFitPrediction, heatPriorPrediction, type CouponObservation, type GrowthFit } from './fit';
import { thicknessCandidates } from './inverse';
import type { TintModel } from './models';
import type { Atmosphere } from './warnings';

/**
 * How the furnace atmosphere enters the model.
 *
 * Every published source behind the heat laws (models.ts) is a heat in air. A good argon purge
 * keeps oxygen from the surface, which stays nearly bright; how bright depends on the purge, the
 * can and the gas, so no published factor applies. Under argon the prediction therefore rests on
 * the library's own argon coupons of the alloy: a thickness factor relative to air,
 * ln(d_argon / d_air), fitted with its own coupon count and spread. With too few coupons there is
 * no argon prediction, only what the library has. Other atmospheres (a forge's reducing flame,
 * nitrogen, a salt bath, a vacuum of unknown quality) get no prediction at all.
 */

/** Argon coupons an alloy needs before its thickness factor is used (as for the air fit). */
export const MIN_ARGON_COUPONS = 3;
/** Scatter of ln(thickness) assumed before coupons are seen, and its weight in pseudo-coupons (as in fit.ts). */
const PRIOR_SCATTER = 0.15;
const PRIOR_SCATTER_WEIGHT = 3;
/** A coupon read as bare metal counts as this thin a film (nm): ln(0) has no place in a mean. */
const BRIGHT_FILM_NM = 2;
/** Candidates worse than this ΔE00 from the coupon's colour are not read as its film. */
const MATCH_DELTA_E = 15;

export interface ArgonCoupon {
  temperatureC: number;
  holdMinutes: number;
  /** Film read from the coupon: its measured thickness or the thinnest film matching its colour. */
  thicknessNm: number;
  /** What the same heat gives in air, on the air basis (library fit or reference). */
  airNm: number;
  hex: string | null;
}

/** The thickness factor of argon relative to air for one alloy, fitted to the library's argon coupons. */
export interface ArgonFactorFit {
  alloy: string;
  couponCount: number;
  /** Mean of ln(d_argon / d_air) over the coupons. */
  lnFactor: number;
  /** Coupon-to-coupon spread of ln(d_argon / d_air), pooled with a prior guess of 0.15. */
  lnSd: number;
  /** Standard error of lnFactor. */
  lnSe: number;
  coupons: ArgonCoupon[];
}

/** ln(thickness) in air of a heat: mean and standard deviation, from the library fit when it has enough coupons. */
export function airLnPrediction(model: TintModel, fit: GrowthFit | null | undefined, minCoupons: number, temperatureC: number, holdMinutes: number) {
  const heatFit = fit?.heat;
  if (heatFit && heatFit.couponCount >= minCoupons) return heatFitPrediction(heatFit, temperatureC, holdMinutes);
  if (!model.heat) return null;
  return heatPriorPrediction(model.heat, temperatureC, holdMinutes);
}

/**
 * The film of an argon coupon: a measured thickness, or the thinnest film whose colour matches the
 * coupon's (a purged surface is read at its first order: a purge keeps films thin, and a second-order
 * colour under argon would mean the purge failed, which the spread then shows).
 */
function argonFilmNm(model: TintModel, observation: Extract<CouponObservation, { process: 'heat' }>): number | null {
  if (observation.thicknessNm !== undefined) return Math.max(BRIGHT_FILM_NM, observation.thicknessNm);
  if (!observation.lab || !model.optics) return null;
  const candidates = thicknessCandidates(model.optics, observation.lab, { maxDeltaE00: MATCH_DELTA_E });
  if (candidates.length === 0 || candidates[0].deltaE00 > MATCH_DELTA_E) return null;
  const thinnest = candidates.reduce((best, candidate) => (candidate.thicknessNm < best.thicknessNm ? candidate : best));
  return Math.max(BRIGHT_FILM_NM, thinnest.thicknessNm);
}

/**
 * Fits the argon factor of an alloy from its argon coupons (heats with temperature and hold),
 * relative to what the same heats give in air on the air basis (`airFit` when it has enough coupons).
 */
export function fitArgonFactor(
  model: TintModel,
  observations: readonly CouponObservation[],
  airFit: GrowthFit | null | undefined,
  minAirCoupons: number,
): ArgonFactorFit {
  const coupons: ArgonCoupon[] = [];
  for (const observation of observations) {
    if (observation.process !== 'heat' || !(observation.holdMinutes > 0)) continue;
    const air = airLnPrediction(model, airFit, minAirCoupons, observation.temperatureC, observation.holdMinutes);
    const film = argonFilmNm(model, observation);
    if (!air || film === null) continue;
    coupons.push({
      temperatureC: observation.temperatureC,
      holdMinutes: observation.holdMinutes,
      thicknessNm: Number(film.toFixed(1)),
      airNm: Number(Math.exp(air.lnMean).toFixed(1)),
      hex: observation.lab ? colourFromLab(observation.lab).hex : null,
    });
  }
  const ratios = coupons.map((coupon) => Math.log(coupon.thicknessNm / coupon.airNm));
  const n = ratios.length;
  const lnFactor = n > 0 ? ratios.reduce((sum, value) => sum + value, 0) / n : 0;
  const squares = ratios.reduce((sum, value) => sum + (value - lnFactor) ** 2, 0);
  const lnSd = Math.sqrt((squares + PRIOR_SCATTER_WEIGHT * PRIOR_SCATTER ** 2) / (Math.max(0, n - 1) + PRIOR_SCATTER_WEIGHT));
  return { alloy: model.alloy.slug, couponCount: n, lnFactor, lnSd, lnSe: n > 0 ? lnSd / Math.sqrt(n) : Infinity, coupons };
}

export type AtmosphereBasis =
  | { kind: 'air' }
  | { kind: 'argon-factor'; fit: ArgonFactorFit }
  | { kind: 'none'; reason: 'argon-too-few-coupons' | 'other-atmosphere'; message: string; argon: ArgonFactorFit | null };

export const ARGON_TOO_FEW_MESSAGE =
  'The reference data cover heats in air only. A good argon purge leaves little or no tint: the protected surface stays ' +
  'nearly bright and the colour comes later, from the air. Log argon coupons of this alloy to get a prediction from your own heats.';

export const OTHER_ATMOSPHERE_MESSAGE =
  'No prediction for this atmosphere: the reference data cover heats in air only, and how much oxygen reaches the surface in ' +
  'a flame, a salt bath, nitrogen or a vacuum depends on the setup. Log coupons of your own heats in the library.';

/** On what a heat's prediction can rest in an atmosphere; `argon` is the alloy's argon factor fit, if any. */
export function atmosphereBasis(atmosphere: Atmosphere = 'air', argon?: ArgonFactorFit | null): AtmosphereBasis {
  if (atmosphere === 'air') return { kind: 'air' };
  if (atmosphere === 'other') return { kind: 'none', reason: 'other-atmosphere', message: OTHER_ATMOSPHERE_MESSAGE, argon: null };
  if (argon && argon.couponCount >= MIN_ARGON_COUPONS) return { kind: 'argon-factor', fit: argon };
  const count = argon?.couponCount ?? 0;
  const has =
    count === 0
      ? 'The library has no argon coupons of this alloy yet.'
      : `The library has ${count} argon coupon${count === 1 ? '' : 's'} of this alloy (${MIN_ARGON_COUPONS} are needed).`;
  return { kind: 'none', reason: 'argon-too-few-coupons', message: `${ARGON_TOO_FEW_MESSAGE} ${has}`, argon: argon ?? null };
}
