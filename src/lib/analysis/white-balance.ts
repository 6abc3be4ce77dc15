import { bradfordAdaptation, D65_WHITE, LINEAR_RGB_TO_XYZ, scalingAdaptation, XYZ_TO_LINEAR_RGB } from '~/lib/colour';
import { applyMatrix, multiplyMatrices, type Matrix3, type Vector3 } from '~/lib/matrix';
import type { Adaptation } from './schemas';

/** The reflectance of a standard grey card: 18 % (CIELAB L* 49.5), the photographic mid-grey. */
export const NOMINAL_GREY_REFLECTANCE_PERCENT = 18;

/**
 * The linear-sRGB matrix that makes the grey card's mean neutral (D65) and sets exposure: the
 * card comes out at its known luminance Y = `reflectancePercent` / 100, so colours are absolute
 * reflectances as the tint model computes them. Without `reflectancePercent` the card keeps the
 * luminance it was photographed at (white balance only). Undefined when a channel of the grey is zero.
 */
export function whiteBalanceMatrix(greyMean: Vector3, adaptation: Adaptation, reflectancePercent?: number): Matrix3 | undefined {
  if (greyMean.some((channel) => !(channel > 0))) return undefined;
  const greyXyz = applyMatrix(LINEAR_RGB_TO_XYZ, greyMean);
  const luminance = reflectancePercent === undefined ? greyXyz[1] : reflectancePercent / 100;
  if (adaptation === 'rgb-von-kries') return scalingAdaptation(greyMean, [luminance, luminance, luminance]);
  const targetWhite: Vector3 = [D65_WHITE[0] * luminance, D65_WHITE[1] * luminance, D65_WHITE[2] * luminance];
  const adapt = bradfordAdaptation(greyXyz, targetWhite);
  return multiplyMatrices(XYZ_TO_LINEAR_RGB, multiplyMatrices(adapt, LINEAR_RGB_TO_XYZ));
}

/** The exposure a matrix applied: the factor by which it scaled the grey card's luminance. */
export function exposureFactor(greyMean: Vector3, matrix: Matrix3): number {
  const before = applyMatrix(LINEAR_RGB_TO_XYZ, greyMean)[1];
  const after = applyMatrix(LINEAR_RGB_TO_XYZ, applyMatrix(matrix, greyMean))[1];
  return after / before;
}
