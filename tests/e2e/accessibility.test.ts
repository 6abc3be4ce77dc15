import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { createHash, randomBytes } from 'node:crypto';
import { createRequire } from 'node:module';
import { eq, inArray } from 'drizzle-orm';
import { invitations, users } from '../../db/schema';
import { api, baseUrl, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { useBrowser, useJar } from '../support/browser';
import { testDatabase } from '../support/database';
import { demoIds, demoSheet, type DemoIds } from '../support/demo-pages';

// Every page of the app, as each kind of person sees it, audited in Chromium by axe-core (loaded
// from node_modules, never a CDN). Source: axe-core's rules tagged for WCAG 2.0 and 2.1, levels A
// and AA (W3C, Web Content Accessibility Guidelines 2.1, https://www.w3.org/TR/WCAG21/); a page
// passes with no violation axe rates serious or critical.

const WCAG_21_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
const axeSource = createRequire(import.meta.url).resolve('axe-core/axe.min.js');

// The Content-Security-Policy allows no inline script; axe goes in as one, so this browser bypasses it
// (tests/e2e/content-security.test.ts checks the policy itself).
const browser = useBrowser({ bypassCSP: true });

type Who = 'visitor' | 'member' | 'instructor' | 'admin';
interface Fixtures extends DemoIds {
  sheets: { draft: number; published: number };
  invitation: Record<'open' | 'expired' | 'revoked' | 'used', string>;
}
type Route = [label: string, path: (ids: Fixtures) => string];

const pair = 'ti-grade-2+ti-grade-5';
const routes: Record<Who, Route[]> = {
  visitor: [
    ['home', () => '/'],
    ['safety notes', () => '/safety'],
    ['sign in', () => '/sign-in'],
    ['sign in with an error', () => '/sign-in?error=CredentialsSignin'],
    ['sign-in link sent', () => '/sign-in/check-email'],
    ['sign-in problem', () => '/sign-in/problem?error=Verification'],
    ['sign up', () => '/sign-up'],
    ['forgotten password', () => '/forgot-password'],
    ['reset password, bad link', () => `/reset-password?token=${'r'.repeat(43)}`],
    ['confirm e-mail, bad link', () => `/confirm-email?token=${'c'.repeat(43)}`],
    ['tint ladder', () => '/tint-ladder'],
    ['tint ladder, 1084 in warm light', () => '/tint-ladder?alloy=steel-1084&illuminant=A'],
    ['heat planner and pair planner', () => '/heat-planner'],
    ['library table', () => '/library'],
    ['library grid', () => '/library?view=grid'],
    ['colour search', () => '/library/search?hex=%23c08040&maxDeltaE=5'],
    ['pair picker', () => '/library/pairs'],
    ['pair matrix', () => `/library/pairs/${pair}`],
    ['alloy matrix', () => '/library/alloys/ti-grade-5'],
    ['compare', (ids) => `/compare?ids=${ids.publicCoupons.slice(0, 3).join(',')}`],
    ['a public coupon', (ids) => `/coupons/${ids.publicCoupons[0]}`],
    ['a published sheet', (ids) => `/sheets/${ids.sheets.published}`],
    ['not found', () => '/no-such-page'],
    ['class join, no link', () => '/classes/join'],
    ['class join, open link', (ids) => `/classes/join?token=${ids.invitation.open}`],
    ['class join, expired link', (ids) => `/classes/join?token=${ids.invitation.expired}`],
    ['class join, withdrawn link', (ids) => `/classes/join?token=${ids.invitation.revoked}`],
    ['class join, used link', (ids) => `/classes/join?token=${ids.invitation.used}`],
  ],
  member: [
    ['account', () => '/account'],
    ['my coupons', () => '/coupons'],
    ['new coupon', () => '/coupons/new'],
    ['coupon with photo and region tool', (ids) => `/coupons/${ids.memberPhotoCoupon}`],
    ['edit coupon', (ids) => `/coupons/${ids.memberPhotoCoupon}/edit`],
    ['library table', () => '/library?mine=1'],
    ['pair matrix', () => `/library/pairs/${pair}?unit=F`],
    ['alloy matrix', () => '/library/alloys/ti-grade-2'],
    ['compare', (ids) => `/compare?ids=${ids.publicCoupons.slice(0, 2).join(',')}`],
    ['heat planner and pair planner', () => '/heat-planner'],
    ['tint ladder', () => '/tint-ladder?alloy=ti-grade-2'],
    ['classes', () => '/classes'],
    ['a class, as a student', (ids) => `/classes/${ids.demoClass}`],
    ['class join, another address', (ids) => `/classes/join?token=${ids.invitation.open}`],
    ['not found', () => '/coupons/99999999'],
  ],
  instructor: [
    ['classes', () => '/classes'],
    ['new class', () => '/classes/new'],
    ['class page', (ids) => `/classes/${ids.demoClass}`],
    ['sheets', () => '/sheets'],
    ['new sheet', () => '/sheets/new'],
    ['sheet builder', (ids) => `/sheets/${ids.sheets.draft}/edit`],
    ['draft sheet', (ids) => `/sheets/${ids.sheets.draft}`],
    ['published sheet', (ids) => `/sheets/${ids.sheets.published}`],
  ],
  admin: [
    ['people and roles', () => '/admin/users'],
    ['account', () => '/account'],
  ],
};

const jars = {} as Record<Who, Jar | null>;
const fixtures = {} as Fixtures;
const { db, pool } = testDatabase();
const newToken = () => randomBytes(32).toString('base64url');
const digest = (token: string) => createHash('sha256').update(token).digest('hex');

beforeAll(async () => {
  jars.visitor = null;
  jars.member = await signedIn(demo.member);
  jars.instructor = await signedIn(demo.instructor);
  jars.admin = await signedIn(demo.admin);
  Object.assign(fixtures, await demoIds());
  fixtures.sheets = {
    draft: await demoSheet(jars.instructor, fixtures.publicSwatches, 'draft'),
    published: await demoSheet(jars.instructor, fixtures.publicSwatches, 'published'),
  };
  // One invitation in each state the join page tells apart, written straight into the table.
  const [instructor] = await db.select({ id: users.id }).from(users).where(eq(users.email, demo.instructor));
  const day = 24 * 3600 * 1000;
  const now = Date.now();
  fixtures.invitation = { open: newToken(), expired: newToken(), revoked: newToken(), used: newToken() };
  const row = (state: keyof Fixtures['invitation']) => ({
    classId: fixtures.demoClass,
    email: `joiner-${state}-${now.toString(36)}@oxbloom.test`,
    tokenHash: digest(fixtures.invitation[state]),
    invitedBy: instructor.id,
    expiresAt: new Date(now + (state === 'expired' ? -day : 14 * day)),
    revokedAt: state === 'revoked' ? new Date(now - 1000) : null,
    acceptedAt: state === 'used' ? new Date(now - 1000) : null,
  });
  await db.insert(invitations).values([row('open'), row('expired'), row('revoked'), row('used')]);
});

afterAll(async () => {
  if (fixtures.invitation) await db.delete(invitations).where(inArray(invitations.tokenHash, Object.values(fixtures.invitation).map(digest)));
  await pool.end();
  for (const id of Object.values(fixtures.sheets ?? {})) await api(`/api/sheets/${id}`, { method: 'DELETE', jar: jars.instructor! });
});

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[]; failureSummary?: string }[];
}

