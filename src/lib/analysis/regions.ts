import type { Region } from './schemas';

export interface Size {
  width: number;
  height: number;
}

export class AnalysisInputError extends Error {
  constructor(
    readonly code: 'region-outside-image' | 'grey-card-unusable',
    message: string,
  ) {
    super(message);
    this.name = 'AnalysisInputError';
  }
}

export function wholeImage(size: Size): Region {
  return { x: 0, y: 0, width: size.width, height: size.height };
}

/** The part of `region` inside the image; an error when nothing is left. */
export function clipRegion(region: Region, size: Size): Region {
  const x = Math.min(region.x, size.width);
  const y = Math.min(region.y, size.height);
  const right = Math.min(region.x + region.width, size.width);
  const bottom = Math.min(region.y + region.height, size.height);
  if (right <= x || bottom <= y) {
    throw new AnalysisInputError(
      'region-outside-image',
      `The region at ${region.x},${region.y} (${region.width}×${region.height}) lies outside the ${size.width}×${size.height} image.`,
    );
  }
  return { x, y, width: right - x, height: bottom - y };
}

/**
 * Maps a region from one size of the same picture to another (full-size photo → the shrunk
 * copy analysed). Edges move inwards to whole pixels, so pixels blended with what lies outside
 * the region are left out; a region smaller than one shrunk pixel keeps the pixel at its centre.
 */
export function scaleRegion(region: Region, from: Size, to: Size): Region {
  const sx = to.width / from.width;
  const sy = to.height / from.height;
  const clipped = clipRegion(region, from);
  const inward = (start: number, length: number, scale: number, limit: number) => {
    let first = Math.ceil(start * scale);
    let last = Math.floor((start + length) * scale);
    if (last <= first) {
      first = Math.min(limit - 1, Math.floor((start + length / 2) * scale));
      last = first + 1;
    }
    return [first, last - first] as const;
  };
  const [x, width] = inward(clipped.x, clipped.width, sx, to.width);
  const [y, height] = inward(clipped.y, clipped.height, sy, to.height);
  return { x, y, width, height };
}
