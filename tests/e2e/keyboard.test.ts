import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { api, baseUrl, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { useBrowser, useJar } from '../support/browser';
import { demoIds, demoSheet, type DemoIds } from '../support/demo-pages';

// Every island worked with the keyboard alone (Tab, Shift+Tab, Enter, Space, arrows, Delete), with
// a visible focus on each control reached; swatches that carry their colour as text; no motion for
// someone who asks for less. Source: WCAG 2.1 SC 2.1.1 Keyboard, 2.4.7 Focus Visible,
// 1.4.1 Use of Color and 2.3.3 Animation from Interactions (https://www.w3.org/TR/WCAG21/).

const browser = useBrowser({ viewport: { width: 1440, height: 900 } });

let ids: DemoIds;
let member: Jar;
let instructor: Jar;
let sheet: number;

beforeAll(async () => {
  ids = await demoIds();
  member = await signedIn(demo.member);
  instructor = await signedIn(demo.instructor);
  sheet = await demoSheet(instructor, ids.publicSwatches, 'draft');
});

afterAll(async () => {
  if (sheet) await api(`/api/sheets/${sheet}`, { method: 'DELETE', jar: instructor });
});

async function open(page: Page, path: string) {
  await page.goto(new URL(path, baseUrl).href, { waitUntil: 'networkidle' });
  await page.waitForFunction(() => !document.querySelector('astro-island[ssr]'), undefined, { timeout: 10_000 });
}

const isFocused = (target: Locator) => target.evaluate((element) => element === document.activeElement).catch(() => false);

/** What the focused element shows as its focus: its outline or a box shadow, and what it is. */
const focusMark = (page: Page) =>
  page.evaluate(() => {
    const element = document.activeElement as HTMLElement;
    const style = getComputedStyle(element);
    const outline = style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) > 0;
    return { visible: outline || style.boxShadow !== 'none', what: element.outerHTML.slice(0, 120) };
  });

/** Presses Tab (or Shift+Tab) until `target` has the focus, then checks the focus can be seen. */
async function tabTo(page: Page, target: Locator, { backwards = false, most = 250 } = {}) {
  for (let press = 0; press < most; press += 1) {
    await page.keyboard.press(backwards ? 'Shift+Tab' : 'Tab');
    if (await isFocused(target)) {
      const mark = await focusMark(page);
      expect(mark.visible, `no visible focus on ${mark.what}`).toBe(true);
      return;
    }
  }
  throw new Error(`${most} presses of ${backwards ? 'Shift+Tab' : 'Tab'} never reached ${target}`);
}

/** Every control on the way is checked too: tabbing through the whole page, each stop shows its focus. */
async function everyStopShowsFocus(page: Page, most = 120): Promise<string[]> {
  const hidden: string[] = [];
  await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
  for (let press = 0; press < most; press += 1) {
    await page.keyboard.press('Tab');
    const mark = await focusMark(page);
    if (mark.what.startsWith('<body')) break;
    // Astro's dev server adds its toolbar; the built app has none.
    if (mark.what.startsWith('<astro-dev-toolbar')) continue;
    if (!mark.visible) hidden.push(mark.what);
  }
  return hidden;
}

