import { beforeAll, describe, expect, it } from 'vitest';
import { baseUrl } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { useBrowser, useJar } from '../support/browser';

// The demo class's page as its instructor, in Chromium: its cohort grid (three alloy groups, up to
// four heats each) reads on a phone without anything scrolling sideways, and at a desk too.

const browser = useBrowser();

beforeAll(async () => {
  await useJar(browser(), await signedIn(demo.instructor));
});

describe('the demo class page', () => {
  it.each([
    ['phone', 390, 844],
    ['desk', 1440, 900],
  ])('on a %s (%i px), nothing in it scrolls sideways: the cohort’s heats wrap onto the next line', async (_label, width, height) => {
    const page = await browser().newPage();
    await page.setViewportSize({ width, height });
    await page.goto(new URL('/classes', baseUrl).href);
    await page
      .getByRole('link', { name: /Saltmarsh Forge Collective/ })
      .first()
      .click();
    await page.waitForURL(/\/classes\/\d+$/);
    // The demo's shared coupons are there: their heats head the grid's columns.
    await expect(page.getByText('220 °C').count()).resolves.toBeGreaterThan(0);
    const scrollers = await page.evaluate(() =>
      [...document.querySelectorAll('main *')]
        .filter((element) => ['auto', 'scroll'].includes(getComputedStyle(element).overflowX) && element.scrollWidth > element.clientWidth + 1)
        .map((element) => element.outerHTML.slice(0, 120)),
    );
    expect(scrollers).toEqual([]);
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    await page.close();
  });
});
