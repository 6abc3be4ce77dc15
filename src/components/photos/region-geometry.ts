import type { Rectangle } from '~/lib/photos';

/**
 * The region editor's geometry, pure: rectangles are kept in pixels of the upright full-size
 * photo (what the API takes) and drawn as percentages of the image on screen.
 */

export interface Size {
  width: number;
  height: number;
}

export interface Point {
  x: number;
  y: number;
}

/** Smallest rectangle kept after a drag, in photo pixels per 1000 of the long side (a stray tap draws nothing). */
const MIN_SIDE_PER_MILLE = 8;

export const minimumSide = (photo: Size) => Math.max(2, Math.round((Math.max(photo.width, photo.height) * MIN_SIDE_PER_MILLE) / 1000));

const clamp = (value: number, low: number, high: number) => Math.min(high, Math.max(low, value));

/** A pointer position on the shown image (its bounding box) as a point in photo pixels, kept inside the photo. */
export function toPhotoPoint(client: Point, box: { left: number; top: number; width: number; height: number }, photo: Size): Point {
  return {
    x: clamp(((client.x - box.left) / box.width) * photo.width, 0, photo.width),
    y: clamp(((client.y - box.top) / box.height) * photo.height, 0, photo.height),
  };
}

/** The whole-pixel rectangle spanned by two corners, inside the photo. */
export function spanned(from: Point, to: Point, photo: Size): Rectangle {
  const left = Math.floor(clamp(Math.min(from.x, to.x), 0, photo.width - 1));
  const top = Math.floor(clamp(Math.min(from.y, to.y), 0, photo.height - 1));
  const right = Math.ceil(clamp(Math.max(from.x, to.x), left + 1, photo.width));
  const bottom = Math.ceil(clamp(Math.max(from.y, to.y), top + 1, photo.height));
  return { x: left, y: top, width: right - left, height: bottom - top };
}

export const isBigEnough = (rectangle: Rectangle, photo: Size) => {
  const side = minimumSide(photo);
  return rectangle.width >= side && rectangle.height >= side;
};

/** The rectangle moved by (dx, dy) photo pixels, stopped at the photo's edges. */
export function moved(rectangle: Rectangle, dx: number, dy: number, photo: Size): Rectangle {
  return {
    ...rectangle,
    x: Math.round(clamp(rectangle.x + dx, 0, photo.width - rectangle.width)),
    y: Math.round(clamp(rectangle.y + dy, 0, photo.height - rectangle.height)),
  };
}

/** The rectangle with its bottom-right corner moved by (dx, dy), at least the minimum size and inside the photo. */
export function resized(rectangle: Rectangle, dx: number, dy: number, photo: Size): Rectangle {
  const side = minimumSide(photo);
  return {
    ...rectangle,
    width: Math.round(clamp(rectangle.width + dx, side, photo.width - rectangle.x)),
    height: Math.round(clamp(rectangle.height + dy, side, photo.height - rectangle.y)),
  };
}

/** CSS placing a rectangle over the shown image. */
export function placement(rectangle: Rectangle, photo: Size): { left: string; top: string; width: string; height: string } {
  const percent = (value: number, whole: number) => `${((value / whole) * 100).toFixed(3)}%`;
  return {
    left: percent(rectangle.x, photo.width),
    top: percent(rectangle.y, photo.height),
    width: percent(rectangle.width, photo.width),
    height: percent(rectangle.height, photo.height),
  };
}

/** How far one arrow-key press moves or resizes a rectangle: 1 % of the photo's long side (10 % with Shift). */
export const keyStep = (photo: Size, large: boolean) => Math.max(1, Math.round((Math.max(photo.width, photo.height) * (large ? 10 : 1)) / 100));
