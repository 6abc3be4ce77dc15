import sharp from 'sharp';
import type { PixelImage } from '../../analysis';
import type { RegionInput } from '../../photos';
import { analyseDecoded, AnalysisInputError, type AnalysisImage, type PhotoAnalysis } from './decode';
import { Refused } from '../refusal';

/**
 * From drawn regions to the analysis and back: layer regions are measured each on its own, in
 * the order given, white-balanced by the grey card when there is one; with no layer region the
 * whole photo is measured (its swatches then belong to no layer).
 */
export function analyseRegions(image: AnalysisImage, regions: RegionInput[]): PhotoAnalysis {
  const layers = regions.filter((region) => region.kind === 'layer');
  const grey = regions.find((region) => region.kind === 'grey');
  const rectangle = ({ x, y, width, height }: RegionInput) => ({ x, y, width, height });
  try {
    return analyseDecoded(image, { regions: layers.map(rectangle), grey: grey && rectangle(grey) });
  } catch (error) {
    if (error instanceof AnalysisInputError) throw new Refused(422, error.message, 'regions');
    throw error;
  }
}

/**
 * The shrunk copy colours are measured on, as a lossless PNG: stored beside the photo, it gives
 * a region edit exactly the numbers a fresh decode of the original would, without the decode.
 */
export async function encodeAnalysisImage(image: AnalysisImage): Promise<Buffer> {
  const { data, width, height, channels } = image.pixels;
  return sharp(data, { raw: { width, height, channels } }).png({ compressionLevel: 6 }).toBuffer();
}

export async function decodeAnalysisImage(png: Uint8Array, fullSize: { width: number; height: number }): Promise<AnalysisImage> {
  const { data, info } = await sharp(png).raw().toBuffer({ resolveWithObject: true });
  const pixels: PixelImage = { data: new Uint8Array(data.buffer, data.byteOffset, data.length), width: info.width, height: info.height, channels: info.channels as 3 | 4 };
  return { ...fullSize, pixels };
}
