import { alloys, type Alloy, type AlloySlug, isAlloySlug } from './alloys';
import type { FilmSystemId } from './film-systems';
import { fitAnodizeLine, parabolicActivationEnergy, type AnodizeGrowth, type HeatGrowthLaw } from './growth';

/**
 * A heat-growth prior: the law, how uncertain each part of it is (one standard deviation), and
 * the temperatures its sources cover. Uncertainties are on ln(thickness) at the reference heat,
 * on the activation energy and on 1/n; they widen the predicted band when no library fit exists.
 */
export interface HeatGrowthPrior {
  law: HeatGrowthLaw;
  sd: { lnThickness: number; activationEnergyJPerMol: number; inverseExponent: number };
  /** Temperatures the prior's sources cover; predictions outside carry a warning. */
  calibratedC: { min: number; max: number };
  /** Default temperature range for the pair planner. */
  plannerC: { min: number; max: number };
  source: string;
}

/** The physical model of one alloy; null parts mean the library's coupons are the only data. */
export interface TintModel {
  alloy: Alloy;
  optics: FilmSystemId | null;
  heat: HeatGrowthPrior | null;
  anodize: AnodizeGrowth | null;
}

// --- Titanium --------------------------------------------------------------------------------
// Source: Int. J. Biomaterials 2015, article 395657, Table 1 — Ti-6Al-4V, 1 h in air:
// 500 °C → golden, 23 nm; 600 °C → blue, ≈ 50 nm (X-ray reflectometry).
const TI64_500C = { temperatureC: 500, thicknessNm: 23 };
const TI64_600C = { temperatureC: 600, thicknessNm: 50 };

/** Parabolic (d² = k·t) through the two Ti-6Al-4V points: apparent Q ≈ 87 kJ/mol. */
const titaniumLaw: HeatGrowthLaw = {
  exponent: 2,
  activationEnergyJPerMol: parabolicActivationEnergy(TI64_500C, TI64_600C),
  reference: { temperatureC: 500, holdMinutes: 60, thicknessNm: TI64_500C.thicknessNm },
};

const titaniumSource =
  'Parabolic law through Ti-6Al-4V 1 h in air at 500 °C (23 nm) and 600 °C (≈ 50 nm), Int. J. Biomaterials ' +
  '2015, 395657, Table 1; apparent Q ≈ 87 kJ/mol (thick-scale values of 190–270 kJ/mol, Mohamed et al. 2022 and ' +
  'El-Cezerî J. Sci. Eng. 2020, bound how far it may move)';

/** Ti-6Al-4V itself: the anchors are its own. ±20 % in thickness, ±20 kJ/mol in Q. */
const ti64Heat: HeatGrowthPrior = {
  law: titaniumLaw,
  sd: { lnThickness: 0.2, activationEnergyJPerMol: 20_000, inverseExponent: 0 },
  calibratedC: { min: 450, max: 650 },
  plannerC: { min: 350, max: 750 },
  source: titaniumSource,
};

/**
 * Commercially pure grades and Ti-3Al-2.5V: no thin-film kinetics of their own in the sources, so
 * the Ti-6Al-4V law with a wider spread (±35 % in thickness, ±30 kJ/mol); the library fit separates them.
 */
const otherTitaniumHeat: HeatGrowthPrior = {
  ...ti64Heat,
  sd: { lnThickness: 0.35, activationEnergyJPerMol: 30_000, inverseExponent: 0 },
  source: `${titaniumSource}; applied unchanged to this grade, with a wider spread`,
};

