/** Oxide growth laws: heat (power law with an Arrhenius rate) and anodizing (thickness per volt). */

/** Molar gas constant, J/(mol·K) (CODATA 2018, exact). */
export const GAS_CONSTANT = 8.314462618;

export const celsiusToKelvin = (celsius: number) => celsius + 273.15;

/**
 * dⁿ = k(T)·t with k(T) = k₀·exp(−Q/RT): n = 2 is the parabolic law; a large n is the steep,
 * nearly self-limiting growth of thin temper films. Written around a reference heat
 * (the law passes through `reference`), which keeps the parameters uncorrelated for fitting:
 *   ln d = ln d_ref + (1/n)·ln(t/t_ref) − (Q/n)·(1/RT − 1/RT_ref)
 */
export interface HeatGrowthLaw {
  exponent: number;
  activationEnergyJPerMol: number;
  reference: { temperatureC: number; holdMinutes: number; thicknessNm: number };
}

/** Oxide thickness (nm) after `holdMinutes` at `temperatureC` under the law. */
export function heatThicknessNm(law: HeatGrowthLaw, temperatureC: number, holdMinutes: number): number {
  if (holdMinutes <= 0) return 0;
  const { reference } = law;
  const lnThickness =
    Math.log(reference.thicknessNm) +
    Math.log(holdMinutes / reference.holdMinutes) / law.exponent -
    (law.activationEnergyJPerMol / law.exponent) * arrheniusTerm(temperatureC, reference.temperatureC);
  return Math.exp(lnThickness);
}

/** 1/RT − 1/RT_ref, in mol/J. */
export function arrheniusTerm(temperatureC: number, referenceC: number): number {
  return 1 / (GAS_CONSTANT * celsiusToKelvin(temperatureC)) - 1 / (GAS_CONSTANT * celsiusToKelvin(referenceC));
}

/** The rate constant k(T) = dⁿ/t of the law, in nmⁿ per minute. */
export function rateConstant(law: HeatGrowthLaw, temperatureC: number): number {
  return heatThicknessNm(law, temperatureC, 1) ** law.exponent;
}

/**
 * The activation energy of a parabolic law through two heats of the same hold:
 * Q = R·ln(k₂/k₁)/(1/T₁ − 1/T₂) with k ∝ d².
 */
export function parabolicActivationEnergy(first: { temperatureC: number; thicknessNm: number }, second: { temperatureC: number; thicknessNm: number }): number {
  const lnRatio = 2 * Math.log(second.thicknessNm / first.thicknessNm);
  return (GAS_CONSTANT * lnRatio) / (1 / celsiusToKelvin(first.temperatureC) - 1 / celsiusToKelvin(second.temperatureC));
}

/**
 * Anodic oxide grows linearly with the cell voltage, d = offset + slope × V: the offset is the film
 * already there (air-formed oxide) and what forms before the field-driven growth settles.
 * `nmPerVolt.mid` is the fitted slope; low and high span the electrolyte-to-electrolyte spread.
 */
export interface AnodizeGrowth {
  offsetNm: number;
  nmPerVolt: { low: number; mid: number; high: number };
  source: string;
}

/** Film thickness (nm) at `volts` for a growth per volt and an offset (0 for a law through zero). */
export function anodizeThicknessNm(nmPerVolt: number, volts: number, offsetNm = 0): number {
  return offsetNm + nmPerVolt * volts;
}

/** Ordinary least-squares line through (volts, nm) points: the offset and slope of anodic growth. */
export function fitAnodizeLine(points: readonly { volts: number; thicknessNm: number }[]): { offsetNm: number; nmPerVolt: number; residualSdNm: number } {
  const n = points.length;
  if (n < 2) throw new Error('A line needs two points at least.');
  const meanV = points.reduce((sum, point) => sum + point.volts, 0) / n;
  const meanD = points.reduce((sum, point) => sum + point.thicknessNm, 0) / n;
  const sxx = points.reduce((sum, point) => sum + (point.volts - meanV) ** 2, 0);
  const sxy = points.reduce((sum, point) => sum + (point.volts - meanV) * (point.thicknessNm - meanD), 0);
  const nmPerVolt = sxy / sxx;
  const offsetNm = meanD - nmPerVolt * meanV;
  const squares = points.reduce((sum, point) => sum + (point.thicknessNm - offsetNm - nmPerVolt * point.volts) ** 2, 0);
  return { offsetNm, nmPerVolt, residualSdNm: n > 2 ? Math.sqrt(squares / (n - 2)) : 0 };
}
