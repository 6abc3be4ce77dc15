import { afterAll, beforeAll } from 'vitest';
import { chromium, type BrowserContext } from 'playwright-core';
import { mkdtempSync, rmSync } from 'node:fs';
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
