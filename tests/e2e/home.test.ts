import { describe, expect, it } from 'vitest';
import { baseUrl } from '../support/app';
import { useBrowser } from '../support/browser';

const browser = useBrowser();

describe('the home page in Chromium', () => {
  it('renders with our own fonts, loaded from our own host only', async () => {
    const page = await browser().newPage();
    const hosts = new Set<string>();
    page.on('request', (request) => hosts.add(new URL(request.url()).host));
    await page.goto(baseUrl, { waitUntil: 'networkidle' });

    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toContain('colours heat');
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      const h1 = getComputedStyle(document.querySelector('h1')!).fontFamily;
      const body = getComputedStyle(document.body).fontFamily;
      return {
        h1,
        body,
        serif: document.fonts.check('600 16px "Source Serif 4"'),
        sans: document.fonts.check('400 16px "IBM Plex Sans"'),
        loaded: [...document.fonts].filter((face) => face.status === 'loaded').map((face) => face.family.replace(/"/g, '')),
      };
    });
    expect(fonts.h1).toMatch(/^"?Source Serif 4/);
    expect(fonts.body).toMatch(/^"?IBM Plex Sans/);
    expect(fonts.loaded).toEqual(expect.arrayContaining(['Source Serif 4', 'IBM Plex Sans']));
    expect([...hosts]).toEqual([new URL(baseUrl).host]);
    await page.close();
  });

  it('reads on a phone without sideways scrolling', async () => {
    const page = await browser().newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto(baseUrl, { waitUntil: 'networkidle' });
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await expect(page.getByRole('link', { name: 'safety notes' }).first().isVisible()).resolves.toBe(true);
    await page.close();
  });
});
