import { afterAll, describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { differenceCiede2000, parse } from 'culori';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { coupons, swatches } from '../../db/schema';
import { baseUrl } from '../support/app';
import { useBrowser } from '../support/browser';
import { testDatabase } from '../support/database';
import { linkIn, waitForMail } from '../support/mail';

// Journey 2 of BRIEF.md in Chromium, at a phone's and a desk's width: a brand-new member finds the
// demo's titanium grade 2 / grade 5 pair in the library, reads its heat matrix, searches by one of
// its swatches, compares two coupons and exports the view; a visitor browses the matrix and
// compares two public coupons. Every swatch chip on the way carries its hex as text.

const browser = useBrowser();
const { db, pool } = testDatabase();
afterAll(() => pool.end());

const PAIR = ['ti-grade-2', 'ti-grade-5'] as const;
const PAIR_KEY = [...PAIR].sort().join('+');
const widths = [
  { name: 'phone', width: 390, height: 844 },
  { name: 'desk', width: 1440, height: 900 },
] as const;
type Width = (typeof widths)[number];

// Source: CIE 142-2001 / ISO/CIE 11664-6 CIEDE2000, as culori implements it — a computation
// independent of the app's own ΔE00 (src/lib/colour).
const ciede2000 = differenceCiede2000();

/** The coupons of the pair someone may see, by direct SQL (visibility rule of BRIEF.md: visitors public, members public + members + own). */
async function visiblePairIds(who: 'visitor' | 'new member'): Promise<number[]> {
  const shown = who === 'visitor' ? (['public'] as const) : (['public', 'members'] as const);
  const rows = await db
    .select({ id: coupons.id })
    .from(coupons)
    .where(and(eq(coupons.layerKey, PAIR_KEY), inArray(coupons.visibility, [...shown])));
  return rows.map((row) => row.id).sort((a, b) => a - b);
}

/** The largest ΔE00 between an 8-bit hex colour and the corners of the half-step cube around it in sRGB. */
function halfStepReach(hex: string): number {
  const colour = parse(hex);
  if (!colour || colour.mode !== 'rgb') throw new Error(`Not an sRGB hex colour: ${hex}`);
  const half = 0.5 / 255;
  let reach = 0;
  for (const dr of [-half, half])
    for (const dg of [-half, half])
      for (const db of [-half, half]) {
        const corner = { mode: 'rgb' as const, r: colour.r + dr, g: colour.g + dg, b: colour.b + db };
        reach = Math.max(reach, ciede2000(colour, corner));
      }
  return reach;
}

/** Every element painted with a swatch colour (an inline background) has its hex in the text around it. */
async function swatchChipsWithoutHex(page: Page, scope: string): Promise<string[]> {
  return page.evaluate((scope) => {
    const hexOf = (colour: string) => {
      const rgb = /rgba?\((\d+),\s*(\d+),\s*(\d+)/.exec(colour);
      if (rgb)
        return `#${rgb
          .slice(1, 4)
          .map((part) => Number(part).toString(16).padStart(2, '0'))
          .join('')}`;
      return /#[0-9a-f]{6}\b/i.exec(colour)?.[0].toLowerCase() ?? null;
    };
    const missing: string[] = [];
    for (const element of document.querySelectorAll<HTMLElement>(`${scope} [style*="background"]`)) {
      const paint = element.style.background || element.style.backgroundColor;
      // A gradient is a ladder or a scale, and a photo's region mark an outline: neither is a swatch chip.
      if (paint.includes('gradient') || element.closest('[data-mark]')) continue;
      const hex = hexOf(paint);
      if (!hex) continue;
      let holder: HTMLElement | null = element;
      let found = false;
      for (let depth = 0; holder && depth < 4 && !found; depth += 1, holder = holder.parentElement)
        found = (holder.textContent ?? '').toLowerCase().includes(hex) || (holder.getAttribute('title') ?? '').toLowerCase().includes(hex);
      if (!found) missing.push(`${hex} in ${element.parentElement?.outerHTML.slice(0, 160)}`);
    }
    return missing;
  }, scope);
}

/** Checks the swatch chips inside `scope` (a CSS selector; the page's main content unless told). */
async function expectChipsCarryHex(page: Page, scope = 'main') {
  const painted = await page.locator(`${scope} [style*="background"]`).count();
  expect(painted, `swatch chips on ${page.url()}`).toBeGreaterThan(0);
  expect(await swatchChipsWithoutHex(page, scope), `chips without a hex on ${page.url()}`).toEqual([]);
}

async function newPage(width: Width): Promise<Page> {
  const page = await browser().newPage();
  page.setDefaultTimeout(15_000);
  await page.setViewportSize({ width: width.width, height: width.height });
  return page;
}

async function signUp(page: Page, width: Width) {
  const email = `library-${width.name}-${Date.now().toString(36)}@oxbloom.test`;
  await page.goto(`${baseUrl}/sign-up`);
  await page.getByLabel('Your name').fill(`Library Reader ${width.name}`);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password').fill('tempered at 300 C');
  await page.getByRole('button', { name: 'Make my account' }).click();
  await expect.poll(() => page.getByText('Check your e-mail').isVisible()).toBe(true);
  await page.goto(linkIn(await waitForMail(email, 'Confirm your e-mail', 0, 20_000), `${baseUrl}/confirm-email`));
  await expect.poll(() => page.getByRole('heading', { name: 'Your address is confirmed' }).isVisible()).toBe(true);
}

/** The library, filtered to the pair with the filter form (the island applies each change in place). */
async function findPair(page: Page) {
  await page.goto(`${baseUrl}/library`, { waitUntil: 'networkidle' });
  await page.waitForSelector('astro-island:not([ssr])');
  const details = page.locator('#library-filters details');
  if (!(await details.evaluate((element) => (element as HTMLDetailsElement).open))) await page.getByText('Filters and sort').click();
  await page.getByLabel('First alloy of the pair').selectOption(PAIR[1]);
  await page.getByLabel('Second alloy of the pair').selectOption(PAIR[0]);
  await page.waitForURL((url) => url.searchParams.get('pairA') === PAIR[1] && url.searchParams.get('pairB') === PAIR[0]);
}

const countShown = async (page: Page) => Number(/^(\d+) coupons? match/.exec((await page.getByRole('status').first().textContent()) ?? '')?.[1] ?? NaN);

/** The result rows of the library as shown at this width: table rows on a desk, cards on a phone. */
const resultRows = (page: Page, width: Width): Locator =>
  width.name === 'desk' ? page.locator('table tbody tr') : page.getByRole('list', { name: 'Coupons' }).getByRole('listitem');

/** Ticks the first two results that have a swatch on every layer, and opens /compare. */
async function compareTwo(page: Page, width: Width): Promise<number[]> {
  const withSwatches = resultRows(page, width).filter({ has: page.locator('a[href^="/library/search"]') });
  expect(await withSwatches.count()).toBeGreaterThanOrEqual(2);
  const ids: number[] = [];
  for (const index of [0, 1]) {
    const box = withSwatches.nth(index).getByRole('checkbox', { name: /^Compare / });
    await box.check();
    ids.push(Number(await box.getAttribute('value')));
  }
  const button = page.getByRole('button', { name: /Compare selected/ });
  await expect.poll(() => button.textContent()).toBe('Compare selected (2)');
  await Promise.all([page.waitForURL(/\/compare\?/), button.click()]);
  expect(new URL(page.url()).searchParams.getAll('ids').map(Number)).toEqual(ids);
  return ids;
}

/** The compare page's ΔE00 list: each shown value against culori's ΔE00 of the two hexes it names. */
async function checkComparedDifferences(page: Page) {
  const glance = page.getByRole('region', { name: 'ΔE00 to the first coupon, layer by layer' });
  const items = glance.locator('li li');
  expect(await items.count()).toBeGreaterThan(0);
  let compared = 0;
  for (const text of await items.allTextContents()) {
    const shown = /ΔE00 (\d+(?:\.\d)?)/.exec(text);
    const hexes = /(#[0-9a-f]{6}) → (#[0-9a-f]{6})/i.exec(text);
    if (!shown || !hexes) continue;
    const computed = ciede2000(hexes[1], hexes[2]);
    // The page rounds to 0.1 (±0.05). The app measures from the swatches' stored CIELAB, the test from
    // the 8-bit hex the page shows: each hex stands for any colour within half a step of it, so the
    // test allows what half a step can move each swatch, computed here.
    const slack = 0.05 + halfStepReach(hexes[1]) + halfStepReach(hexes[2]);
    expect(Math.abs(Number(shown[1]) - computed), `${text}: culori says ${computed.toFixed(3)}, slack ${slack.toFixed(3)}`).toBeLessThanOrEqual(slack);
    compared += 1;
  }
  expect(compared).toBeGreaterThan(0);
  expect(await page.getByTestId('not-shown').count()).toBe(0);
  await expectChipsCarryHex(page);
}

/** The pair's heat matrix: filled cells and gaps in whichever layout this width shows. */
async function checkMatrix(page: Page, width: Width) {
  await expect.poll(() => page.getByRole('heading', { name: 'Measured and modelled, heat by heat' }).isVisible()).toBe(true);
  const cells = width.name === 'desk' ? page.locator('table.matrix-table tbody td') : page.getByRole('list', { name: 'Heats by temperature' }).locator('dd');
  const all = await cells.count();
  const filled = await cells.filter({ has: page.locator('a[href^="/coupons/"]') }).count();
  const gaps = await cells.filter({ hasText: 'No coupons yet' }).count();
  expect(filled, 'heats with measured coupons').toBeGreaterThan(0);
  expect(gaps, 'heats the library has no data for yet').toBeGreaterThan(0);
  expect(filled + gaps).toBe(all);
  await expectChipsCarryHex(page);
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow, 'the page scrolls sideways').toBeLessThanOrEqual(0);
}

/** The first visible "find coupons like this swatch" chip of a measured coupon. */
async function firstVisibleSwatchLink(page: Page): Promise<Locator> {
  const links = page.locator('main a[href^="/library/search?hex="]');
  for (const link of await links.all()) if (await link.isVisible()) return link;
  throw new Error('No visible swatch chip links to colour search.');
}

// The journeys run in a group of their own after the rest of the suite, one file at a time
// (tests/vitest.config.ts), so no other test file adds, measures or deletes coupons of this pair
// while it counts them.
describe.each(widths)('journey 2 in Chromium at $name width ($width px)', (width) => {
  it(
    'a brand-new member finds the grade 2 / grade 5 pair, reads its matrix, searches by a swatch, compares two coupons and exports the view',
    { timeout: 240_000 },
    async () => {
      await browser().clearCookies();
      const page = await newPage(width);
      await signUp(page, width);

      // The library, filtered by the pair with the form.
      await findPair(page);
      const expectedIds = await visiblePairIds('new member');
      expect(expectedIds.length).toBeGreaterThan(1);
      await expect.poll(() => countShown(page)).toBe(expectedIds.length);
      await expectChipsCarryHex(page);
      const libraryView = page.url();

      // The heat matrix from the library's link.
      await Promise.all([page.waitForURL(`${baseUrl}/library/pairs/${PAIR_KEY}`), page.getByRole('link', { name: 'See this pair as a heat matrix' }).click()]);
      await checkMatrix(page, width);

      // "Find coupons like this swatch" into colour search: nearest first, its own swatch at the top.
      const chip = await firstVisibleSwatchLink(page);
      const chipHex = new URL((await chip.getAttribute('href')) ?? '', baseUrl).searchParams.get('hex') ?? '';
      expect(chipHex).toMatch(/^#[0-9a-f]{6}$/i);
      await Promise.all([page.waitForURL(/\/library\/search\?/), chip.click()]);
      const hits = page.getByRole('region', { name: /near / }).getByRole('listitem');
      expect(await hits.count()).toBeGreaterThan(0);
      const distances = (await hits.allTextContents()).map((text) => Number(/ΔE00 (\d+\.\d+)/.exec(text)?.[1]));
      expect(distances.every(Number.isFinite)).toBe(true);
      expect(distances).toEqual([...distances].sort((a, b) => a - b));
      // The chip's own swatch is among the coupons searched: ΔE00 to its own 8-bit hex is rounding only.
      expect(distances[0]).toBeLessThanOrEqual(0.5);
      expect(ciede2000(chipHex, (/#[0-9a-f]{6}/i.exec((await hits.first().textContent()) ?? '') ?? [''])[0])).toBeLessThanOrEqual(0.5);
      await expectChipsCarryHex(page);

      // Back to the pair's view: tick two coupons and compare them.
      await page.goto(libraryView, { waitUntil: 'networkidle' });
      await page.waitForSelector('astro-island:not([ssr])');
      const compared = await compareTwo(page, width);
      expect(compared.every((id) => expectedIds.includes(id))).toBe(true);
      await checkComparedDifferences(page);

      // Export the view as CSV with the page's own cookies.
      await page.goto(libraryView, { waitUntil: 'networkidle' });
      await page.waitForSelector('astro-island:not([ssr])');
      const href = await page.getByRole('link', { name: 'Download CSV' }).getAttribute('href');
      expect(href).toMatch(/^\/api\/library\/export\?/);
      const before = await visiblePairIds('new member');
      const answer = await page.request.get(new URL(href ?? '', baseUrl).href);
      expect(answer.status()).toBe(200);
      expect(answer.headers()['content-type']).toMatch(/^text\/csv/);
      const records = csvRecords(await answer.text());
      // The export's column contract, as members' spreadsheets read it (a renamed column breaks them).
      expect(records[0]).toEqual([
        'id',
        'title',
        'layers',
        'process',
        'temperature_c',
        'hold_seconds',
        'volts',
        'atmosphere',
        'surface_prep',
        'owner',
        'visibility',
        'logged_at',
        'dominant_swatches',
      ]);
      const exported = records.slice(1).map((record) => Number(record[0]));
      // Source: direct SQL reads of the visible coupons of the pair just before and just after the
      // export. Other test files add and remove coupons of this pair meanwhile, so the export must
      // hold every coupon present in both reads and nothing present in neither.
      const after = await visiblePairIds('new member');
      expect(exported.filter((id) => !before.includes(id) && !after.includes(id))).toEqual([]);
      expect(before.filter((id) => after.includes(id) && !exported.includes(id))).toEqual([]);
      expect(exported.length).toBeGreaterThan(1);
      await page.close();
    },
  );

  it('a visitor browses the pair matrix and compares two public coupons', { timeout: 120_000 }, async () => {
    await browser().clearCookies();
    const page = await newPage(width);
    await findPair(page);
    const expectedIds = await visiblePairIds('visitor');
    await expect.poll(() => countShown(page)).toBe(expectedIds.length);

    await page.goto(`${baseUrl}/library/pairs/${PAIR_KEY}`);
    await checkMatrix(page, width);

    await findPair(page);
    const compared = await compareTwo(page, width);
    expect(compared.every((id) => expectedIds.includes(id))).toBe(true);
    await checkComparedDifferences(page);
    await page.close();
  });
});

/**
 * The records of a CSV text (RFC 4180: quoted fields may hold commas, doubled quotes and line
 * breaks), read here independently of the app's writer.
 */
function csvRecords(text: string): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let field = '';
  let quoted = false;
  for (let index = 0; index < text.length; index += 1) {
    const char = text[index];
    if (quoted) {
      if (char === '"' && text[index + 1] === '"') {
        field += '"';
        index += 1;
      } else if (char === '"') quoted = false;
      else field += char;
    } else if (char === '"') quoted = true;
    else if (char === ',') {
      record.push(field);
      field = '';
    } else if (char === '\n' || char === '\r') {
      if (char === '\r' && text[index + 1] === '\n') index += 1;
      record.push(field);
      records.push(record);
      record = [];
      field = '';
    } else field += char;
  }
  if (field !== '' || record.length) records.push([...record, field]);
  return records;
}

describe('swatch chips carry their hex as text', () => {
  it('on the front page, the swatch grid, one alloy’s matrix and a demo coupon’s page', { timeout: 120_000 }, async () => {
    await browser().clearCookies();
    const page = await newPage(widths[1]);
    // A demo coupon with measured swatches (the demo's rows come first; other test files add
    // coupons of this pair without photos while this runs).
    const [newest] = await db
      .select({ id: coupons.id })
      .from(coupons)
      .where(
        and(
          eq(coupons.layerKey, PAIR_KEY),
          eq(coupons.visibility, 'public'),
          sql`exists (select 1 from ${swatches} where ${swatches.couponId} = ${coupons.id})`,
        ),
      )
      .orderBy(asc(coupons.id))
      .limit(1);
    // The front page's recent swatches (its opening ladder strip is a captioned illustration, not chips).
    await page.goto(`${baseUrl}/`, { waitUntil: 'networkidle' });
    await expectChipsCarryHex(page, 'section[aria-labelledby="recent-in-the-library"]');
    for (const path of ['/library?view=grid', `/library/alloys/${PAIR[0]}`, `/coupons/${newest.id}`]) {
      await page.goto(`${baseUrl}${path}`, { waitUntil: 'networkidle' });
      await expectChipsCarryHex(page);
    }
    await page.close();
  });
});
