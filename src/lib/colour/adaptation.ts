/**
 * Chromatic adaptation: the matrix that carries a colour seen under one white to the colour that
 * looks the same under another. Hand-written: culori has Bradford only between D65 and D50.
 */
import { applyMatrix, diagonal, invertMatrix, multiplyMatrices, type Matrix3 } from '~/lib/matrix';

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

/** Von Kries scaling: each channel multiplied so `sourceWhite` becomes `targetWhite`, in whatever space both are given. */
export function scalingAdaptation(sourceWhite: readonly number[], targetWhite: readonly number[]): Matrix3 {
  return diagonal([targetWhite[0] / sourceWhite[0], targetWhite[1] / sourceWhite[1], targetWhite[2] / sourceWhite[2]]);
}

/** Bradford adaptation in XYZ (full adaptation): a colour seen under `sourceWhite` → the corresponding colour under `targetWhite`. */
export function bradfordAdaptation(sourceWhite: readonly number[], targetWhite: readonly number[]): Matrix3 {
  const gains = scalingAdaptation(applyMatrix(BRADFORD, sourceWhite), applyMatrix(BRADFORD, targetWhite));
  return multiplyMatrices(BRADFORD_INVERSE, multiplyMatrices(gains, BRADFORD));
}
