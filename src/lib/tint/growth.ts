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

/** Anodic oxide grows linearly with the cell voltage: d = growth-per-volt × V. */
export interface AnodizeGrowth {
  nmPerVolt: { low: number; mid: number; high: number };
  source: string;
}

export function anodizeThicknessNm(nmPerVolt: number, volts: number): number {
  return nmPerVolt * volts;
}
