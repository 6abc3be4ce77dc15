// The Content-Security-Policy in Chromium: the main pages load, hydrate their islands, show their
// photos and run their scripts with no violation reported, on the console or as an event.
import { describe, expect, it } from 'vitest';
import type { ConsoleMessage, Page } from 'playwright-core';
import { api, baseUrl } from '../support/app';
import { demo, demoPassword, signedIn } from '../support/auth';
import { useBrowser } from '../support/browser';

const browser = useBrowser();

/** Chromium's console wording for a blocked resource or script (it names the policy). */
const isViolation = (message: ConsoleMessage) => /Content Security Policy|Refused to (load|execute|apply|connect|frame)/i.test(message.text());

/** Opens a page that records every violation: console messages and securitypolicyviolation events. */
async function watchedPage(): Promise<{ page: Page; violations: string[] }> {
  const page = await browser().newPage();
  page.setDefaultTimeout(15_000);
  const violations: string[] = [];
  page.on('console', (message) => {
    if (isViolation(message)) violations.push(`${page.url()}: ${message.text()}`);
  });
  page.on('pageerror', (error) => violations.push(`${page.url()}: ${error.message}`));
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (event) =>
      console.error(`Content Security Policy event: ${event.violatedDirective} blocked ${event.blockedURI}`),
    );
  });
  return { page, violations };
}

const hydrated = (page: Page) => page.waitForFunction(() => !document.querySelector('astro-island[ssr]'));

async function visit(page: Page, path: string, islands = false) {
  const response = await page.goto(`${baseUrl}${path}`, { waitUntil: 'networkidle' });
  expect(response?.status(), path).toBe(path === '/no-such-page' ? 404 : 200);
  expect(response?.headers()['content-security-policy'], path).toBeTruthy();
  if (islands) await hydrated(page);
}

describe('the Content-Security-Policy in Chromium', () => {
  it('reports no violation on the pages a visitor opens, and their scripts still run', async () => {
    const { page, violations } = await watchedPage();
    await browser().clearCookies();
    for (const path of ['/', '/safety', '/sign-in', '/sign-up', '/forgot-password', '/no-such-page']) await visit(page, path);

    // The tint ladder's own script submits the form when the alloy changes.
    await visit(page, '/tint-ladder');
    const alloy = page.locator('#ladder-alloy');
    const current = await alloy.inputValue();
    const choices = await alloy.locator('option').evaluateAll((options) => options.map((option) => (option as HTMLOptionElement).value));
    const next = choices.find((value) => value !== current)!;
    await Promise.all([page.waitForURL((url) => url.searchParams.get('alloy') === next), alloy.selectOption(next)]);

    // The heat planner's islands hydrate and answer from the API (connect-src 'self').
    await visit(page, '/heat-planner', true);
    // Listen before clicking: a quick answer could otherwise arrive before the listener.
    await Promise.all([
      page.waitForResponse((response) => response.url().endsWith('/api/tint/predict')),
      page.getByRole('button', { name: 'Predict the tint' }).click(),
    ]);
    await page.waitForLoadState('networkidle');

    expect(violations).toEqual([]);
    await page.close();
  });

  it('reports no violation on the pages a member opens, photos from storage included', async () => {
    const { page, violations } = await watchedPage();
    await browser().clearCookies();
    await visit(page, '/sign-in');
    const form = page.getByRole('region', { name: 'Sign in' });
    await form.getByLabel('E-mail address').fill(demo.member);
    await form.getByLabel('Password').fill(demoPassword);
    await Promise.all([page.waitForURL(`${baseUrl}/account`), form.getByRole('button', { name: 'Sign in' }).click()]);

    const jar = await signedIn(demo.member);
    const { coupons } = (await (await api('/api/coupons?mine=1&limit=100', { jar })).json()) as { coupons: { id: number }[] };
    let withPhotos: number | undefined;
    for (const coupon of coupons) {
      const { photos } = (await (await api(`/api/coupons/${coupon.id}/photos`, { jar })).json()) as { photos: unknown[] };
      if (photos.length) {
        withPhotos = coupon.id;
        break;
      }
    }
    for (const path of ['/account', '/coupons']) await visit(page, path);
    await visit(page, '/coupons/new', true);
    await visit(page, `/coupons/${withPhotos}`, true);
    const loaded = await page.locator('img').evaluateAll((images) => images.map((image) => (image as HTMLImageElement).naturalWidth > 0));
    expect(loaded.length).toBeGreaterThan(0);
    expect(loaded.every(Boolean)).toBe(true);
    await visit(page, `/coupons/${withPhotos}/edit`, true);
    await visit(page, '/heat-planner', true);

    expect(violations).toEqual([]);
    await page.close();
  });

  it('the delete button of a coupon still asks first, without an inline handler', async () => {
    const { page, violations } = await watchedPage();
    await browser().clearCookies();
    await visit(page, '/sign-in');
    const form = page.getByRole('region', { name: 'Sign in' });
    await form.getByLabel('E-mail address').fill(demo.member);
    await form.getByLabel('Password').fill(demoPassword);
    await Promise.all([page.waitForURL(`${baseUrl}/account`), form.getByRole('button', { name: 'Sign in' }).click()]);

    const jar = await signedIn(demo.member);
    const created = await api('/api/coupons', {
      jar,
      json: {
        title: 'Confirm-before-delete test',
        layers: ['ti-grade-2'],
        surfacePrep: 'ground',
        process: 'oven',
        temperatureC: 500,
        temperatureMethod: 'thermocouple',
        holdSeconds: 600,
        atmosphere: 'air',
        visibility: 'private',
      },
    });
    const { id } = (await created.json()) as { id: number };
    await visit(page, `/coupons/${id}`);

    // Dismissed: nothing is deleted.
    page.once('dialog', (dialog) => void dialog.dismiss());
    await page.getByRole('button', { name: 'Delete coupon' }).click();
    await page.waitForTimeout(300);
    expect((await api(`/api/coupons/${id}`, { jar })).status).toBe(200);

    // Accepted: the coupon is deleted.
    page.once('dialog', (dialog) => void dialog.accept());
    await Promise.all([page.waitForURL(/\/coupons\?deleted=1$/), page.getByRole('button', { name: 'Delete coupon' }).click()]);
    expect((await api(`/api/coupons/${id}`, { jar })).status).toBe(404);

    expect(violations).toEqual([]);
    await page.close();
  });
});
