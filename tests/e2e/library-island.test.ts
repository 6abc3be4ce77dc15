import { afterAll, describe, expect, it } from 'vitest';
import { chromium, type Page } from 'playwright-core';
import { and, count, eq } from 'drizzle-orm';
import { coupons } from '../../db/schema';
import { baseUrl } from '../support/app';
import { useBrowser, watchForFailures } from '../support/browser';
import { testDatabase } from '../support/database';

// The library page in Chromium, as a visitor: the island takes over filtering, sorting and
// paging without leaving the page, keeps the view in the URL, and the page still lists coupons
// and submits its forms with JavaScript switched off.

const browser = useBrowser();
const { db, pool } = testDatabase();
afterAll(() => pool.end());

const libraryUrl = (query = '') => new URL(`/library${query}`, baseUrl).href;

/** Opens the library and waits for the island; marks the document so a full reload would show. */
async function openLibrary(page: Page, query = '') {
  await page.goto(libraryUrl(query), { waitUntil: 'networkidle' });
  await page.waitForSelector('astro-island:not([ssr])');
  await page.evaluate(() => Object.assign(window, { sameDocument: true }));
}

const sameDocument = (page: Page) => page.evaluate(() => (window as unknown as { sameDocument?: boolean }).sameDocument === true);
const status = (page: Page) => page.getByRole('status').first().textContent();
const processCells = (page: Page) => page.locator('table tbody tr td:nth-child(4)').allTextContents();

async function openFilters(page: Page) {
  const details = page.locator('#library-filters details');
  if (!(await details.evaluate((element) => (element as HTMLDetailsElement).open))) await page.getByText('Filters and sort').click();
}

/** Visitors see public coupons only (BRIEF.md, journey 2): the count a visitor's library should show for a process. */
async function publicCount(process: 'anodize' | 'forge') {
  const [row] = await db
    .select({ total: count() })
    .from(coupons)
    .where(and(eq(coupons.process, process), eq(coupons.visibility, 'public')));
  return row.total;
}

