import type { Lab } from '~/lib/colour';
import { airLnPrediction, atmosphereBasis, type ArgonCoupon, type ArgonFactorFit } from './atmosphere';
import { anodizeLineNm, type GrowthFit } from './fit';
import { colourAt, MAX_THICKNESS_NM, temperRangeEndNm, tintNameAt } from './ladder';
import type { TintModel } from './models';
import type { TintName } from './tint-names';
import { anodizeWarnings, heatWarnings, type Atmosphere, type HeatWarning } from './warnings';

export type PlannedProcess = { process: 'heat'; temperatureC: number; holdMinutes: number; atmosphere?: Atmosphere } | { process: 'anodize'; volts: number };

export interface ThicknessBand {
  low: number;
  mid: number;
  high: number;
}

export interface Prediction {
  alloy: string;
  thicknessNm: ThicknessBand;
  colour: { hex: string; lab: Lab; name: TintName };
  band: { thicknessNm: number; hex: string; name: TintName }[];
  basis: 'library' | 'reference';
  couponCount: number;
  /** The atmosphere of a heat (null for anodizing); under argon, the argon factor it rests on. */
  atmosphere: Atmosphere | null;
  argon?: { couponCount: number; factor: number; lnSd: number };
  warnings: HeatWarning[];
}

/** Coupons an alloy needs before its library fit replaces the reference prior. */
export const MIN_LIBRARY_COUPONS = 3;
/** The band is an 80 % interval: ±1.2816 standard deviations of ln(thickness). */
export const INTERVAL_Z = 1.2816;
/** Colours shown across the band, evenly spaced in ln(thickness) from low to high. */
const BAND_STEPS = 7;

/** Raised when an alloy lacks the model a question needs ("library data only"). */
export class ModelUnavailableError extends Error {}

export type NoPredictionReason = 'argon-too-few-coupons' | 'other-atmosphere' | 'past-film-range' | 'no-shared-range';

/**
 * Raised when a heat has no honest prediction: argon with too few of the library's argon coupons,
 * an atmosphere the model does not cover, or a film past the range the model describes. Carries
 * the warnings of the heat and, under argon, what the library has.
 */
export class NoPredictionError extends ModelUnavailableError {
  readonly reason: NoPredictionReason;
  readonly warnings: HeatWarning[];
  readonly argonCoupons: ArgonCoupon[];

  constructor(message: string, reason: NoPredictionReason, warnings: HeatWarning[], argonCoupons: ArgonCoupon[] = []) {
    super(message);
    this.reason = reason;
    this.warnings = warnings;
    this.argonCoupons = argonCoupons;
  }
}

const round = (value: number, places: number) => Number(value.toFixed(places));
export const roundLab = (lab: Lab, places = 2): Lab => ({ l: round(lab.l, places), a: round(lab.a, places), b: round(lab.b, places) });

function bandFromLn(lnMean: number, lnSd: number): ThicknessBand {
  return {
    low: Math.exp(lnMean - INTERVAL_Z * lnSd),
    mid: Math.exp(lnMean),
    high: Math.exp(lnMean + INTERVAL_Z * lnSd),
  };
}

type HeatPlan = Extract<PlannedProcess, { process: 'heat' }>;

/** Thickness band of a heat in air: from the library fit when it has enough coupons, else from the prior. */
function airHeatBand(model: TintModel, plan: HeatPlan, fit: GrowthFit | null | undefined) {
  const air = airLnPrediction(model, fit, MIN_LIBRARY_COUPONS, plan.temperatureC, plan.holdMinutes);
  if (!air) throw new ModelUnavailableError(`${model.alloy.name} has no heat-growth model yet: library data only.`);
  const heatFit = fit?.heat;
  const library = Boolean(heatFit && heatFit.couponCount >= MIN_LIBRARY_COUPONS);
  return { ...air, basis: library ? ('library' as const) : ('reference' as const), couponCount: library ? heatFit!.couponCount : 0 };
}

/** The band of a heat in its atmosphere: air as is, argon through the library's argon factor. */
function heatBand(model: TintModel, plan: HeatPlan, fit: GrowthFit | null | undefined, argon: ArgonFactorFit | null | undefined, warnings: HeatWarning[]) {
  const air = airHeatBand(model, plan, fit);
  const atmosphere = atmosphereBasis(plan.atmosphere, argon);
  if (atmosphere.kind === 'none') throw new NoPredictionError(atmosphere.message, atmosphere.reason, warnings, atmosphere.argon?.coupons ?? []);
  if (atmosphere.kind === 'air') return { band: bandFromLn(air.lnMean, air.lnSd), basis: air.basis, couponCount: air.couponCount };
  const { lnFactor, lnSd, lnSe, couponCount } = atmosphere.fit;
  return {
    band: bandFromLn(air.lnMean + lnFactor, Math.hypot(air.lnSd, lnSd, lnSe)),
    basis: 'library' as const,
    couponCount,
    argon: { couponCount, factor: Number(Math.exp(lnFactor).toFixed(3)), lnSd: Number(lnSd.toFixed(3)) },
  };
}

