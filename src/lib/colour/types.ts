/** The shapes colours travel in, with the zod schema beside the type it checks. */
import { z } from 'zod';

/** {l, a, b} coordinates: CIELAB with the D65 white (L* 0–100) or OKLab (L 0–1). */
export const LabSchema = z.object({ l: z.number(), a: z.number(), b: z.number() });
/** CIELAB with the D65 white. */
export type Lab = z.infer<typeof LabSchema>;
/** OKLab (Ottosson 2020): the same shape as Lab, in another space. */
export type Oklab = Lab;

/** CIE XYZ tristimulus values (scaled so the white has Y = 100 or Y = 1, as each caller says). */
export interface Xyz {
  x: number;
  y: number;
  z: number;
}

/** A colour as a screen shows it, with its true coordinates. */
export interface DisplayColour {
  /** sRGB, gamut-mapped when the true colour lies outside sRGB. */
  hex: string;
  /** CIELAB with the D65 white, of the true (unmapped) colour. */
  lab: Lab;
  /** OKLab of the true (unmapped) colour. */
  oklab: Oklab;
  /** True when sRGB cannot show the colour and `hex` is the nearest shown by chroma reduction. */
  outOfGamut: boolean;
}