describe('the library island', () => {
  it('filters by process without leaving the page, puts it in the URL, and the back button restores the view', async () => {
    const page = await browser().newPage();
    await openLibrary(page);
    const before = await processCells(page);
    expect(new Set(before).size).toBeGreaterThan(1);

    await openFilters(page);
    await Promise.all([page.waitForURL(/[?&]process=anodize\b/), page.getByLabel('Process').selectOption('anodize')]);
    await expect.poll(() => processCells(page)).toEqual(expect.arrayContaining(['Anodizing']));
    await expect.poll(async () => new Set(await processCells(page))).toEqual(new Set(['Anodizing']));
    const expected = await publicCount('anodize');
    await expect.poll(() => status(page)).toBe(`${expected} ${expected === 1 ? 'coupon matches' : 'coupons match'}`);
    expect(await sameDocument(page)).toBe(true);

    await page.goBack();
    await expect.poll(() => page.url()).toBe(libraryUrl());
    await expect.poll(() => processCells(page)).toEqual(before);
    await expect(page.getByLabel('Process').inputValue()).resolves.toBe('');
    expect(await sameDocument(page)).toBe(true);

    await page.goForward();
    await expect.poll(async () => new Set(await processCells(page))).toEqual(new Set(['Anodizing']));
    await expect(page.getByLabel('Process').inputValue()).resolves.toBe('anodize');
    await page.close();
  });

  it('sorts by temperature from its column heading, lowest first and then highest first, blanks last', async () => {
    const page = await browser().newPage();
    await openLibrary(page);
    const heading = page.getByRole('columnheader', { name: /Temperature/ });
    const temperatures = async () =>
      (await page.locator('table tbody tr td:nth-child(5)').allTextContents()).map((text) => (/\d/.test(text) ? Number.parseFloat(text) : null));
    const inOrder = (values: (number | null)[], order: 'asc' | 'desc') => {
      const known = values.filter((value): value is number => value !== null);
      const sorted = [...known].sort((a, b) => (order === 'asc' ? a - b : b - a));
      const firstBlank = values.indexOf(null);
      return JSON.stringify(known) === JSON.stringify(sorted) && (firstBlank === -1 || values.slice(firstBlank).every((value) => value === null));
    };

    await heading.getByRole('button', { name: /Temperature/ }).click();
    await page.waitForURL(/sort=temperature/);
    await expect.poll(() => heading.getAttribute('aria-sort')).toBe('ascending');
    await expect.poll(async () => inOrder(await temperatures(), 'asc')).toBe(true);
    await expect(page.getByLabel('Sort by').inputValue()).resolves.toBe('temperature');

    // The keyboard alone: focus the heading's button and press Enter.
    await heading.getByRole('button').focus();
    await page.keyboard.press('Enter');
    await page.waitForURL(/order=desc/);
    await expect.poll(() => heading.getAttribute('aria-sort')).toBe('descending');
    await expect.poll(async () => inOrder(await temperatures(), 'desc')).toBe(true);
    expect((await temperatures()).filter((value) => value !== null).length).toBeGreaterThan(5);
    expect(await sameDocument(page)).toBe(true);
    await page.close();
  });

  it('pages on with the cursor and back to the first page', async () => {
    const page = await browser().newPage();
    await openLibrary(page);
    const first = await page.locator('table tbody tr td:nth-child(2) a').allTextContents();
    await page.getByRole('link', { name: /Next page/ }).click();
    await page.waitForURL(/cursor=/);
    await expect.poll(async () => (await page.locator('table tbody tr td:nth-child(2) a').allTextContents())[0]).not.toBe(first[0]);
    const second = await page.locator('table tbody tr td:nth-child(2) a').allTextContents();
    expect(second.some((title) => first.includes(title))).toBe(false);
    await page.getByRole('link', { name: /First page/ }).click();
    await expect.poll(() => page.url()).toBe(libraryUrl());
    await expect.poll(() => page.locator('table tbody tr td:nth-child(2) a').allTextContents()).toEqual(first);
    expect(await sameDocument(page)).toBe(true);
    await page.close();
  });

  it('says so when nothing matches, and shows the API’s message with a retry when a filter is refused', async () => {
    const page = await browser().newPage();
    await openLibrary(page);
    await openFilters(page);
    // Source: common practice — no temper or oxide colour is logged near 2900 °C (well above steel's
    // and titanium's melting points, about 1500 °C and 1670 °C).
    await page.getByLabel('Lowest temperature').fill('2900');
    await Promise.all([page.waitForURL(/tempMin=2900/), page.getByRole('button', { name: 'Show coupons' }).click()]);
    await expect.poll(() => page.getByText('No coupon matches these filters.').isVisible()).toBe(true);
    await expect.poll(() => status(page)).toBe('0 coupons match');

    await page.getByLabel('Highest temperature').fill('100');
    await page.getByRole('button', { name: 'Show coupons' }).click();
    const alert = page.getByRole('alert').filter({ hasText: 'could not show these coupons' });
    // The API names the field (tempMax); the island says it with the form's own label and marks it.
    await expect.poll(() => alert.textContent()).toContain('Highest temperature: The upper end is below the lower end.');
    await expect(page.getByLabel('Highest temperature').getAttribute('aria-invalid')).resolves.toBe('true');
    await expect(alert.getByRole('button', { name: 'Try again' }).isVisible()).resolves.toBe(true);
    expect(await sameDocument(page)).toBe(true);
    await page.close();
  });

  it('sends two ticked coupons to /compare, one ids= each', async () => {
    const page = await browser().newPage();
    await openLibrary(page);
    const button = page.getByRole('button', { name: /Compare selected/ });
    await expect(button.isDisabled()).resolves.toBe(true);
    const boxes = page.locator('table tbody input[name="ids"]');
    const ids = [await boxes.nth(0).getAttribute('value'), await boxes.nth(2).getAttribute('value')];
    await boxes.nth(0).check();
    await boxes.nth(2).check();
    await expect(button.textContent()).resolves.toBe('Compare selected (2)');
    await Promise.all([page.waitForURL(/\/compare\?/), button.click()]);
    expect(new URL(page.url()).searchParams.getAll('ids')).toEqual(ids);
    await page.close();
  });

  it('shows cards on a phone, with compare ticks', async () => {
    const page = await browser().newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await openLibrary(page);
    await expect(page.locator('table').isVisible()).resolves.toBe(false);
    const cards = page.getByRole('list', { name: 'Coupons' }).getByRole('listitem');
    expect(await cards.count()).toBeGreaterThan(5);
    await expect(
      cards
        .first()
        .getByRole('checkbox', { name: /^Compare / })
        .isVisible(),
    ).resolves.toBe(true);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await page.close();
  });
});

describe('the library with JavaScript switched off', () => {
  it('lists coupons, filters through the plain form, and submits compare ticks as a plain form', async () => {
    const noScript = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu', '--disable-quic'] });
    watchForFailures(noScript);
    try {
      const context = await noScript.newContext({ javaScriptEnabled: false, viewport: { width: 1280, height: 900 } });
      const page = await context.newPage();
      await page.goto(libraryUrl());
      expect(await page.locator('table tbody tr').count()).toBeGreaterThan(5);
      await expect(page.locator('astro-island[ssr]').count()).resolves.toBe(1);

      await page.getByText('Filters and sort').click();
      await page.getByLabel('Process').selectOption('forge');
      await Promise.all([page.waitForURL(/process=forge/), page.getByRole('button', { name: 'Show coupons' }).click()]);
      expect(new Set(await processCells(page))).toEqual(new Set(['Forge']));
      const expected = await publicCount('forge');
      await expect(status(page)).resolves.toBe(`${expected} ${expected === 1 ? 'coupon matches' : 'coupons match'}`);

      // Sort headings are links without JavaScript.
      await Promise.all([page.waitForURL(/sort=temperature/), page.getByRole('link', { name: /Temperature/ }).click()]);
      expect(new URL(page.url()).searchParams.get('process')).toBe('forge');

      const boxes = page.locator('table tbody input[name="ids"]');
      const ids = [await boxes.nth(1).getAttribute('value'), await boxes.nth(3).getAttribute('value')];
      await boxes.nth(1).check();
      await boxes.nth(3).check();
      await Promise.all([page.waitForURL(/\/compare\?/), page.getByRole('button', { name: 'Compare selected' }).click()]);
      expect(new URL(page.url()).searchParams.getAll('ids')).toEqual(ids);
      await context.close();
    } finally {
      await noScript.close();
    }
  });
});