/**
 * Anodizing, fitted as offset + slope per volt.
 * Fitted to: Int. J. Biomaterials 2015, article 395657, Table 1 — Ti-6Al-4V anodized, thickness by
 * X-ray reflectometry: 20 V → 48 nm, 40 V → 92 nm, 60 V → 130 nm. Least squares gives 8.0 nm + 2.05 nm/V
 * (the old 2.4 nm/V through zero put 40 V at 96 nm and 60 V at 144 nm, a band early).
 * Held out for checking (tests/unit/tint/anodize.test.ts): the slopes measured by ellipsometry at low
 * potentials, 2.4–2.5 nm/V in acid and 2.8 nm/V in phosphate solutions (Ohtsuka, Masuda & Sato,
 * J. Electrochem. Soc. 132:787, 1985 [citation from memory, figures from the abstract]) and 2.7 nm/V
 * in an acetate buffer ("Investigation of thin oxide films on titanium for capacitor applications",
 * Fraunhofer-Publica N-74205, abstract), and the colour-against-voltage of practice [from memory].
 * Low and high are ±10 % on the slope: Ohtsuka's electrolytes differ by 2.4 → 2.8 nm/V (±8 %).
 */
export const TITANIUM_ANODIZE_POINTS = [
  { volts: 20, thicknessNm: 48 },
  { volts: 40, thicknessNm: 92 },
  { volts: 60, thicknessNm: 130 },
] as const;
const titaniumLine = fitAnodizeLine(TITANIUM_ANODIZE_POINTS);
const ELECTROLYTE_SPREAD = 0.1;

const titaniumAnodize: AnodizeGrowth = {
  offsetNm: titaniumLine.offsetNm,
  nmPerVolt: {
    low: titaniumLine.nmPerVolt * (1 - ELECTROLYTE_SPREAD),
    mid: titaniumLine.nmPerVolt,
    high: titaniumLine.nmPerVolt * (1 + ELECTROLYTE_SPREAD),
  },
  source:
    'Offset + slope fitted to Ti-6Al-4V anodized at 20, 40 and 60 V (48, 92, 130 nm by X-ray reflectometry; ' +
    'Int. J. Biomaterials 2015, 395657, Table 1): about 8 nm + 2.05 nm/V, ±10 % on the slope for the electrolyte ' +
    '(2.4 nm/V in acid, 2.8 nm/V in phosphate: Ohtsuka, Masuda & Sato, J. Electrochem. Soc. 132:787, 1985)',
};

// --- Carbon and tool steels --------------------------------------------------------------------
/**
 * Temper films grow far more steeply than parabolic (McAdam & Geil 1941: t ∝ dⁿ with n very large
 * for thin films). n = 5 and Q/n = 36 kJ/mol (Q = 180 kJ/mol) with 34 nm after 5 min at 260 °C were
 * chosen so a 5-minute hold at Dooley's (1919) temperatures lands in his colour words; Colvin & Juthe
 * (1922) and the Great Soviet Encyclopedia are the independent checks (tests/unit/tint).
 */
const steelLaw: HeatGrowthLaw = {
  exponent: 5,
  activationEnergyJPerMol: 180_000,
  reference: { temperatureC: 260, holdMinutes: 5, thicknessNm: 34 },
};

const steelSource =
  'Law t ∝ dⁿ (McAdam & Geil, J. Res. NBS 1941) with n = 5, Q = 180 kJ/mol, calibrated to a 5-minute hold ' +
  'against Dooley (1919) temper colours; checked against Colvin & Juthe (1922) Table 26 and the Great Soviet ' +
  'Encyclopedia';

const plainCarbonHeat: HeatGrowthPrior = {
  law: steelLaw,
  sd: { lnThickness: 0.15, activationEnergyJPerMol: 40_000, inverseExponent: 0.05 },
  calibratedC: { min: 200, max: 340 },
  plannerC: { min: 190, max: 340 },
  source: steelSource,
};

/** Alloy steels show the same colours at higher temperatures (Great Soviet Encyclopedia): wider spread. */
const alloySteelHeat: HeatGrowthPrior = {
  ...plainCarbonHeat,
  sd: { ...plainCarbonHeat.sd, lnThickness: 0.3 },
  source: `${steelSource}; alloy steels colour at higher temperatures than plain carbon steel (Great Soviet Encyclopedia, "Temper color"), so a wider spread`,
};

