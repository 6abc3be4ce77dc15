import { converter, formatHex } from 'culori';
import { describe, expect, it } from 'vitest';
import { colourFromLab, colourFromXyz65, hexToLab } from '~/lib/colour';

const toOklch = converter('oklch');
const toLrgb = converter('lrgb');

describe('display colours', () => {
  // Source: IEC 61966-2-1 (sRGB) — a colour read from an sRGB hex is inside the gamut and shows as itself.
  it.each(['#3a6ea5', '#b8954a', '#000000', '#ffffff'])('%s round-trips unmapped', (hex) => {
    const colour = colourFromLab(hexToLab(hex)!);
    expect(colour.hex).toBe(hex);
    expect(colour.outOfGamut).toBe(false);
  });

  // Source: IEC 61966-2-1 — the D65 white with Y = 1 is sRGB white (culori's D65 x, y: 0.3127, 0.3290).
  it('the D65 white is #ffffff', () => {
    expect(colourFromXyz65({ x: 0.3127 / 0.329, y: 1, z: (1 - 0.3127 - 0.329) / 0.329 }).hex).toBe('#ffffff');
  });

  // Source: W3C CSS Color Module Level 4, §13 (gamut mapping): a colour sRGB cannot show is brought in by
  // lowering its OKLCh chroma at constant lightness and hue until it lies on the gamut's edge.
  it.each([
    { l: 50, a: 110, b: 0 },
    { l: 60, a: -90, b: 60 },
    { l: 30, a: 20, b: -120 },
  ])('CIELAB %j is mapped at constant OKLab lightness and hue', (lab) => {
    const colour = colourFromLab(lab);
    expect(colour.outOfGamut).toBe(true);
    // culori, as the reference, for where the true colour and the shown hex sit in OKLCh.
    const wanted = toOklch({ mode: 'oklab', ...colour.oklab });
    const shown = toOklch(colour.hex)!;
    expect(shown.l).toBeCloseTo(wanted.l, 2);
    expect(Math.abs(((shown.h! - wanted.h! + 540) % 360) - 180)).toBeLessThan(2);
    expect(shown.c).toBeLessThan(wanted.c);
    // On the edge: one linear channel is at 0 or 1, within 8-bit rounding.
    const linear = toLrgb(colour.hex)!;
    const edge = Math.min(...[linear.r, linear.g, linear.b].map((v) => Math.min(Math.abs(v), Math.abs(1 - v))));
    expect(edge).toBeLessThan(0.01);
    expect(formatHex(shown)).toBe(colour.hex);
  });
});
