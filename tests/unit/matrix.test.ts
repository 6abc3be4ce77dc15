import { describe, expect, it } from 'vitest';
import { applyMatrix, invertMatrix, multiplyMatrices, quadraticForm, type Matrix3 } from '~/lib/matrix';
import { BRADFORD } from '~/lib/colour';

describe('the inverse of a small matrix', () => {
  // Source: B. Lindbloom, "Chromatic Adaptation", the inverse Bradford matrix to seven decimals (from memory).
  it('inverts the Bradford cone-response matrix', () => {
    const expected = [
      [0.9869929, -0.1470543, 0.1599627],
      [0.4323053, 0.5183603, 0.0492912],
      [-0.0085287, 0.0400428, 0.9684867],
    ];
    const inverse = invertMatrix(BRADFORD);
    inverse.forEach((row, i) => row.forEach((value, j) => expect(value).toBeCloseTo(expected[i][j], 6)));
    // Source: the definition of the inverse, M·M⁻¹ = I.
    multiplyMatrices(BRADFORD, inverse).forEach((row, i) => row.forEach((value, j) => expect(value).toBeCloseTo(i === j ? 1 : 0, 12)));
  });

  // Source: the 2×2 inverse by its adjugate, [[a, b], [c, d]]⁻¹ = [[d, −b], [−c, a]] / (ad − bc); 1×1 is 1/a.
  it('inverts 2×2 and 1×1 matrices, as the growth fit uses them', () => {
    const inverse = invertMatrix([
      [4, 7],
      [2, 6],
    ]);
    [
      [0.6, -0.7],
      [-0.2, 0.4],
    ].forEach((row, i) => row.forEach((value, j) => expect(inverse[i][j]).toBeCloseTo(value, 12)));
    expect(invertMatrix([[8]])[0][0]).toBe(0.125);
  });

  it('needs a pivot swap for a zero on the diagonal', () => {
    const swap: Matrix3 = [
      [0, 1, 0],
      [1, 0, 0],
      [0, 0, 2],
    ];
    // Source: a permutation matrix is its own inverse; a diagonal entry d inverts to 1/d.
    expect(invertMatrix(swap)).toEqual([
      [0, 1, 0],
      [1, 0, 0],
      [0, 0, 0.5],
    ]);
  });

  it('refuses a singular matrix', () => {
    expect(() =>
      invertMatrix([
        [1, 2],
        [2, 4],
      ]),
    ).toThrow(RangeError);
  });

  // Source: xᵀMx written out for a 2×2 matrix, a·x₀² + (b + c)·x₀x₁ + d·x₁².
  it('the quadratic form and the product with a vector', () => {
    expect(
      quadraticForm(
        [
          [2, 1],
          [3, 4],
        ],
        [5, 7],
      ),
    ).toBe(2 * 25 + 4 * 35 + 4 * 49);
    expect(
      applyMatrix(
        [
          [2, 1],
          [3, 4],
        ],
        [5, 7],
      ),
    ).toEqual([17, 43]);
  });
});
