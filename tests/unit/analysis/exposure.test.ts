// Exposure from the grey card: a photo taken too dark still reads as the film it shows. The film
// colours come from an independent computation (film-spectra.ts: Airy reflectance and CIE sums),
// the darkening is a known factor in linear light (what a shorter exposure does to a linear sensor).
import { describe, expect, it } from 'vitest';
import { converter, differenceCiede2000 } from 'culori';
import { analyseImage } from '~/lib/analysis';
import { filmCandidates } from '~/lib/photo-tints';
import { couponScene, renderScene } from '../../fixtures/synthetic-photos';
import { linearToHex, titaniumFilmSpectrum, tristimulus, xyzToLab, xyzToLinearRgb } from './film-spectra';

const ciede2000 = differenceCiede2000();
const lab65 = (lab: { l: number; a: number; b: number }) => ({ mode: 'lab65' as const, ...lab });
const toLinear = converter('lrgb');

/** Y (white = 1) of a CIELAB lightness, inverting CIE 15:2004 eq. 8.1. */
const lightnessToY = (l: number) => (l > 8 ? ((l + 16) / 116) ** 3 : l / 903.3);

/** A film of known thickness on titanium, photographed `darkerBy` L* too dark, with an 18 % grey card in the same light. */
function darkPhoto(thicknessNm: number, darkerBy: number, card = { hex: '#767676', percent: 18 }) {
  const xyz = tristimulus(titaniumFilmSpectrum(thicknessNm));
  const lab = xyzToLab(xyz);
  const { hex, clipped } = linearToHex(xyzToLinearRgb(xyz));
  // The factor on linear light that lowers the film's L* by `darkerBy`.
  const factor = lightnessToY(lab.l - darkerBy) / xyz.y;
  const { scene, layers, grey } = couponScene(600, 400, [hex, hex], {
    background: '#303030',
    patches: [],
    cast: [factor, factor, factor],
    noise: { sigma: 2, seed: thicknessNm },
  });
  scene.patches = [...layers, { region: grey, colour: card.hex }];
  return { image: renderScene(scene), region: layers[0].region, grey, lab, clipped, factor };
}

describe('a photo 20 L* too dark, with a grey card (titanium, TiO2 film)', () => {
  // Source: the reported cases — 110 nm read as 23 nm and 140 nm as 36 nm with the photo 20 L* too
  // dark. Tolerance ±6 nm: about the step of the model's coarse search plus the 8-bit rounding of a
  // photo three times darker than it should be (our choice, stated here).
  it.each([110, 140])('%i nm reads within ±6 nm of itself once exposure is set from the card', (thicknessNm) => {
    const photo = darkPhoto(thicknessNm, 20);
    expect(photo.clipped).toBe(false); // the film's colour is inside sRGB, so the photo holds it exactly
    const result = analyseImage(photo.image, { regions: [photo.region], grey: photo.grey });
    // Source: construction — the card (18 %) was photographed at factor × 18 %, so the exposure is 1 / factor (±2 % for 8-bit rounding and noise).
    expect(result.whiteBalance!.exposure).toBeGreaterThan((1 / photo.factor) * 0.98);
    expect(result.whiteBalance!.exposure).toBeLessThan((1 / photo.factor) * 1.02);
    const measured = result.regions[0].swatches[0].lab;
    // Source: the independently computed film colour (film-spectra.ts); ΔE00 per Sharma, Wu & Dalal (2005).
    expect(ciede2000(lab65(photo.lab), lab65(measured))).toBeLessThan(1.5);
    const [best] = filmCandidates('ti-grade-2', measured, 'absolute');
    expect(Math.abs(best.thicknessNm - thicknessNm)).toBeLessThanOrEqual(6);
  });

  // Source: the same construction, read without the card — the failure the card fixes: the film
  // comes out 20 L* too dark and the absolute match lands on another film (here, under half as thick).
  it.each([110, 140])('%i nm without the card is 20 L* too dark and reads as another film', (thicknessNm) => {
    const photo = darkPhoto(thicknessNm, 20);
    const measured = analyseImage(photo.image, { regions: [photo.region] }).regions[0].swatches[0].lab;
    expect(photo.lab.l - measured.l).toBeGreaterThan(18);
    const [best] = filmCandidates('ti-grade-2', measured, 'absolute');
    expect(Math.abs(best.thicknessNm - thicknessNm)).toBeGreaterThan(20);
  });

  it('takes another card’s reflectance when it is given, and reads wrong with the wrong one', () => {
    // Source: construction — a 30 % card encodes to linear sRGB 0.30 on every channel (IEC 61966-2-1).
    const thirty = converter('rgb')({ mode: 'lrgb', r: 0.3, g: 0.3, b: 0.3 });
    const hex = `#${[thirty.r, thirty.g, thirty.b]
      .map((v) =>
        Math.round(v * 255)
          .toString(16)
          .padStart(2, '0'),
      )
      .join('')}`;
    expect(toLinear(hex)!.g).toBeCloseTo(0.3, 2);
    const photo = darkPhoto(110, 20, { hex, percent: 30 });
    const right = analyseImage(photo.image, { regions: [photo.region], grey: photo.grey, greyReflectance: 30 }).regions[0].swatches[0].lab;
    expect(ciede2000(lab65(photo.lab), lab65(right))).toBeLessThan(1.5);
    const wrong = analyseImage(photo.image, { regions: [photo.region], grey: photo.grey }).regions[0].swatches[0].lab;
    // Taken as an 18 % card, a 30 % card sets exposure 18/30 too low: L* falls by several units.
    expect(photo.lab.l - wrong.l).toBeGreaterThan(5);
  });
});
