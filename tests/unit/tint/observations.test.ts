import { describe, expect, it } from 'vitest';
import { observationsFromSwatches, type SwatchRow } from '~/lib/server/tint-fit';

// Hand-made regions: the film, a shadow beside it, and the region's mean (a blend of the two).
const base = { couponId: 1, photoId: 10, layerId: 100, process: 'oven', temperatureC: 600, holdSeconds: 3600, volts: null } as const;
const film = { ...base, isMean: false, share: 0.7, l: 55, a: 10, b: -30 };
const shadow = { ...base, isMean: false, share: 0.3, l: 20, a: 2, b: -8 };
const mean = { ...base, isMean: true, share: 1, l: 44.5, a: 7.6, b: -23.4 };

describe('the library fit observes the film, not a blend', () => {
  it('takes the dominant cluster of a region, even when the region has a mean', () => {
    const [observation] = observationsFromSwatches([mean, shadow, film] as SwatchRow[]);
    // Source: the film row above, written by hand; the mean (44.5, 7.6, -23.4) must not be chosen.
    expect(observation.lab).toEqual({ l: 55, a: 10, b: -30 });
  });

  it('falls back to the mean only when the region has nothing else', () => {
    const [observation] = observationsFromSwatches([mean] as SwatchRow[]);
    expect(observation.lab).toEqual({ l: 44.5, a: 7.6, b: -23.4 });
  });

  it('averages the film colour over a coupon’s photos', () => {
    const second = { ...film, photoId: 11, l: 45, a: 6, b: -20 };
    const [observation] = observationsFromSwatches([film, shadow, mean, second] as SwatchRow[]);
    // Source: (55 + 45) / 2, (10 + 6) / 2, (-30 + -20) / 2, worked by hand.
    expect(observation.lab).toEqual({ l: 50, a: 8, b: -25 });
  });
});
