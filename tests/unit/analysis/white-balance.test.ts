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

  // Source: the nominal grey card, 18 % reflectance (Y = 0.18, CIELAB L* 49.5 per CIE 15 L* = 116·Y^(1/3) − 16);
  // with its reflectance given, the card comes out neutral at that luminance whatever the photo's exposure.
  it.each(['rgb-von-kries', 'bradford'] as const)('%s with a reflectance sets the card to it (exposure)', (adaptation) => {
    for (const scale of [0.3, 1, 2.5]) {
      const grey: Vector3 = [0.33 * scale * 0.2, 0.15 * scale * 0.2, 0.042 * scale * 0.2];
      const corrected = applyMatrix(whiteBalanceMatrix(grey, adaptation, 18)!, grey);
      corrected.forEach((channel) => expect(channel).toBeCloseTo(0.18, 10));
      expect(116 * Math.cbrt(applyMatrix(LINEAR_RGB_TO_XYZ, corrected)[1]) - 16).toBeCloseTo(49.5, 1);
    }
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