// --- Niobium -----------------------------------------------------------------------------------
const niobiumAnodize: AnodizeGrowth = {
  offsetNm: 0,
  nmPerVolt: { low: 2.2, mid: 2.5, high: 2.8 },
  source: 'Anodic Nb2O5 grows roughly 2.2–2.8 nm/V (from memory; no published source checked)',
};

const modelParts: Record<AlloySlug, Omit<TintModel, 'alloy'>> = {
  'ti-grade-1': { optics: 'tio2-on-titanium', heat: otherTitaniumHeat, anodize: titaniumAnodize },
  'ti-grade-2': { optics: 'tio2-on-titanium', heat: otherTitaniumHeat, anodize: titaniumAnodize },
  'ti-grade-4': { optics: 'tio2-on-titanium', heat: otherTitaniumHeat, anodize: titaniumAnodize },
  'ti-grade-5': { optics: 'tio2-on-titanium', heat: ti64Heat, anodize: titaniumAnodize },
  'ti-grade-9': { optics: 'tio2-on-titanium', heat: otherTitaniumHeat, anodize: titaniumAnodize },
  'ti-grade-23': { optics: 'tio2-on-titanium', heat: ti64Heat, anodize: titaniumAnodize },
  'steel-1084': { optics: 'iron-oxide-on-iron', heat: plainCarbonHeat, anodize: null },
  'steel-1095': { optics: 'iron-oxide-on-iron', heat: plainCarbonHeat, anodize: null },
  'steel-w2': { optics: 'iron-oxide-on-iron', heat: plainCarbonHeat, anodize: null },
  'steel-15n20': { optics: 'iron-oxide-on-iron', heat: alloySteelHeat, anodize: null },
  'steel-o1': { optics: 'iron-oxide-on-iron', heat: alloySteelHeat, anodize: null },
  'steel-52100': { optics: 'iron-oxide-on-iron', heat: alloySteelHeat, anodize: null },
  // The chromium-rich film on stainless and the cuprous oxide on copper alloys have no published
  // constants in the sources, and no kinetics: library data only.
  'steel-304': { optics: null, heat: null, anodize: null },
  'steel-316': { optics: null, heat: null, anodize: null },
  'steel-416': { optics: null, heat: null, anodize: null },
  'copper-c11000': { optics: null, heat: null, anodize: null },
  'bronze-c51000': { optics: null, heat: null, anodize: null },
  'brass-c26000': { optics: null, heat: null, anodize: null },
  // Optical constants are published for these films; their heat kinetics are not in the sources.
  'zirconium-702': { optics: 'zro2-on-zirconium', heat: null, anodize: null },
  niobium: { optics: 'nb2o5-on-niobium', heat: null, anodize: niobiumAnodize },
};

const libraryOnly = { optics: null, heat: null, anodize: null };

/**
 * Every alloy in the catalogue with its model (null parts: library data only). An alloy added to
 * the catalogue later gets library data only until it is given a model here.
 */
export const tintModels: readonly TintModel[] = alloys.map((alloy) => ({
  alloy,
  ...(isAlloySlug(alloy.slug) ? modelParts[alloy.slug] : libraryOnly),
}));

const bySlug = new Map(tintModels.map((model) => [model.alloy.slug, model]));

/** The model of an alloy by slug; undefined when the slug is not in the catalogue. */
export function findTintModel(slug: string): TintModel | undefined {
  return bySlug.get(slug);
}

export type ModelPart = 'optics' | 'heat' | 'anodize';

/** Why a model cannot answer a question, or null when it can. */
export function missingModelReason(model: TintModel, part: ModelPart): string | null {
  if (model[part]) return null;
  const what = { optics: 'optical film model', heat: 'heat-growth kinetics', anodize: 'anodizing growth rate' }[part];
  return `${model.alloy.name} has no ${what} yet: library data only.`;
}
