// Marking regions on a photo in the browser, as a person does with the mouse.
import type { Page } from 'playwright-core';
import type { Rectangle } from '~/lib/photos';

/**
 * Drags out a rectangle given in pixels of the synthetic 1200 × 800 coupon photo
 * (tests/fixtures/synthetic-photos.ts) over the photo as shown, a little inside the patch so the
 * rectangle holds only its colour.
 */
export async function drawRegion(page: Page, region: Rectangle) {
  const canvas = page.getByTestId('photo-canvas');
  await canvas.evaluate((element) => element.scrollIntoView({ block: 'center' }));
  const box = (await canvas.boundingBox())!;
  const at = (x: number, y: number) => ({ x: box.x + (x / 1200) * box.width, y: box.y + (y / 800) * box.height });
  const start = at(region.x + region.width * 0.1, region.y + region.height * 0.15);
  const end = at(region.x + region.width * 0.9, region.y + region.height * 0.85);
  await page.mouse.move(start.x, start.y);
  await page.mouse.down();
  await page.mouse.move(end.x, end.y, { steps: 8 });
  await page.mouse.up();
}