describe('the keyboard alone, in Chromium', () => {
  it('works the library table: filters, sort headings, paging and compare ticks', { timeout: 120_000 }, async () => {
    await useJar(browser(), null);
    const page = await browser().newPage();
    await open(page, '/library');
    expect(await everyStopShowsFocus(page)).toEqual([]);
    await open(page, '/library');

    // The filter form: open it, choose a process with the arrow keys; the island applies it in place.
    await tabTo(page, page.locator('#library-filters summary'));
    await page.keyboard.press('Enter');
    await expect.poll(() => page.locator('#library-filters details').evaluate((details) => (details as HTMLDetailsElement).open)).toBe(true);
    const process = page.getByLabel('Process');
    await tabTo(page, process);
    await page.keyboard.press('ArrowDown');
    await page.waitForURL(/[?&]process=/);
    const chosen = await process.inputValue();
    expect(chosen).not.toBe('');
    expect(new URL(page.url()).searchParams.get('process')).toBe(chosen);

    // A sort heading is a button: Enter sorts by it, and the heading says so.
    const heading = page.locator('th', { has: page.getByRole('button', { name: /Temperature/ }) });
    await tabTo(page, heading.getByRole('button'));
    await page.keyboard.press('Enter');
    await page.waitForURL(/[?&]sort=temperature/);
    await expect.poll(() => heading.getAttribute('aria-sort')).toMatch(/^(ascending|descending)$/);

    // Paging: Enter on the next page's link.
    await open(page, '/library');
    const boxes = page.locator('table tbody').getByRole('checkbox', { name: /^Compare / });
    const firstOnPageOne = await boxes.first().getAttribute('value');
    const next = page.getByRole('link', { name: 'Next page →' });
    await tabTo(page, next);
    await page.keyboard.press('Enter');
    await page.waitForURL(/[?&]cursor=/);
    await expect.poll(() => boxes.first().getAttribute('value')).not.toBe(firstOnPageOne);
    await expect.poll(() => page.locator('[aria-busy="true"]').count()).toBe(0);

    // Compare ticks: Space on two boxes, then back to the button and Enter.
    const ticked = [await boxes.nth(0).getAttribute('value'), await boxes.nth(1).getAttribute('value')];
    await tabTo(page, boxes.nth(0));
    await page.keyboard.press('Space');
    await tabTo(page, boxes.nth(1));
    await page.keyboard.press('Space');
    const compare = page.getByRole('button', { name: /^Compare selected/ });
    await expect.poll(() => compare.textContent()).toBe('Compare selected (2)');
    await tabTo(page, compare, { backwards: true });
    await Promise.all([page.waitForURL(/\/compare\?/), page.keyboard.press('Enter')]);
    expect(new URL(page.url()).searchParams.getAll('ids')).toEqual(ticked);
    await page.close();
  });

  it('works the heat planner and the pair planner', { timeout: 90_000 }, async () => {
    await useJar(browser(), null);
    const page = await browser().newPage();
    await open(page, '/heat-planner');
    expect(await everyStopShowsFocus(page)).toEqual([]);

    // One alloy: Ti-6Al-4V is the planner's first choice; type the heat and press Enter.
    await expect(page.getByLabel('Alloy', { exact: true }).inputValue()).resolves.toBe('ti-grade-5');
    await tabTo(page, page.getByLabel('Temperature', { exact: true }));
    await page.keyboard.type('600');
    await tabTo(page, page.getByLabel('Hold time', { exact: true }));
    await page.keyboard.type('60');
    await page.keyboard.press('Enter');
    // Source: Int. J. Biomaterials 2015, 395657, Table 1 — Ti-6Al-4V, 1 h at 600 °C in air: blue.
    await expect.poll(() => page.getByTestId('predicted-name').textContent()).toBe('blue');

    // The pair: arrow keys move between the goals, Space presses the button.
    const goals = page.getByRole('radiogroup').or(page.locator('fieldset', { has: page.locator('input[name="pair-goal"]') }));
    const checkedGoal = goals.locator('input[name="pair-goal"]:checked');
    const before = await checkedGoal.getAttribute('value');
    await tabTo(page, checkedGoal);
    await page.keyboard.press('ArrowDown');
    await expect.poll(() => checkedGoal.getAttribute('value')).not.toBe(before);
    await tabTo(page, page.getByRole('button', { name: 'Suggest heats' }));
    await page.keyboard.press('Space');
    const suggestions = page.getByTestId('pair-suggestions');
    await suggestions.waitFor();
    expect(await suggestions.locator('ol > li').count()).toBeGreaterThan(0);
    await page.close();
  });

  it('marks regions on a photo: moves, resizes, deletes and places one, then undoes', { timeout: 90_000 }, async () => {
    await useJar(browser(), member);
    const page = await browser().newPage();
    await open(page, `/coupons/${ids.memberPhotoCoupon}`);
    const photo = page.locator('article[aria-label^="Photo "]').first();
    const region = photo.locator('[data-mark]').first();
    const mark = await region.getAttribute('data-mark');
    const save = photo.getByRole('button', { name: 'Save regions' });
    await expect(save.isDisabled()).resolves.toBe(true);
    const placed = () =>
      region.evaluate((element) => {
        const { left, top, width, height } = (element as HTMLElement).style;
        return [left, top, width, height].map((side) => parseFloat(side).toFixed(3)).join(' ');
      });
    const start = await placed();

    await tabTo(page, region);
    await page.keyboard.press('ArrowRight');
    await expect.poll(placed).not.toBe(start);
    await expect(save.isEnabled()).resolves.toBe(true);
    const movedTo = await placed();
    await page.keyboard.press('Shift+ArrowDown');
    await expect.poll(placed).not.toBe(movedTo);

    // Delete takes it away; Enter on the photo puts one of the same kind back, with the focus on it.
    await page.keyboard.press('Delete');
    await expect.poll(() => photo.locator(`[data-mark="${mark}"]`).count()).toBe(0);
    await tabTo(page, photo.getByTestId('photo-canvas'), { backwards: true });
    await page.keyboard.press('Enter');
    await expect.poll(() => isFocused(photo.locator(`[data-mark="${mark}"]`))).toBe(true);

    // Undo leaves the demo's regions as they were.
    const undo = photo.getByRole('button', { name: 'Undo changes' });
    await tabTo(page, undo);
    await page.keyboard.press('Enter');
    await expect.poll(() => save.isDisabled()).toBe(true);
    await expect.poll(placed).toBe(start);
    await page.close();
  });

  it('reorders a colour sheet with the arrow keys and the move buttons, and the order is saved', { timeout: 90_000 }, async () => {
    await useJar(browser(), instructor);
    const page = await browser().newPage();
    await open(page, `/sheets/${sheet}/edit`);
    const items = page.locator('ol[aria-labelledby="arrange-heading"] > li');
    const count = await items.count();
    expect(count).toBe(1 + ids.publicSwatches.length);
    await expect(items.first().getAttribute('aria-label')).resolves.toMatch(/^heading .*, position 1 of/);

    await tabTo(page, items.first());
    await page.keyboard.press('ArrowDown');
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? '')).toMatch(/^heading .*, position 2 of/);
    // The move buttons: the last swatch one place earlier.
    const last = items.last();
    const lastLabel = ((await last.getAttribute('aria-label')) ?? '').replace(/, position.*/, '');
    await tabTo(page, last.getByRole('button', { name: /earlier$/ }));
    await page.keyboard.press('Enter');
    await expect.poll(() => items.nth(count - 2).getAttribute('aria-label')).toMatch(new RegExp(`^${lastLabel}, position ${count - 1} of`));

    // The builder saves itself: the API has the new order.
    await expect
      .poll(async () => {
        const body = (await (await api(`/api/sheets/${sheet}`, { jar: instructor })).json()) as { entries: { kind: string }[] };
        return body.entries.map((entry) => entry.kind).join(' ');
      })
      .toBe(['swatch', 'heading', ...Array(count - 2).fill('swatch')].join(' '));
    await page.close();
  });
});

