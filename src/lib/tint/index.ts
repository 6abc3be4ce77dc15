/** The tint science: pure, framework-free; safe to import from islands and routes alike. */
export { alloys, alloyFamilies, findAlloy, isAlloySlug, type Alloy, type AlloyFamily, type AlloySlug } from './alloys';
export { tintModels, findTintModel, missingModelReason, type TintModel, type HeatGrowthPrior } from './models';
export { illuminants, type Illuminant } from './illuminants';
export { filmSystems, type FilmSystemId } from './film-systems';
export { familyLabels, ladderAlloyOptions, plannerAlloyOptions, type AlloyOption, type AlloyOptionGroup } from './alloy-options';
export { ladderView, type LadderView, type LadderBand, type LadderTick, type LadderTableStep } from './ladder-view';
export { buildLadder, colourAt, tintNameAt, MAX_THICKNESS_NM, type LadderStep } from './ladder';
export { tintNames, type TintName } from './tint-names';
export { heatThicknessNm, anodizeThicknessNm, type HeatGrowthLaw } from './growth';
export { fahrenheitToCelsius, celsiusToFahrenheit } from '~/lib/units';
export { thicknessCandidates, type ThicknessCandidate } from './inverse';
export { fitGrowth, type CouponObservation, type GrowthFit } from './fit';
export { predictTint, ModelUnavailableError, NoPredictionError, MIN_LIBRARY_COUPONS, type PlannedProcess, type Prediction } from './predict';
export { fitArgonFactor, atmosphereBasis, MIN_ARGON_COUPONS, type ArgonFactorFit, type ArgonCoupon } from './atmosphere';
export { planPair, PairRangeError, type PairSuggestion } from './plan-pair';
export { heatWarnings, anodizeWarnings, type HeatWarning } from './warnings';
export * from './requests';
export {
  ladderResponse,
  estimateResponse,
  planPairResponse,
  predictResponse,
  heatBasis,
  type PredictAnswer,
  type PairAnswer,
  type NoPrediction,
} from './responses';