/** Runs axe-core on the page with the WCAG 2.1 A and AA rules; the serious and critical violations, one line each. */
async function seriousViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ path: axeSource });
  const violations = await page.evaluate(async (tags) => {
    const { axe } = window as unknown as { axe: { run: (context: Document, options: object) => Promise<{ violations: Violation[] }> } };
    return (await axe.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] })).violations;
  }, WCAG_21_AA);
  return violations
    .filter((violation) => violation.impact === 'serious' || violation.impact === 'critical')
    .map(
      (violation) =>
        `${violation.id} (${violation.impact}): ${violation.help} — ${violation.nodes
          .slice(0, 4)
          .map((node) => `${node.target.join(' ')}: ${node.failureSummary?.replace(/\s+/g, ' ')}`)
          .join(' | ')}`,
    );
}

/** Opens a page and waits for its islands to take over (axe reads what a person would meet). */
async function open(page: Page, path: string) {
  const response = await page.goto(new URL(path, baseUrl).href, { waitUntil: 'load' });
  expect(response?.status() ?? 0, path).toBeLessThan(500);
  await page.waitForFunction(() => !document.querySelector('astro-island[ssr]'), undefined, { timeout: 10_000 });
}

for (const who of Object.keys(routes) as Who[]) {
  describe(`axe-core, WCAG 2.1 A and AA, as ${who === 'visitor' ? 'a visitor' : `the demo ${who}`}`, () => {
    it.each(routes[who])('%s', async (_label, path) => {
      await useJar(browser(), jars[who]);
      const page = await browser().newPage();
      await page.setViewportSize({ width: 1440, height: 900 });
      await open(page, path(fixtures));
      expect(await seriousViolations(page), `${path(fixtures)} at 1440 px`).toEqual([]);
      // The same page laid out for a phone.
      await page.setViewportSize({ width: 390, height: 844 });
      await page.evaluate(() => new Promise(requestAnimationFrame));
      expect(await seriousViolations(page), `${path(fixtures)} at 390 px`).toEqual([]);
      await page.close();
    });
  });
}