/**
 * Every element painted with a colour of its own (an inline background) next to text that names
 * that colour: its hex, or a word. Gradients (ladders, scales) and a photo's region outlines are
 * drawings, not swatches; the photo's legend names its marks.
 */
async function swatchesWithoutText(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const toHex = (paint: string) => {
      const rgb = /rgba?\((\d+),\s*(\d+),\s*(\d+)/.exec(paint);
      if (rgb)
        return `#${rgb
          .slice(1, 4)
          .map((part) => Number(part).toString(16).padStart(2, '0'))
          .join('')}`;
      return /#[0-9a-f]{6}\b/i.exec(paint)?.[0].toLowerCase() ?? null;
    };
    const told = (element: HTMLElement) =>
      [element.innerText, element.getAttribute('aria-label'), element.getAttribute('title')].filter(Boolean).join(' ').toLowerCase();
    const missing: string[] = [];
    for (const element of document.querySelectorAll<HTMLElement>('main [style*="background"]')) {
      const paint = element.style.background || element.style.backgroundColor;
      if (paint.includes('gradient') || element.closest('[data-mark]')) continue;
      const hex = toHex(paint);
      if (!hex) continue;
      let holder: HTMLElement | null = element;
      let found = false;
      for (let depth = 0; holder && depth < 4 && !found; depth += 1, holder = holder.parentElement) {
        const text = told(holder);
        found = text.includes(hex) || /[a-z]{3,}/.test(text.replace(/#[0-9a-f]{6}/g, ''));
      }
      if (!found) missing.push(`${hex} in ${element.parentElement?.outerHTML.slice(0, 160)}`);
    }
    return missing;
  });
}

describe('swatches carry their colour as text', () => {
  it.each([
    ['the front page', () => '/'],
    ['the tint ladder', () => '/tint-ladder'],
    ['the swatch grid', () => '/library?view=grid'],
    ['a pair matrix', () => '/library/pairs/ti-grade-2+ti-grade-5'],
    ['colour search', () => '/library/search?hex=%23c08040&maxDeltaE=5'],
    ['compare', () => `/compare?ids=${ids.publicCoupons.slice(0, 2).join(',')}`],
    ['a coupon with photos', () => `/coupons/${ids.memberPhotoCoupon}`],
    ['the sheet builder', () => `/sheets/${sheet}/edit`],
  ])('on %s', async (_label, path) => {
    await useJar(browser(), path().startsWith('/sheets') ? instructor : member);
    const page = await browser().newPage();
    await open(page, path());
    expect(await page.locator('main [style*="background"]').count()).toBeGreaterThan(0);
    expect(await swatchesWithoutText(page)).toEqual([]);
    await page.close();
  });

  it('on a heat planner prediction', async () => {
    await useJar(browser(), null);
    const page = await browser().newPage();
    await open(page, '/heat-planner');
    await page.getByLabel('Temperature', { exact: true }).fill('320');
    await page.getByLabel('Hold time', { exact: true }).fill('30');
    await page.getByRole('button', { name: 'Predict the tint' }).click();
    await page.getByTestId('predicted-name').waitFor();
    expect(await swatchesWithoutText(page)).toEqual([]);
    await page.close();
  });
});

describe('reduced motion', () => {
  /** The longest animation or transition (s) on the page's elements, with the element that has it. */
  const longestMotion = (page: Page) =>
    page.evaluate(() => {
      const seconds = (list: string) => Math.max(...list.split(',').map((part) => (part.trim().endsWith('ms') ? parseFloat(part) / 1000 : parseFloat(part))));
      let longest = { seconds: 0, what: '' };
      for (const element of document.querySelectorAll<HTMLElement>('*')) {
        for (const pseudo of [null, '::before', '::after']) {
          const style = getComputedStyle(element, pseudo);
          const motion = Math.max(
            style.animationName === 'none' ? 0 : seconds(style.animationDuration),
            style.transitionProperty === 'none' ? 0 : seconds(style.transitionDuration) + seconds(style.transitionDelay),
          );
          if (motion > longest.seconds) longest = { seconds: motion, what: `${element.outerHTML.slice(0, 100)}${pseudo ?? ''}` };
        }
      }
      return longest;
    });

  it('stills every animation and transition when the system asks for less motion', { timeout: 90_000 }, async () => {
    await useJar(browser(), member);
    const page = await browser().newPage();
    await page.emulateMedia({ reducedMotion: 'reduce' });
    for (const path of ['/', '/library', '/heat-planner', '/coupons/new', `/coupons/${ids.memberPhotoCoupon}`, '/tint-ladder']) {
      await open(page, path);
      // The app's moving pieces (the loading bars' pulse, the dimming of stale results) are drawn on
      // demand; put them on the page so their classes are measured too.
      await page.evaluate(() => {
        const probe = document.createElement('div');
        probe.className = 'animate-pulse transition-opacity transition-[width] duration-200';
        document.querySelector('main')?.append(probe);
      });
      const longest = await longestMotion(page);
      expect(longest.seconds, `${path}: ${longest.what}`).toBeLessThanOrEqual(0.01);
    }
    // The same probe moves for someone who has not asked: the check can fail.
    await page.emulateMedia({ reducedMotion: 'no-preference' });
    await open(page, '/library');
    await page.evaluate(() => {
      const probe = document.createElement('div');
      probe.className = 'animate-pulse';
      document.querySelector('main')?.append(probe);
    });
    expect((await longestMotion(page)).seconds).toBeGreaterThan(0.1);
    await page.close();
  });
});
