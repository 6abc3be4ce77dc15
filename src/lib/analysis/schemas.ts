import { z } from 'zod';
import { LabSchema } from '~/lib/colour';

/** Most colours reported per region. */
export const MAX_SWATCHES = 5;

/** A rectangle in pixels, origin at the top-left corner of the upright image. */
export const RegionSchema = z.object({
  x: z.int().min(0),
  y: z.int().min(0),
  width: z.int().min(1),
  height: z.int().min(1),
});
export type Region = z.infer<typeof RegionSchema>;

/**
 * How the grey card's cast is removed (both are von Kries-type: scale three channels so the
 * grey's mean becomes neutral at its own luminance, then go back):
 * - `rgb-von-kries`: scale linear sRGB channels directly, like a camera's white-balance gains;
 * - `bradford`: scale in the Bradford cone space from CIE XYZ (Lam 1985, as used by ICC v4).
 */
export const AdaptationSchema = z.enum(['rgb-von-kries', 'bradford']);
export type Adaptation = z.infer<typeof AdaptationSchema>;

/** A grey card's reflectance, in percent of a perfect white (a standard card is 18 %). */
export const GreyReflectanceSchema = z
  .number({ error: 'The grey card reflectance is a number (percent).' })
  .min(3, { error: 'The grey card reflectance is at least 3 %.' })
  .max(95, { error: 'The grey card reflectance is at most 95 %.' });

export const AnalysisOptionsSchema = z.object({
  /** Regions to analyse, each on its own; none means the whole image. */
  regions: z.array(RegionSchema).max(16).default([]),
  /** A region on a neutral grey card, used to remove the colour cast. */
  grey: RegionSchema.optional(),
  /** Exact number of swatches per region; without it the count is chosen (see choose-clusters.ts). */
  k: z.int().min(1).max(MAX_SWATCHES).optional(),
  adaptation: AdaptationSchema.default('rgb-von-kries'),
  /**
   * The grey card's reflectance in percent (18 for a standard card, L* 49.5): with a grey region
   * the card is set to it, so exposure is corrected as well as the cast.
   */
  greyReflectance: GreyReflectanceSchema.default(18),
});
export type AnalysisOptions = z.input<typeof AnalysisOptionsSchema>;
export type ParsedAnalysisOptions = z.output<typeof AnalysisOptionsSchema>;

/** One extracted colour; `lab` is CIELAB under D65, `spread` the RMS OKLab distance of its pixels from it. */
export const SwatchSchema = z.object({
  hex: z.string().regex(/^#[0-9a-f]{6}$/),
  lab: LabSchema,
  oklab: LabSchema,
  share: z.number().min(0).max(1),
  spread: z.number().min(0),
});
export type Swatch = z.infer<typeof SwatchSchema>;

/** How many of a region's pixels were used, and why the others were left out. */
export const PixelCountsSchema = z.object({
  total: z.int(),
  used: z.int(),
  dark: z.int(),
  highlight: z.int(),
  transparent: z.int(),
});
export type PixelCounts = z.infer<typeof PixelCountsSchema>;

export const RegionAnalysisSchema = z.object({
  region: RegionSchema,
  swatches: z.array(SwatchSchema),
  mean: SwatchSchema.nullable(),
  pixels: PixelCountsSchema,
});
export type RegionAnalysis = z.infer<typeof RegionAnalysisSchema>;

export const WhiteBalanceSchema = z.object({
  adaptation: AdaptationSchema,
  grey: RegionSchema,
  /** The grey card's mean colour as photographed, before correction. */
  greyMean: SwatchSchema,
  /** The reflectance (percent) the card was set to. */
  greyReflectance: z.number(),
  /** The factor the photo's light was multiplied by to give the card that reflectance (1 = as photographed). */
  exposure: z.number(),
});
export type WhiteBalance = z.infer<typeof WhiteBalanceSchema>;

export const ImageAnalysisSchema = z.object({
  whiteBalance: WhiteBalanceSchema.nullable(),
  regions: z.array(RegionAnalysisSchema),
});
export type ImageAnalysis = z.infer<typeof ImageAnalysisSchema>;
