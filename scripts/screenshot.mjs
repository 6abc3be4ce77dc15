// @ts-check
// Takes screenshots of pages in Debian's Chromium, for looking at what we built:
//   node scripts/screenshot.mjs http://127.0.0.1:4321/ [more URLs] [--out DIR] [--width 390]
// Writes one PNG per URL and width (desk 1280 and phone 390 unless --width is given).
import { chromium } from 'playwright-core';
import { mkdtempSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

const args = process.argv.slice(2);
/**
 * @template {string | null} F
 * @param {string} name
 * @param {F} fallback
 * @returns {string | F}
 */
const option = (name, fallback) => {
  const index = args.indexOf(name);
  if (index === -1) return fallback;
  const [value] = args.splice(index, 2).slice(1);
  return value;
};
const out = option('--out', 'screenshots');
const width = option('--width', null);
const widths = width ? [Number(width)] : [1280, 390];
mkdirSync(out, { recursive: true });

const context = await chromium.launchPersistentContext(mkdtempSync(path.join(tmpdir(), 'oxbloom-shot-')), {
  executablePath: '/usr/bin/chromium',
  headless: true,
  args: [
    '--no-sandbox',
    '--disable-gpu',
    '--disable-quic',
    '--no-first-run',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
  ],
});
const page = await context.newPage();
for (const url of args) {
  for (const viewport of widths) {
    await page.setViewportSize({ width: viewport, height: viewport < 600 ? 844 : 900 });
    await page.goto(url, { waitUntil: 'networkidle' });
    const name = `${new URL(url).pathname.replace(/\W+/g, '_') || 'home'}-${viewport}.png`;
    await page.screenshot({ path: path.join(out, name), fullPage: true });
    console.log(path.join(out, name));
  }
}
await context.close();
