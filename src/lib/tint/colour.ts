import {
  convertLab65ToRgb,
  convertOklabToRgb,
  convertRgbToLab65,
  convertRgbToOklab,
  convertXyz65ToLab65,
  convertXyz65ToRgb,
  formatHex,
  modeLab65,
  modeLrgb,
  modeOklab,
  modeRgb,
  useMode,
} from 'culori/fn';
import { bradfordAdaptation, scaleWhite } from './adaptation';
import { whitePoint, type Xyz } from './colorimetry';
import type { Illuminant } from './illuminants';

useMode(modeRgb);
useMode(modeLrgb);
useMode(modeOklab);
useMode(modeLab65);

/** CIELAB (D65 white) or OKLab coordinates, both written {l, a, b}. */
export interface Lab {
  l: number;
  a: number;
  b: number;
}

export interface TintColour {
  /** sRGB, gamut-mapped when the true colour lies outside sRGB. */
  hex: string;
  /** CIELAB with the D65 white, of the true (unmapped) colour. */
  lab: Lab;
  /** OKLab of the true (unmapped) colour. */
  oklab: Lab;
  /** True when sRGB cannot show the colour and `hex` is the nearest shown by chroma reduction. */
  outOfGamut: boolean;
}

/**
 * culori's D65 white (x = 0.3127, y = 0.3290, as in IEC 61966-2-1), Y = 100. The 5 nm tables give
 * (95.043, 100, 108.880); a per-channel scale maps one onto the other so a perfect reflector is
 * exactly L* = 100, a* = b* = 0 and #ffffff.
 */
const SRGB_WHITE: Xyz = { x: (100 * 0.3127) / 0.329, y: 100, z: (100 * (1 - 0.3127 - 0.329)) / 0.329 };

/**
 * Under illuminant A the colour is shown as an eye fully adapted to that warm light sees it
 * (Bradford adaptation from A's white to D65's), then expressed in D65 CIELAB and sRGB.
 */
const toSrgbWhite: Record<Illuminant, (xyz: Xyz) => Xyz> = {
  D65: scaleWhite(whitePoint('D65'), SRGB_WHITE),
  A: (() => {
    const adapt = bradfordAdaptation(whitePoint('A'), whitePoint('D65'));
    const scale = scaleWhite(whitePoint('D65'), SRGB_WHITE);
    return (xyz: Xyz) => scale(adapt(xyz));
  })(),
};

const GAMUT_SLACK = 1e-4;
const CHROMA_SEARCH_STEPS = 16;

interface Rgb {
  mode: 'rgb';
  r: number;
  g: number;
  b: number;
}

const isInSrgb = ({ r, g, b }: Rgb) =>
  r >= -GAMUT_SLACK && r <= 1 + GAMUT_SLACK && g >= -GAMUT_SLACK && g <= 1 + GAMUT_SLACK && b >= -GAMUT_SLACK && b <= 1 + GAMUT_SLACK;

/**
 * OKLab → linear sRGB (Ottosson 2020, the matrices culori uses), inlined so the gamut search below
 * does no allocation; a colour is inside sRGB exactly when its linear channels are in [0, 1].
 */
function oklabIsInSrgb(l: number, a: number, b: number): boolean {
  const lms = [
    (l + 0.3963377773761749 * a + 0.2158037573099136 * b) ** 3,
    (l - 0.1055613458156586 * a - 0.0638541728258133 * b) ** 3,
    (l - 0.0894841775298119 * a - 1.2914855480194092 * b) ** 3,
  ];
  const r = 4.0767416621 * lms[0] - 3.3077115913 * lms[1] + 0.2309699292 * lms[2];
  const g = -1.2684380046 * lms[0] + 2.6097574011 * lms[1] - 0.3413193965 * lms[2];
  const bl = -0.0041960863 * lms[0] - 0.7034186147 * lms[1] + 1.707614701 * lms[2];
  return r >= -GAMUT_SLACK && r <= 1 + GAMUT_SLACK && g >= -GAMUT_SLACK && g <= 1 + GAMUT_SLACK && bl >= -GAMUT_SLACK && bl <= 1 + GAMUT_SLACK;
}

/**
 * Gamut mapping by chroma reduction at constant OKLab lightness and hue (the approach of CSS Color 4
 * and culori's clampChroma): a binary search for the largest chroma sRGB can show.
 */
function mapIntoSrgb(oklab: Lab): Rgb {
  if (oklab.l >= 1) return { mode: 'rgb', r: 1, g: 1, b: 1 };
  if (oklab.l <= 0) return { mode: 'rgb', r: 0, g: 0, b: 0 };
  let inside = 0;
  let outside = 1;
  for (let i = 0; i < CHROMA_SEARCH_STEPS; i += 1) {
    const scale = (inside + outside) / 2;
    if (oklabIsInSrgb(oklab.l, oklab.a * scale, oklab.b * scale)) inside = scale;
    else outside = scale;
  }
  const mapped = convertOklabToRgb({ l: oklab.l, a: oklab.a * inside, b: oklab.b * inside }) as Rgb;
  const clamp = (value: number) => Math.min(1, Math.max(0, value));
  return { mode: 'rgb', r: clamp(mapped.r), g: clamp(mapped.g), b: clamp(mapped.b) };
}

function displayRgb(rgb: Rgb, oklab: Lab): { hex: string; outOfGamut: boolean } {
  if (isInSrgb(rgb)) return { hex: formatHex(rgb), outOfGamut: false };
  return { hex: formatHex(mapIntoSrgb(oklab)), outOfGamut: true };
}

/** The display colour of tristimulus values (Y = 100 white) seen under the given illuminant. */
export function colourFromXyz(xyz: Xyz, illuminant: Illuminant): TintColour {
  const adapted = toSrgbWhite[illuminant](xyz);
  const unit = { mode: 'xyz65' as const, x: adapted.x / 100, y: adapted.y / 100, z: adapted.z / 100 };
  const { l, a, b } = convertXyz65ToLab65(unit);
  const rgb = convertXyz65ToRgb(unit) as Rgb;
  const ok = convertRgbToOklab(rgb);
  const oklab = { l: ok.l, a: ok.a, b: ok.b };
  return { ...displayRgb(rgb, oklab), lab: { l, a, b }, oklab };
}

/** A measured CIELAB (D65) colour as display colour. */
export function colourFromLab(lab: Lab): TintColour {
  const rgb = convertLab65ToRgb({ l: lab.l, a: lab.a, b: lab.b }) as Rgb;
  const ok = convertRgbToOklab(rgb);
  const oklab = { l: ok.l, a: ok.a, b: ok.b };
  return { ...displayRgb(rgb, oklab), lab: { ...lab }, oklab };
}

const HEX = /^#?([0-9a-f]{3}|[0-9a-f]{6})$/i;

export function isHexColour(value: string): boolean {
  return HEX.test(value);
}

/** CIELAB (D65) of an sRGB hex colour (#rgb or #rrggbb); undefined when malformed. */
export function hexToLab(hex: string): Lab | undefined {
  const match = HEX.exec(hex.trim());
  if (!match) return undefined;
  const digits = match[1].length === 3 ? [...match[1]].map((d) => d + d).join('') : match[1];
  const channel = (i: number) => parseInt(digits.slice(i * 2, i * 2 + 2), 16) / 255;
  const { l, a, b } = convertRgbToLab65({ r: channel(0), g: channel(1), b: channel(2) });
  return { l, a, b };
}
