import { bradfordAdaptation, D65_WHITE, LINEAR_RGB_TO_XYZ, scalingAdaptation, XYZ_TO_LINEAR_RGB } from '~/lib/colour';
import { applyMatrix, multiplyMatrices, type Matrix3, type Vector3 } from '~/lib/matrix';
import type { Adaptation } from './schemas';

/**
 * The linear-sRGB matrix that makes the grey card's mean neutral (D65) at its own luminance,
 * so exposure is left as photographed. Undefined when a channel of the grey is zero.
 */
export function whiteBalanceMatrix(greyMean: Vector3, adaptation: Adaptation): Matrix3 | undefined {
  if (greyMean.some((channel) => !(channel > 0))) return undefined;
  const greyXyz = applyMatrix(LINEAR_RGB_TO_XYZ, greyMean);
  const luminance = greyXyz[1];
  if (adaptation === 'rgb-von-kries') return scalingAdaptation(greyMean, [luminance, luminance, luminance]);
  const targetWhite: Vector3 = [D65_WHITE[0] * luminance, D65_WHITE[1] * luminance, D65_WHITE[2] * luminance];
  const adapt = bradfordAdaptation(greyXyz, targetWhite);
  return multiplyMatrices(XYZ_TO_LINEAR_RGB, multiplyMatrices(adapt, LINEAR_RGB_TO_XYZ));
}
