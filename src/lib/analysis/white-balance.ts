import { converter } from 'culori';
import type { Adaptation } from './schemas';
import { applyMatrix, diagonal, invertMatrix, matrixOf, multiplyMatrices, type Matrix3, type Vector3 } from './matrix3';

/**
 * The Bradford cone-response matrix (Lam 1985; the linearised form used for chromatic
 * adaptation in ICC.1 v4, Annex E — values from memory, checked in the tests against the
 * D65→D50 matrix of W3C CSS Color 4).
 */
export const BRADFORD: Matrix3 = [
  [0.8951, 0.2664, -0.1614],
  [-0.7502, 1.7135, 0.0367],
  [0.0389, -0.0685, 1.0296],
];
const BRADFORD_INVERSE = invertMatrix(BRADFORD);

const toXyz65 = converter('xyz65');
const toLinearRgb = converter('lrgb');

/** Linear sRGB → CIE XYZ (D65) and back, the sRGB primaries of IEC 61966-2-1 as culori has them. */
export const LINEAR_RGB_TO_XYZ: Matrix3 = matrixOf(([r, g, b]) => {
  const { x, y, z } = toXyz65({ mode: 'lrgb', r, g, b });
  return [x, y, z];
});
export const XYZ_TO_LINEAR_RGB: Matrix3 = matrixOf(([x, y, z]) => {
  const { r, g, b } = toLinearRgb({ mode: 'xyz65', x, y, z });
  return [r, g, b];
});

/** D65 white in CIE XYZ with Y = 1: the XYZ of linear sRGB (1, 1, 1). */
export const D65_WHITE: Vector3 = applyMatrix(LINEAR_RGB_TO_XYZ, [1, 1, 1]);

/** Bradford adaptation in XYZ: a colour seen under `sourceWhite` → the corresponding colour under `targetWhite`. */
export function bradfordAdaptation(sourceWhite: Vector3, targetWhite: Vector3): Matrix3 {
  const source = applyMatrix(BRADFORD, sourceWhite);
  const target = applyMatrix(BRADFORD, targetWhite);
  const gains = diagonal([target[0] / source[0], target[1] / source[1], target[2] / source[2]]);
  return multiplyMatrices(BRADFORD_INVERSE, multiplyMatrices(gains, BRADFORD));
}

/**
 * The linear-sRGB matrix that makes the grey card's mean neutral (D65) at its own luminance,
 * so exposure is left as photographed. Undefined when a channel of the grey is zero.
 */
export function whiteBalanceMatrix(greyMean: Vector3, adaptation: Adaptation): Matrix3 | undefined {
  if (greyMean.some((channel) => !(channel > 0))) return undefined;
  const greyXyz = applyMatrix(LINEAR_RGB_TO_XYZ, greyMean);
  const luminance = greyXyz[1];
  if (adaptation === 'rgb-von-kries') {
    return diagonal([luminance / greyMean[0], luminance / greyMean[1], luminance / greyMean[2]]);
  }
  const targetWhite: Vector3 = [D65_WHITE[0] * luminance, D65_WHITE[1] * luminance, D65_WHITE[2] * luminance];
  const adapt = bradfordAdaptation(greyXyz, targetWhite);
  return multiplyMatrices(XYZ_TO_LINEAR_RGB, multiplyMatrices(adapt, LINEAR_RGB_TO_XYZ));
}
