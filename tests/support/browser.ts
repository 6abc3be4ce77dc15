import { afterAll, beforeAll, onTestFailed } from 'vitest';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

/** Debian's Chromium, headless, with a fresh profile; never a downloaded browser. */
export async function launchBrowser(): Promise<{ context: BrowserContext; close: () => Promise<void> }> {
  const profileDir = mkdtempSync(path.join(tmpdir(), 'oxbloom-chromium-'));
  const context = await chromium.launchPersistentContext(profileDir, {
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
  return {
    context,
    close: async () => {
      await context.close();
      rmSync(profileDir, { recursive: true, force: true });
    },
  };
}

/** One browser for a test file: launched before its tests, closed after. Call the result for the context. */
export function useBrowser(): () => BrowserContext {
  let browser: Awaited<ReturnType<typeof launchBrowser>> | undefined;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());
  return () => {
    if (!browser) throw new Error('The browser is not running yet.');
    return browser.context;
  };
}

/** Where a failed browser test leaves its screenshot (`.data/` is ignored by git). */
export const failureShotDir = path.join(process.cwd(), '.data', 'e2e-failures');

/**
 * Keeps a full-page screenshot of `page` when the running test fails, named after the test and
 * `label`, so a failure on a loaded machine can be looked at afterwards. Call inside the test.
 */
export function keepScreenshotOnFailure(page: Page, label: string): void {
  onTestFailed(async ({ task }) => {
    if (page.isClosed()) return;
    mkdirSync(failureShotDir, { recursive: true });
    const name = `${label}-${task.name}`.replace(/[^\w.-]+/g, '-').slice(0, 120);
    const file = path.join(failureShotDir, `${name}.png`);
    await page.screenshot({ path: file, fullPage: true }).catch(() => undefined);
    console.error(`Screenshot of the failed page (${page.url()}): ${file}`);
  });
}
