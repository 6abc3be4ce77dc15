import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl } from '../support/app';
import { useBrowser } from '../support/browser';

// The tint ladder and the heat planner in Chromium, as a visitor (reference data).

const browser = useBrowser();

/** Whether `expected` appears in `names` in the same order (other names may come between). */
function inOrder(names: readonly string[], expected: readonly string[]): boolean {
  let at = 0;
  for (const name of names) if (at < expected.length && name === expected[at]) at += 1;
  return at === expected.length;
}

async function sidewaysOverflow(page: Page): Promise<number> {
  return page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
}

async function openPlanner(page: Page) {
  await page.goto(new URL('/heat-planner', baseUrl).href, { waitUntil: 'networkidle' });
  await page.waitForSelector('astro-island:not([ssr])');
}

async function predictHeat(page: Page, temperature: string, holdMinutes: string) {
  await page.getByLabel('Alloy', { exact: true }).selectOption('ti-grade-5');
  await page.getByLabel('Temperature', { exact: true }).fill(temperature);
  await page.getByLabel('Hold time', { exact: true }).fill(holdMinutes);
  await page.getByRole('button', { name: 'Predict the tint' }).click();
}

describe('the tint ladder page', () => {
  it('draws titanium with the familiar colour order', async () => {
    const page = await browser().newPage();
    const response = await page.goto(new URL('/tint-ladder?alloy=ti-grade-5', baseUrl).href);
    expect(response?.status()).toBe(200);
    const bands = await page.getByTestId('ladder-bands').locator('[data-band-name]').allTextContents();
    // Source: REFERENCES.md, colour sequence of films on titanium with thickness, typical practice
    // [from memory]: straw → bronze → purple → blue → light blue → gold → rose → green; names past the first
    // blues carry their order.
    expect(inOrder(bands, ['straw', 'bronze', 'purple', 'blue', 'light blue', 'second-order gold', 'second-order rose', 'third-order green'])).toBe(true);
    // Source: Int. J. Biomaterials 2015, 395657, Table 1 — a 50 nm film on Ti-6Al-4V is blue.
    const row50 = page.getByTestId('ladder-table').locator('tr', { has: page.locator('td', { hasText: /^50$/ }) });
    await expect(row50.locator('[data-step-name]').textContent()).resolves.toBe('blue');
    await expect(page.getByTestId('ladder-strip').count()).resolves.toBe(2);
    await page.close();
  });

  it('switches to warm light, and without JavaScript through the plain form', async () => {
    const page = await browser().newPage();
    await page.goto(new URL('/tint-ladder', baseUrl).href);
    await Promise.all([page.waitForURL(/illuminant=A/), page.getByLabel('Warm light (A)').check()]);
    await expect(page.getByRole('heading', { level: 2 }).first().textContent()).resolves.toContain('warm light');
    await page.close();

    // The same choice with scripts switched off: the plain GET form does it.
    const noScript = await browser().newPage();
    const cdp = await browser().newCDPSession(noScript);
    await cdp.send('Emulation.setScriptExecutionDisabled', { value: true });
    await noScript.goto(new URL('/tint-ladder', baseUrl).href);
    await noScript.getByLabel('Alloy').selectOption('steel-1084');
    await Promise.all([noScript.waitForURL(/alloy=steel-1084/), noScript.getByRole('button', { name: 'Show ladder' }).click()]);
    await expect(noScript.getByRole('heading', { level: 2 }).first().textContent()).resolves.toContain('1084');
    await noScript.close();
  });

  it('answers an unknown alloy with a message, not a failure', async () => {
    const page = await browser().newPage();
    const response = await page.goto(new URL('/tint-ladder?alloy=unobtainium', baseUrl).href);
    expect(response?.status()).toBe(400);
    await expect(page.getByRole('alert').textContent()).resolves.toContain('unknown alloy');
    await page.close();
  });
});

