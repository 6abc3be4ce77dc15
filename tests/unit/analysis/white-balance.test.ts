import { describe, expect, it } from 'vitest';
import { applyMatrix, type Matrix3, type Vector3 } from '../../../src/lib/analysis/matrix3';
import { bradfordAdaptation, D65_WHITE, LINEAR_RGB_TO_XYZ, whiteBalanceMatrix } from '../../../src/lib/analysis/white-balance';
import { illuminantACast } from '../../fixtures/synthetic-photos';

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

describe('white balance from a grey card', () => {
  // Source: the defining property of a von Kries-type adaptation (von Kries' coefficient law, 1902): the
  // adapting white — here the grey card — comes out as the target white (D65 neutral), at its own luminance Y.
  it.each(['rgb-von-kries', 'bradford'] as const)('%s makes the grey neutral and keeps its luminance', (adaptation) => {
    const warmGrey: Vector3 = [0.33, 0.15, 0.042];
    const matrix = whiteBalanceMatrix(warmGrey, adaptation)!;
    const corrected = applyMatrix(matrix, warmGrey);
    const luminance = applyMatrix(LINEAR_RGB_TO_XYZ, warmGrey)[1];
    corrected.forEach((channel) => expect(channel).toBeCloseTo(luminance, 10));
  });

  it('refuses a grey with an empty channel', () => {
    expect(whiteBalanceMatrix([0.2, 0.1, 0], 'rgb-von-kries')).toBeUndefined();
  });
});

describe('the illuminant A cast of the synthetic photos', () => {
  // Source: CIE 15:2004 Table T.3 white points, A (0.44757, 0.40745) and D65 (0.31270, 0.32900), and the
  // linear sRGB luminance Y = 0.2126 R + 0.7152 G + 0.0722 B of IEC 61966-2-1: a neutral keeps Y = 1,
  // and the cast is warm (red up, blue down by about four fifths).
  it('scales linear sRGB by A relative to D65 at equal luminance', () => {
    const [red, green, blue] = illuminantACast();
    expect(0.2126 * red + 0.7152 * green + 0.0722 * blue).toBeCloseTo(1, 3);
    expect(red).toBeCloseTo(1.845, 2);
    expect(green).toBeCloseTo(0.826, 2);
    expect(blue).toBeCloseTo(0.233, 2);
  });
});
