import { describe, expect, it } from 'vitest';
import { AnalysisInputError, clipRegion, scaleRegion } from '~/lib/analysis/regions';

const full = { width: 6000, height: 4000 };
const shrunk = { width: 1024, height: 683 };

describe('regions', () => {
  it('clips a region to the image', () => {
    expect(clipRegion({ x: 5900, y: 3900, width: 500, height: 500 }, full)).toEqual({ x: 5900, y: 3900, width: 100, height: 100 });
  });

  it('refuses a region outside the image', () => {
    expect(() => clipRegion({ x: 6000, y: 0, width: 10, height: 10 }, full)).toThrow(AnalysisInputError);
  });

  // Worked example: 6000 → 1024 is a scale of 0.170667; x 600..1800 maps to 102.4..307.2, so whole
  // pixels 103..306 (edges move inwards); y 400..1200 at 683/4000 maps to 68.3..204.9, so 69..203.
  it('maps a full-size region inwards onto the shrunk copy', () => {
    expect(scaleRegion({ x: 600, y: 400, width: 1200, height: 800 }, full, shrunk)).toEqual({ x: 103, y: 69, width: 204, height: 135 });
  });

  it('keeps the centre pixel of a region smaller than one shrunk pixel', () => {
    expect(scaleRegion({ x: 3000, y: 2000, width: 2, height: 2 }, full, shrunk)).toEqual({ x: 512, y: 341, width: 1, height: 1 });
  });

  it('maps the whole image onto the whole copy', () => {
    expect(scaleRegion({ x: 0, y: 0, ...full }, full, shrunk)).toEqual({ x: 0, y: 0, ...shrunk });
  });
});