describe('the heat planner page, as a visitor', () => {
  it('predicts a blue band for 1 h at 600 °C on Ti-6Al-4V, from reference data', async () => {
    const page = await browser().newPage();
    await openPlanner(page);
    await expect(page.getByText('Hot work can hurt').first().isVisible()).resolves.toBe(true);
    await predictHeat(page, '600', '60');
    // Source: Int. J. Biomaterials 2015, 395657, Table 1 — Ti-6Al-4V, 1 h at 600 °C in air: blue.
    await expect(page.getByTestId('predicted-name').textContent()).resolves.toBe('blue');
    await expect(page.locator('[data-basis]').first().textContent()).resolves.toContain('From reference data only');
    await page.close();
  });

  it('takes °F: 1112 °F is 600 °C', async () => {
    const page = await browser().newPage();
    await openPlanner(page);
    await page.locator('label', { hasText: '°F' }).first().click();
    await expect(page.getByRole('radio', { name: '°F' }).first().isChecked()).resolves.toBe(true);
    // Source: NIST SP 811, appendix B: °C = (°F − 32)·5/9, so 1112 °F = 600 °C.
    await expect(page.getByLabel('Temperature', { exact: true }).inputValue()).resolves.toBe('1112');
    await predictHeat(page, '1112', '60');
    await expect(page.getByTestId('predicted-name').textContent()).resolves.toBe('blue');
    await page.close();
  });

  it('shows the warnings of a 1000 °C heat with their sources', async () => {
    const page = await browser().newPage();
    await openPlanner(page);
    await predictHeat(page, '1000', '30');
    const warnings = page.getByTestId('warnings').locator('[data-warning]');
    await warnings.first().waitFor();
    expect(await warnings.count()).toBeGreaterThan(0);
    await expect(warnings.first().textContent()).resolves.toContain('Source:');
    await expect(page.locator('[data-warning="fe-ti-eutectic"]').isVisible()).resolves.toBe(true);
    await page.close();
  });

  it('shows an error from the API beside the field it names', async () => {
    const page = await browser().newPage();
    await openPlanner(page);
    await predictHeat(page, '1700', '60');
    const error = page.locator('#planner-temperature-error');
    await error.waitFor();
    await expect(error.textContent()).resolves.toContain('between 0 and 1600 °C');
    await expect(page.getByLabel('Temperature', { exact: true }).getAttribute('aria-invalid')).resolves.toBe('true');
    await page.close();
  });

  it('shows a refusal only the API can give beside the field it names', async () => {
    const page = await browser().newPage();
    await openPlanner(page);
    // A page left open while the catalogue changed: its list offers an alloy the API does not know.
    const alloy = page.getByLabel('Alloy', { exact: true });
    await alloy.evaluate((select) => select.append(new Option('Retired alloy', 'retired-alloy')));
    await alloy.selectOption('retired-alloy');
    await page.getByRole('button', { name: 'Predict the tint' }).click();
    const error = page.locator('#planner-alloy-error');
    await error.waitFor();
    await expect(error.textContent()).resolves.toBe('alloy: unknown alloy "retired-alloy"');
    await expect(alloy.getAttribute('aria-invalid')).resolves.toBe('true');
    await expect(page.getByRole('form', { name: 'Planned heat' }).getByRole('alert').textContent()).resolves.toBe('alloy: unknown alloy "retired-alloy"');
    await page.close();
  });

  it('suggests heats for a laminate pair', async () => {
    const page = await browser().newPage();
    await openPlanner(page);
    await page.getByLabel('Two wanted colours').check();
    await page.getByRole('button', { name: 'Suggest heats' }).click();
    const suggestions = page.getByTestId('pair-suggestions');
    await suggestions.waitFor();
    expect(await suggestions.locator('ol > li').count()).toBeGreaterThan(0);
    await page.close();
  });
});

describe('the tint pages on a phone', () => {
  it.each(['/tint-ladder', '/heat-planner'])('%s has no sideways scroll at 390 px', async (path) => {
    const page = await browser().newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    if (path === '/heat-planner') {
      await openPlanner(page);
      await predictHeat(page, '1000', '30');
      await page.getByTestId('warnings').waitFor();
    } else {
      await page.goto(new URL(path, baseUrl).href, { waitUntil: 'networkidle' });
    }
    expect(await sidewaysOverflow(page)).toBeLessThanOrEqual(0);
    await page.close();
  });
});
