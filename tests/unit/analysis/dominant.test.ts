// A region that holds two colours: the film and a shadow or a patch of scale. The film is read
// from the dominant cluster; the mean is a blend the metal never showed.
import { describe, expect, it } from 'vitest';
import { differenceCiede2000 } from 'culori';
import { analyseImage } from '~/lib/analysis';
import { nearestTint } from '~/lib/photo-tints';
import { GREY_CARD, renderScene } from '../../fixtures/synthetic-photos';
import { linearToHex, titaniumFilmSpectrum, tristimulus, xyzToLab, xyzToLinearRgb } from './film-spectra';

const ciede2000 = differenceCiede2000();
const distance = (first: { l: number; a: number; b: number }, second: { l: number; a: number; b: number }) =>
  ciede2000({ mode: 'lab65', ...first }, { mode: 'lab65', ...second });

describe('a titanium film with a second colour in its region (30 % of it)', () => {
  // Source: the film colour at 110 nm from the independent computation in film-spectra.ts.
  const xyz = tristimulus(titaniumFilmSpectrum(110));
  const film = { lab: xyzToLab(xyz), hex: linearToHex(xyzToLinearRgb(xyz)).hex };

  it.each([
    ['a shadow', '#2a2631'],
    ['a patch of dark scale', '#4a4440'],
    ['a bright patch of bare metal', '#b4b0aa'],
  ])('with %s: the dominant swatch is the film, the mean is not', (_name, other) => {
    const width = 300;
    const height = 200;
    const region = { x: 0, y: 0, width: 200, height };
    const scene = {
      width,
      height,
      background: film.hex,
      // Source: construction — 60 of the region's 200 columns (30 %) are the other colour; the grey card lies outside the region.
      patches: [
        { region: { x: 140, y: 0, width: 60, height }, colour: other },
        { region: { x: 220, y: 0, width: 80, height }, colour: GREY_CARD },
      ],
      noise: { sigma: 3, seed: 5 },
    };
    const [result] = analyseImage(renderScene(scene), { regions: [region], grey: { x: 220, y: 0, width: 80, height } }).regions;
    const dominant = result.swatches[0];
    expect(dominant.share).toBeCloseTo(0.7, 1);
    // Source: the known film colour; ΔE00 per Sharma, Wu & Dalal (2005).
    expect(distance(dominant.lab, film.lab)).toBeLessThan(1.5);
    expect(distance(result.mean!.lab, film.lab)).toBeGreaterThan(4);
    // The band named from the dominant swatch is the film's (±6 nm, as in exposure.test.ts).
    expect(Math.abs(nearestTint('ti-grade-2', dominant.lab)!.thicknessNm - 110)).toBeLessThanOrEqual(6);
  });
});
