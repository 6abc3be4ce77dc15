/**
 * Conversions between sRGB, linear sRGB, CIE XYZ (D65), CIELAB (D65) and OKLab, all by culori.
 * Nothing outside src/lib/colour/ imports culori: these wrappers take and give our plain shapes.
 */
import {
  convertLab65ToRgb,
  convertLabToLch,
  convertLrgbToOklab,
  convertLrgbToRgb,
  convertOklabToRgb,
  convertRgbToLab65,
  convertRgbToLrgb,
  convertRgbToOklab,
  convertRgbToXyz65,
  convertXyz65ToLab65,
  convertXyz65ToRgb,
} from 'culori/fn';
import { applyMatrix, matrixOf, type Matrix3, type Vector3 } from '~/lib/matrix';
import type { Lab, Oklab, Xyz } from './types';

/** Gamma-encoded sRGB channels, 0–1 inside the gamut (culori's object). */
export interface Rgb {
  mode: 'rgb';
  r: number;
  g: number;
  b: number;
}

/** culori's result as our plain shape, without its mode. */
const plain = ({ l, a, b }: Lab): Lab => ({ l, a, b });

/** 8-bit sRGB code value → linear light, the sRGB transfer function of IEC 61966-2-1. */
export const SRGB8_TO_LINEAR: Float64Array = Float64Array.from({ length: 256 }, (_, code) => convertRgbToLrgb({ r: code / 255, g: 0, b: 0 }).r);

export const linearRgbToOklab = (r: number, g: number, b: number): Oklab => plain(convertLrgbToOklab({ r, g, b }));

export const oklabToRgb = (oklab: Oklab): Rgb => convertOklabToRgb(oklab) as Rgb;

/** OKLCh of an OKLab colour: chroma, and hue in degrees 0–360 (0 when there is no chroma). */
export const oklabToOklch = (oklab: Oklab): { l: number; c: number; h: number } => {
  const { l, c, h } = convertLabToLch(oklab, 'oklch');
  return { l, c, h: h ?? 0 };
};

/** CIELAB (D65) of an OKLab colour, through sRGB as culori's converter goes. */
export const oklabToLab = (oklab: Oklab): Lab => plain(convertRgbToLab65(oklabToRgb(oklab)));

export const rgbToLab = (rgb: Omit<Rgb, 'mode'>): Lab => plain(convertRgbToLab65(rgb));
export const rgbToOklab = (rgb: Omit<Rgb, 'mode'>): Oklab => plain(convertRgbToOklab(rgb));
export const labToRgb = (colour: Lab): Rgb => convertLab65ToRgb(colour) as Rgb;

/** XYZ with the D65 white at Y = 1. */
export const xyzToLab = (xyz: Xyz): Lab => plain(convertXyz65ToLab65(xyz));
export const xyzToRgb = (xyz: Xyz): Rgb => convertXyz65ToRgb(xyz) as Rgb;

/** Linear sRGB → CIE XYZ (D65, Y = 1) and back, the sRGB primaries of IEC 61966-2-1 as culori has them. */
export const LINEAR_RGB_TO_XYZ: Matrix3 = matrixOf(([r, g, b]) => {
  const { x, y, z } = convertRgbToXyz65(convertLrgbToRgb({ r, g, b }));
  return [x, y, z];
});
export const XYZ_TO_LINEAR_RGB: Matrix3 = matrixOf(([x, y, z]) => {
  const { r, g, b } = convertRgbToLrgb(convertXyz65ToRgb({ x, y, z }));
  return [r, g, b];
});

/** D65 white in CIE XYZ with Y = 1: the XYZ of linear sRGB (1, 1, 1). */
export const D65_WHITE: Vector3 = applyMatrix(LINEAR_RGB_TO_XYZ, [1, 1, 1]);
