// The region editor's geometry: screen pointer positions to photo pixels and back (common practice:
// a linear map between the shown box and the photo's pixel grid), kept inside the photo.
import { describe, expect, it } from 'vitest';
import { isBigEnough, keyStep, minimumSide, moved, placement, resized, spanned, toPhotoPoint } from '~/components/photos/region-geometry';

const photo = { width: 4000, height: 3000 };
const box = { left: 100, top: 50, width: 800, height: 600 };

describe('the region editor’s geometry', () => {
  it.each([
    // [pointer on screen, point in photo pixels] — the box shows the photo at 1/5 scale.
    [
      { x: 100, y: 50 },
      { x: 0, y: 0 },
    ],
    [
      { x: 500, y: 350 },
      { x: 2000, y: 1500 },
    ],
    [
      { x: 900, y: 650 },
      { x: 4000, y: 3000 },
    ],
    [
      { x: 1200, y: -20 },
      { x: 4000, y: 0 },
    ], // dragged past the edges: held at them
  ])('maps the pointer at %o to %o', (client, expected) => {
    expect(toPhotoPoint(client, box, photo)).toEqual(expected);
  });

  it('spans whole pixels between two corners in either order, inside the photo', () => {
    expect(spanned({ x: 10.4, y: 20.6 }, { x: 110.2, y: 70.1 }, photo)).toEqual({ x: 10, y: 20, width: 101, height: 51 });
    expect(spanned({ x: 110.2, y: 70.1 }, { x: 10.4, y: 20.6 }, photo)).toEqual({ x: 10, y: 20, width: 101, height: 51 });
    expect(spanned({ x: 3990, y: 2990 }, { x: 4000, y: 3000 }, photo)).toEqual({ x: 3990, y: 2990, width: 10, height: 10 });
    expect(spanned({ x: 4000, y: 3000 }, { x: 4000, y: 3000 }, photo)).toEqual({ x: 3999, y: 2999, width: 1, height: 1 });
  });

  it('ignores a tap: a rectangle must be at least 0.8 % of the long side', () => {
    expect(minimumSide(photo)).toBe(32);
    expect(isBigEnough({ x: 0, y: 0, width: 31, height: 500 }, photo)).toBe(false);
    expect(isBigEnough({ x: 0, y: 0, width: 32, height: 32 }, photo)).toBe(true);
    expect(minimumSide({ width: 100, height: 80 })).toBe(2);
  });

  it('moves a rectangle and stops it at the edges', () => {
    const rectangle = { x: 100, y: 100, width: 400, height: 300 };
    expect(moved(rectangle, 50.4, -20.6, photo)).toEqual({ x: 150, y: 79, width: 400, height: 300 });
    expect(moved(rectangle, -500, -500, photo)).toEqual({ x: 0, y: 0, width: 400, height: 300 });
    expect(moved(rectangle, 9000, 9000, photo)).toEqual({ x: 3600, y: 2700, width: 400, height: 300 });
  });

  it('resizes by the corner, never below the minimum nor past the edges', () => {
    const rectangle = { x: 3000, y: 2000, width: 400, height: 300 };
    expect(resized(rectangle, 100, 50, photo)).toEqual({ x: 3000, y: 2000, width: 500, height: 350 });
    expect(resized(rectangle, -1000, -1000, photo)).toEqual({ x: 3000, y: 2000, width: 32, height: 32 });
    expect(resized(rectangle, 5000, 5000, photo)).toEqual({ x: 3000, y: 2000, width: 1000, height: 1000 });
  });

  it('places a rectangle over the shown image in percentages', () => {
    expect(placement({ x: 1000, y: 750, width: 2000, height: 1500 }, photo)).toEqual({ left: '25.000%', top: '25.000%', width: '50.000%', height: '50.000%' });
  });

  it('steps by 1 % of the long side with the arrow keys, 10 % with Alt', () => {
    expect(keyStep(photo, false)).toBe(40);
    expect(keyStep(photo, true)).toBe(400);
    expect(keyStep({ width: 50, height: 40 }, false)).toBe(1);
  });
});
