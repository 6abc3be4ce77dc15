// @ts-check
// The JavaScript each page ships, gzipped, against the budget (BRIEF.md: at most 120 kB a page):
//   node scripts/js-budget.mjs [http://127.0.0.1:4321]
// Asks the running app (`npm start`) for each page — as a visitor, then signed in as the demo
// member and admin for the pages behind sign-in — and adds up every script the page would run:
// its inline scripts, its <script src> files, and each island's component and renderer with all
// the modules they import statically, each file counted once a page. Prints a table; exits 1
// when a page is over the budget.
import { gzipSync } from 'node:zlib';
import { pathToFileURL } from 'node:url';

export const BUDGET_KB = 120;
const DEMO_PASSWORD = 'oxbloom-demo';

/** Cookies kept between calls, as a Cookie header. */
class Jar {
  /** @type {Map<string, string>} */
  cookies = new Map();
  /** @param {Response} response */
  keep(response) {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const at = pair.indexOf('=');
      this.cookies.set(pair.slice(0, at).trim(), pair.slice(at + 1).trim());
    }
  }
  header() {
    return [...this.cookies].map(([name, value]) => `${name}=${value}`).join('; ');
  }
}

/**
 * A jar signed in as a demo account, through Auth.js's password form.
 * @param {string} base @param {string} email
 */
export async function signIn(base, email) {
  const jar = new Jar();
  const csrf = await fetch(new URL('/api/auth/csrf', base));
  jar.keep(csrf);
  const { csrfToken } = /** @type {{ csrfToken: string }} */ (await csrf.json());
  const answer = await fetch(new URL('/api/auth/callback/credentials', base), {
    method: 'POST',
    redirect: 'manual',
    headers: { origin: new URL(base).origin, cookie: jar.header(), 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ csrfToken, email, password: DEMO_PASSWORD, callbackUrl: '/account' }),
  });
  jar.keep(answer);
  if (![...jar.cookies.keys()].some((name) => name.endsWith('session-token'))) throw new Error(`Could not sign in as ${email} (${answer.status}).`);
  return jar;
}

const gzipBytes = (/** @type {string | Uint8Array} */ text) => gzipSync(text).length;

/** Static imports of a built module (`import … from "./x.js"`, `import "./x.js"`). */
const importsOf = (/** @type {string} */ code) => [...code.matchAll(/(?:\bfrom|\bimport)\s*["']([^"']+\.js)["']/g)].map((match) => match[1]);

/**
 * The scripts one page ships: file URL (or "inline") → gzipped bytes.
 * @param {string} base @param {string} path @param {Jar} [jar]
 */
export async function pageScripts(base, path, jar) {
  const page = await fetch(new URL(path, base), { headers: jar ? { cookie: jar.header() } : {} });
  if (!page.ok) throw new Error(`${path} answered ${page.status}.`);
  const html = await page.text();
  /** @type {Map<string, number>} */
  const files = new Map();
  let inline = 0;
  for (const match of html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/g)) {
    const src = /\bsrc="([^"]+)"/.exec(match[1])?.[1];
    if (/type="application\/(ld\+)?json"/.test(match[1])) continue;
    if (!src) inline += gzipBytes(match[2]);
  }
  const entries = [
    ...[...html.matchAll(/<script\b[^>]*\bsrc="([^"]+)"/g)].map((match) => match[1]),
    ...[...html.matchAll(/\b(?:component-url|renderer-url|before-hydration-url)="([^"]+)"/g)].map((match) => match[1]),
    ...[...html.matchAll(/<link\b[^>]*rel="modulepreload"[^>]*href="([^"]+)"/g)].map((match) => match[1]),
  ].filter(Boolean);
  const queue = entries.map((entry) => new URL(entry, new URL(path, base)).href);
  while (queue.length) {
    const url = /** @type {string} */ (queue.shift());
    if (files.has(url)) continue;
    const answer = await fetch(url);
    if (!answer.ok) throw new Error(`${url} answered ${answer.status}.`);
    const code = await answer.text();
    files.set(url, gzipBytes(code));
    for (const spec of importsOf(code)) queue.push(new URL(spec, url).href);
  }
  return { files, inline, total: inline + [...files.values()].reduce((sum, bytes) => sum + bytes, 0) };
}

/**
 * Every page of the app worth measuring, with who asks for it.
 * @param {string} base
 */
async function pagesToMeasure(base) {
  const member = await signIn(base, 'member@oxbloom.test');
  const admin = await signIn(base, 'admin@oxbloom.test');
  const mine = await fetch(new URL('/api/coupons?mine=1&limit=1', base), { headers: { cookie: member.header() } });
  const { coupons } = /** @type {{ coupons: { id: number }[] }} */ (await mine.json());
  const own = coupons[0]?.id;
  /** @type {[string, string, Jar | undefined][]} */
  const pages = [
    ['/', 'visitor', undefined],
    ['/safety', 'visitor', undefined],
    ['/tint-ladder', 'visitor', undefined],
    ['/heat-planner', 'visitor', undefined],
    ['/library', 'visitor', undefined],
    ['/library?view=grid', 'visitor', undefined],
    ['/library/search?hex=%233a5fa8', 'visitor', undefined],
    ['/sign-in', 'visitor', undefined],
    ['/sign-up', 'visitor', undefined],
    ['/forgot-password', 'visitor', undefined],
    ['/library', 'member', member],
    ['/heat-planner', 'member', member],
    ['/coupons', 'member', member],
    ['/coupons/new', 'member', member],
    ['/account', 'member', member],
    ['/admin/users', 'admin', admin],
  ];
  if (own !== undefined) pages.push([`/coupons/${own}`, 'member (owner)', member], [`/coupons/${own}/edit`, 'member (owner)', member]);
  return pages;
}

async function main() {
  const base = process.argv[2] ?? `http://127.0.0.1:${process.env.PORT ?? 4321}`;
  const rows = [];
  for (const [path, who, jar] of await pagesToMeasure(base)) {
    const { files, total } = await pageScripts(base, path, jar);
    rows.push({ page: path, as: who, files: files.size, kB: total / 1000 });
  }
  const width = Math.max(...rows.map((row) => row.page.length), 4);
  console.log(`JavaScript shipped per page, gzipped (budget ${BUDGET_KB} kB; ${base})\n`);
  console.log(`${'page'.padEnd(width)}  ${'as'.padEnd(14)}  files  ${'kB gz'.padStart(7)}  within`);
  for (const row of rows)
    console.log(
      `${row.page.padEnd(width)}  ${row.as.padEnd(14)}  ${String(row.files).padStart(5)}  ${row.kB.toFixed(1).padStart(7)}  ${row.kB <= BUDGET_KB ? 'yes' : 'NO'}`,
    );
  if (rows.some((row) => row.kB > BUDGET_KB)) process.exitCode = 1;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await main();
