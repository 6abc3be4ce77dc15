import { afterAll, afterEach, beforeAll, beforeEach } from 'vitest';
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core';
import { baseUrl, type Jar } from './app';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

/** What a test file may ask of its browser beyond the defaults (Playwright's own context options). */
export type BrowserOptions = Pick<BrowserContextOptions, 'bypassCSP' | 'reducedMotion' | 'viewport'>;

/** Debian's Chromium, headless, with a fresh profile; never a downloaded browser. */
export async function launchBrowser(options: BrowserOptions = {}): Promise<{ context: BrowserContext; close: () => Promise<void> }> {
  const profileDir = mkdtempSync(path.join(tmpdir(), 'oxbloom-chromium-'));
  const context = await chromium.launchPersistentContext(profileDir, {
    ...options,
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
  watchForFailures(context);
  return {
    context,
    close: async () => {
      watched.delete(context);
      await context.close();
      rmSync(profileDir, { recursive: true, force: true });
    },
  };
}

/** One browser for a test file: launched before its tests, closed after. Call the result for the context. */
export function useBrowser(options: BrowserOptions = {}): () => BrowserContext {
  let browser: Awaited<ReturnType<typeof launchBrowser>> | undefined;
  beforeAll(async () => {
    browser = await launchBrowser(options);
  });
  afterAll(() => browser?.close());
  return () => {
    if (!browser) throw new Error('The browser is not running yet.');
    return browser.context;
  };
}

/** Where a failed browser test leaves a full-page screenshot of each page it had open (ignored by git). */
export const failureShotDir = path.join(process.cwd(), 'test-artefacts');

/** The browsers and contexts whose open pages a failed test photographs. */
const watched = new Set<BrowserContext | Browser>();
const openPages = () => [...watched].flatMap((target) => ('contexts' in target ? target.contexts().flatMap((context) => context.pages()) : target.pages()));

/**
 * Photographs the pages a failed test of this file left open. `launchBrowser` (and so
 * `useBrowser`) watches its own context; a test that launches another browser passes it here.
 */
export function watchForFailures(target: BrowserContext | Browser): void {
  watched.add(target);
}

/** The pages open before the running test started: they are not its own. */
let earlier = new Set<Page>();
beforeEach(() => {
  earlier = new Set(openPages());
});

afterEach(async ({ task }) => {
  if (task.result?.state !== 'fail') return;
  const pages = openPages().filter((page) => !earlier.has(page) && !page.isClosed());
  if (!pages.length) return;
  mkdirSync(failureShotDir, { recursive: true });
  const file = path.basename(task.file?.name ?? 'test', '.test.ts');
  const stem = [file, task.suite?.name, task.name]
    .filter(Boolean)
    .join('-')
    .replace(/[^\w.-]+/g, '-')
    .slice(0, 160);
  for (const [index, page] of pages.entries()) {
    const shot = path.join(failureShotDir, `${stem}${pages.length > 1 ? `-${index + 1}` : ''}.png`);
    const taken = await page.screenshot({ path: shot, fullPage: true, timeout: 10_000 }).then(
      () => true,
      () => false,
    );
    if (taken) console.error(`Screenshot of ${page.url()} when "${task.name}" failed: ${shot}`);
    // The failed test never reached its own page.close().
    await page.close().catch(() => undefined);
  }
});

/** Puts a signed-in cookie jar (tests/support/auth.ts `signedIn`) into the browser, replacing its cookies. */
export async function useJar(context: BrowserContext, jar: Jar | null): Promise<void> {
  await context.clearCookies();
  if (jar) await context.addCookies([...jar.cookies].map(([name, value]) => ({ name, value, url: baseUrl })));
}
