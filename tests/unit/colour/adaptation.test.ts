import { describe, expect, it } from 'vitest';
import { bradfordAdaptation, D65_WHITE } from '~/lib/colour';
import { applyMatrix, type Matrix3, type Vector3 } from '~/lib/matrix';

const whiteFromChromaticity = (x: number, y: number): Vector3 => [x / y, 1, (1 - x - y) / y];

function expectMatrixClose(actual: Matrix3, expected: number[][], digits: number) {
  for (let row = 0; row < 3; row += 1) {
    for (let column = 0; column < 3; column += 1) expect(actual[row][column]).toBeCloseTo(expected[row][column], digits);
  }
}

describe('Bradford chromatic adaptation', () => {
  // Source: W3C CSS Color Module Level 4, sample code for colour conversions, the Bradford D65→D50 matrix
  // (whites from x, y: D65 0.3127, 0.3290; D50 0.3457, 0.3585). Values from memory; they agree with
  // culori's convertXyz65ToXyz50 to 1e-7.
  it('reproduces the published D65 → D50 matrix', () => {
    const matrix = bradfordAdaptation(whiteFromChromaticity(0.3127, 0.329), whiteFromChromaticity(0.3457, 0.3585));
    expectMatrixClose(
      matrix,
      [
        [1.0479297925449969, 0.022946870601609652, -0.05019226628920524],
        [0.02962780877005599, 0.9904344267538799, -0.017073799063418826],
        [-0.009243040646204504, 0.015055191490298152, 0.7518742814281371],
      ],
      5,
    );
  });

  // Source: ICC.1:2010 §7.2.16, PCS illuminant (D50) X = 0.9642, Y = 1.0, Z = 0.8249.
  it('carries the D65 white onto the ICC D50 white', () => {
    const iccD50: Vector3 = [0.9642, 1, 0.8249];
    const adapted = applyMatrix(bradfordAdaptation(D65_WHITE, iccD50), D65_WHITE);
    adapted.forEach((value, axis) => expect(value).toBeCloseTo(iccD50[axis], 10));
  });
});