function anodizeBand(model: TintModel, volts: number, fit: GrowthFit | null | undefined) {
  if (!model.anodize) throw new ModelUnavailableError(`${model.alloy.name} has no anodizing model yet: library data only.`);
  const growth = model.anodize;
  const anodizeFit = fit?.anodize;
  if (anodizeFit && anodizeFit.couponCount >= MIN_LIBRARY_COUPONS) {
    const lnSd = Math.hypot(anodizeFit.lnSd, anodizeFit.residualSd);
    return {
      band: bandFromLn(Math.log(anodizeFit.scale * anodizeLineNm(growth, volts)), lnSd),
      basis: 'library' as const,
      couponCount: anodizeFit.couponCount,
    };
  }
  const { offsetNm, nmPerVolt } = growth;
  return {
    band: { low: offsetNm + nmPerVolt.low * volts, mid: offsetNm + nmPerVolt.mid * volts, high: offsetNm + nmPerVolt.high * volts },
    basis: 'reference' as const,
    couponCount: 0,
  };
}

/**
 * The thickest film a heat prediction names: on carbon and tool steel the end of the temper colours,
 * on other films the end of the ladder (MAX_THICKNESS_NM).
 */
export function namedFilmLimitNm(model: TintModel): number {
  if (model.alloy.family === 'carbon-steel' && model.optics) return temperRangeEndNm(model.optics);
  return MAX_THICKNESS_NM;
}

/** Why a film is past what the model describes, in the trade's words for the family. */
function pastRangeMessage(model: TintModel, thicknessNm: number, limitNm: number): string {
  const nm = Math.round(thicknessNm);
  if (model.alloy.family === 'carbon-steel') {
    return (
      `This heat is past the temper range: the model puts the film near ${nm} nm, beyond the last temper colour ` +
      `(light grey, which ends near ${Math.round(limitNm)} nm). Expect dull grey to black scale rather than a temper colour; ` +
      'the colours of thicker films are not in the handbooks.'
    );
  }
  return `The model puts the film near ${nm} nm, beyond the ${Math.round(limitNm)} nm its ladder describes: no colour is predicted for films this thick.`;
}

/**
 * The tint band of a planned heat or anodizing run: thickness low/mid/high, the colour at mid and
 * the colours across the band, which basis it rests on, and the warnings that apply.
 * Pass the alloy's library fit (fitGrowth) when there is one; without it the reference prior is used.
 * A heat under argon needs the alloy's argon factor (fitArgonFactor); without enough argon coupons, and for
 * other atmospheres, it throws NoPredictionError: never an air prediction presented as an argon one.
 */
export function predictTint(model: TintModel, plan: PlannedProcess, fit?: GrowthFit | null, argon?: ArgonFactorFit | null): Prediction {
  const optics = model.optics;
  if (!optics) throw new ModelUnavailableError(`${model.alloy.name} has no optical film model yet: library data only.`);

  const warnings = plan.process === 'heat' ? heatWarnings(model, plan.temperatureC, plan.atmosphere) : anodizeWarnings(plan.volts);
  const answer = plan.process === 'heat' ? heatBand(model, plan, fit, argon, warnings) : anodizeBand(model, plan.volts, fit);
  const { band, basis, couponCount } = answer;
  const limitNm = namedFilmLimitNm(model);
  if (band.mid > limitNm) throw new NoPredictionError(pastRangeMessage(model, band.mid, limitNm), 'past-film-range', warnings);
  if (band.high > limitNm) {
    warnings.unshift({
      code: 'past-film-range',
      message:
        model.alloy.family === 'carbon-steel'
          ? `The thick end of the band is past the temper range (films thicker than about ${Math.round(limitNm)} nm): part of the surface may scale instead of colouring.`
          : `The thick end of the band passes the ${Math.round(limitNm)} nm the ladder describes.`,
      source: 'Great Soviet Encyclopedia, "Temper color": light grey is the last temper colour; beyond it the model names no colour.',
    });
  }
  if (plan.process === 'heat' && basis === 'reference' && model.heat) {
    const { min, max } = model.heat.calibratedC;
    if (plan.temperatureC < min || plan.temperatureC > max) {
      warnings.unshift({
        code: 'outside-reference-range',
        message: `The reference data for ${model.alloy.name} cover about ${min}–${max} °C; at ${plan.temperatureC} °C the band is an extrapolation.`,
        source: model.heat.source,
      });
    }
  }

  const mid = colourAt(optics, band.mid);
  const steps = Array.from({ length: BAND_STEPS }, (_, i) => {
    const thicknessNm = Math.exp(Math.log(band.low) + (i / (BAND_STEPS - 1)) * (Math.log(band.high) - Math.log(band.low)));
    return { thicknessNm: round(thicknessNm, 1), hex: colourAt(optics, thicknessNm).hex, name: tintNameAt(optics, thicknessNm) };
  });
  return {
    alloy: model.alloy.slug,
    thicknessNm: { low: round(band.low, 1), mid: round(band.mid, 1), high: round(band.high, 1) },
    colour: { hex: mid.hex, lab: roundLab(mid.lab), name: tintNameAt(optics, band.mid) },
    band: steps,
    basis,
    couponCount,
    atmosphere: plan.process === 'heat' ? (plan.atmosphere ?? 'air') : null,
    ...('argon' in answer ? { argon: answer.argon } : {}),
    warnings,
  };
}
