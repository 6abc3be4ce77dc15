import {
  analyseImage,
  AnalysisInputError,
  AnalysisOptionsSchema,
  clipRegion,
  scaleRegion,
  type AnalysisOptions,
  type Region,
  type RegionAnalysis,
  type WhiteBalance,
} from '~/lib/analysis';
import type { RegionInput } from '~/lib/photos';
import { Refused } from '~/lib/server/refusal';
import { decodeForAnalysis, type AnalysisImage } from './decode';

/**
 * Measuring a decoded photo's colours: the drawn regions mapped onto the shrunk analysis copy and
 * measured there (src/lib/analysis does the colour work). The upload, a region edit, the seed and
 * `npm run analyze` all measure through here, so they give the same numbers.
 */

/** The analysis of a photo; regions are in pixels of the upright full-size image. */
export interface PhotoAnalysis {
  width: number;
  height: number;
  /** Size of the shrunk copy the colours were measured on. */
  analysedWidth: number;
  analysedHeight: number;
  whiteBalance: WhiteBalance | null;
  regions: RegionAnalysis[];
}

/**
 * Analyses an already decoded photo. Regions (and the grey card) are given in pixels of the
 * upright full-size photo and mapped onto the shrunk copy; results name them as given (clipped
 * to the photo). Throws AnalysisInputError for a region outside the photo or an unusable grey card.
 */
export function analyseDecoded(image: AnalysisImage, options: AnalysisOptions = {}): PhotoAnalysis {
  const parsed = AnalysisOptionsSchema.parse(options);
  const full = { width: image.width, height: image.height };
  const toShrunk = (region: Region) => scaleRegion(region, full, image.pixels);
  const requested = parsed.regions.length > 0 ? parsed.regions.map((region) => clipRegion(region, full)) : [{ x: 0, y: 0, ...full }];
  const analysis = analyseImage(image.pixels, {
    ...parsed,
    regions: requested.map(toShrunk),
    grey: parsed.grey && toShrunk(parsed.grey),
  });
  return {
    width: image.width,
    height: image.height,
    analysedWidth: image.pixels.width,
    analysedHeight: image.pixels.height,
    whiteBalance: analysis.whiteBalance && { ...analysis.whiteBalance, grey: clipRegion(parsed.grey!, full) },
    regions: analysis.regions.map((result, index) => ({ ...result, region: requested[index] })),
  };
}

/**
 * Decodes the part of a photo that `options` measures (its regions and grey card; all of it when
 * no region is given), for analyseDecoded with the same options.
 */
export async function decodeToMeasure(buffer: Uint8Array, options: AnalysisOptions = {}): Promise<AnalysisImage> {
  const { regions, grey } = AnalysisOptionsSchema.parse(options);
  return decodeForAnalysis(buffer, regions.length > 0 ? [...regions, ...(grey ? [grey] : [])] : undefined);
}

/** Decodes and analyses a photo: what the CLI calls. */
export async function analysePhoto(buffer: Uint8Array, options: AnalysisOptions = {}): Promise<PhotoAnalysis> {
  return analyseDecoded(await decodeToMeasure(buffer, options), options);
}

/**
 * From drawn regions to the analysis: layer regions are measured each on its own, in the order
 * given, white-balanced and exposed by the grey card when there is one (at the reflectance the
 * person gave, else a standard 18 % card); with no layer region the whole photo
 * is measured (its swatches then belong to no layer). A region that cannot be measured is a 422.
 */
export function analyseRegions(image: AnalysisImage, regions: RegionInput[]): PhotoAnalysis {
  const layers = regions.filter((region) => region.kind === 'layer');
  const grey = regions.find((region) => region.kind === 'grey');
  const rectangle = ({ x, y, width, height }: RegionInput) => ({ x, y, width, height });
  try {
    const greyReflectance = grey?.kind === 'grey' ? grey.reflectance : undefined;
    return analyseDecoded(image, {
      regions: layers.map(rectangle),
      grey: grey && rectangle(grey),
      ...(greyReflectance !== undefined ? { greyReflectance } : {}),
    });
  } catch (error) {
    if (error instanceof AnalysisInputError) throw new Refused(422, error.message, 'regions');
    throw error;
  }
}
