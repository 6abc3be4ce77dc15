import { describe, expect, it } from 'vitest';
import { LINEAR_RGB_TO_XYZ } from '~/lib/colour';
import { applyMatrix, type Vector3 } from '~/lib/matrix';
import { whiteBalanceMatrix } from '~/lib/analysis/white-balance';
import { illuminantACast } from '../../fixtures/synthetic-photos';

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
