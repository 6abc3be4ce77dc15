import type { Oklab } from '~/lib/colour';
import type { Matrix3 } from '~/lib/matrix';
import { chooseCentres, FIT_SAMPLE_SIZE, samplePoints } from './choose-clusters';
import { assignPoints } from './kmeans';
import { collectPixels, type PixelImage } from './pixels';
import { seededRandom } from '~/lib/random';
import { AnalysisInputError, clipRegion, wholeImage } from './regions';
import {
  AnalysisOptionsSchema,
  MAX_SWATCHES,
  type AnalysisOptions,
  type ImageAnalysis,
  type Region,
  type RegionAnalysis,
  type Swatch,
  type WhiteBalance,
} from './schemas';
import { toSwatch } from './swatch';
import { exposureFactor, whiteBalanceMatrix } from './white-balance';

/** The seed every analysis starts from, so the same photo always gives the same swatches. */
const ANALYSIS_SEED = 0x0b100d;

/**
 * The colours of each region of a photo: pixels too dark or too bright are left out, the grey
 * card's cast is removed and exposure set from its known reflectance, and the rest are clustered
 * in OKLab. Same input, same output.
 */
export function analyseImage(image: PixelImage, options: AnalysisOptions = {}): ImageAnalysis {
  const { regions, grey, k, adaptation, greyReflectance } = AnalysisOptionsSchema.parse(options);
  let matrix: Matrix3 | undefined;
  let whiteBalance: WhiteBalance | null = null;
  if (grey) {
    const greyRegion = clipRegion(grey, image);
    const photographed = collectPixels(image, greyRegion);
    matrix = photographed.counts.used > 0 ? whiteBalanceMatrix(photographed.linearMean, adaptation, greyReflectance) : undefined;
    if (!matrix) {
      throw new AnalysisInputError('grey-card-unusable', 'The grey card region has no usable pixels (all too dark, too bright or one channel empty).');
    }
    const exposure = Math.round(exposureFactor(photographed.linearMean, matrix) * 1000) / 1000;
    whiteBalance = { adaptation, grey: greyRegion, greyMean: meanSwatch(photographed.oklab), greyReflectance, exposure };
  }
  const targets = regions.length > 0 ? regions : [wholeImage(image)];
  return {
    whiteBalance,
    regions: targets.map((region) => analyseRegion(image, clipRegion(region, image), matrix, k)),
  };
}

function analyseRegion(image: PixelImage, region: Region, matrix: Matrix3 | undefined, fixedK: number | undefined): RegionAnalysis {
  const { oklab, counts } = collectPixels(image, region, matrix);
  if (counts.used === 0) return { region, swatches: [], mean: null, pixels: counts };
  const random = seededRandom(ANALYSIS_SEED);
  const sample = samplePoints(oklab, FIT_SAMPLE_SIZE, random);
  const centres = chooseCentres(sample, MAX_SWATCHES, random, fixedK);
  const assignment = assignPoints(oklab, centres);
  const clusters = [];
  for (let c = 0; c < assignment.counts.length; c += 1) {
    if (assignment.counts[c] === 0) continue;
    const m = assignment.means;
    clusters.push({ centre: { l: m[c * 3], a: m[c * 3 + 1], b: m[c * 3 + 2] }, count: assignment.counts[c], meanSquare: assignment.meanSquares[c] });
  }
  const swatches = clusters
    .sort((first, second) => second.count - first.count || second.centre.l - first.centre.l)
    .map((cluster) => toSwatch(cluster.centre, cluster.count / counts.used, Math.sqrt(cluster.meanSquare)));
  return { region, swatches, mean: meanSwatch(oklab), pixels: counts };
}

/** The mean of OKLab points as a swatch with share 1 and the RMS distance about it. */
function meanSwatch(oklab: Float64Array): Swatch {
  const n = oklab.length / 3;
  const mean: Oklab = { l: 0, a: 0, b: 0 };
  for (let i = 0; i < oklab.length; i += 3) {
    mean.l += oklab[i];
    mean.a += oklab[i + 1];
    mean.b += oklab[i + 2];
  }
  mean.l /= n;
  mean.a /= n;
  mean.b /= n;
  let squares = 0;
  for (let i = 0; i < oklab.length; i += 3) squares += (oklab[i] - mean.l) ** 2 + (oklab[i + 1] - mean.a) ** 2 + (oklab[i + 2] - mean.b) ** 2;
  return toSwatch(mean, 1, Math.sqrt(squares / n));
}
