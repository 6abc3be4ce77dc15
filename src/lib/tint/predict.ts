import type { Lab } from '~/lib/colour';
import { heatFitPrediction, heatPriorPrediction, type GrowthFit } from './fit';
import { colourAt, tintNameAt } from './ladder';
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

const round = (value: number, places: number) => Number(value.toFixed(places));
export const roundLab = (lab: Lab, places = 2): Lab => ({ l: round(lab.l, places), a: round(lab.a, places), b: round(lab.b, places) });

function bandFromLn(lnMean: number, lnSd: number): ThicknessBand {
  return {
    low: Math.exp(lnMean - INTERVAL_Z * lnSd),
    mid: Math.exp(lnMean),
    high: Math.exp(lnMean + INTERVAL_Z * lnSd),
  };
}

/** Thickness band of a heat: from the library fit when it has enough coupons, else from the prior. */
function heatBand(model: TintModel, plan: Extract<PlannedProcess, { process: 'heat' }>, fit: GrowthFit | null | undefined) {
  const heatFit = fit?.heat;
  if (heatFit && heatFit.couponCount >= MIN_LIBRARY_COUPONS) {
    const { lnMean, lnSd } = heatFitPrediction(heatFit, plan.temperatureC, plan.holdMinutes);
    return { band: bandFromLn(lnMean, lnSd), basis: 'library' as const, couponCount: heatFit.couponCount };
  }
  if (!model.heat) throw new ModelUnavailableError(`${model.alloy.name} has no heat-growth model yet: library data only.`);
  const { lnMean, lnSd } = heatPriorPrediction(model.heat, plan.temperatureC, plan.holdMinutes);
  return { band: bandFromLn(lnMean, lnSd), basis: 'reference' as const, couponCount: 0 };
}

function anodizeBand(model: TintModel, volts: number, fit: GrowthFit | null | undefined) {
  const anodizeFit = fit?.anodize;
  if (anodizeFit && anodizeFit.couponCount >= MIN_LIBRARY_COUPONS) {
    const lnSd = Math.hypot(anodizeFit.lnSd, anodizeFit.residualSd);
    return { band: bandFromLn(Math.log(anodizeFit.nmPerVolt * volts), lnSd), basis: 'library' as const, couponCount: anodizeFit.couponCount };
  }
  if (!model.anodize) throw new ModelUnavailableError(`${model.alloy.name} has no anodizing model yet: library data only.`);
  const { nmPerVolt } = model.anodize;
  return {
    band: { low: nmPerVolt.low * volts, mid: nmPerVolt.mid * volts, high: nmPerVolt.high * volts },
    basis: 'reference' as const,
    couponCount: 0,
  };
}

/**
 * The tint band of a planned heat or anodizing run: thickness low/mid/high, the colour at mid and
 * the colours across the band, which basis it rests on, and the warnings that apply.
 * Pass the alloy's library fit (fitGrowth) when there is one; without it the reference prior is used.
 */
export function predictTint(model: TintModel, plan: PlannedProcess, fit?: GrowthFit | null): Prediction {
  const optics = model.optics;
  if (!optics) throw new ModelUnavailableError(`${model.alloy.name} has no optical film model yet: library data only.`);

  const { band, basis, couponCount } = plan.process === 'heat' ? heatBand(model, plan, fit) : anodizeBand(model, plan.volts, fit);
  const warnings = plan.process === 'heat' ? heatWarnings(model, plan.temperatureC, plan.atmosphere) : anodizeWarnings(plan.volts);
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
    warnings,
  };
}
