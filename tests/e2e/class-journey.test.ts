// Journey 3 in Chromium, at a phone's width and a desk's: the demo instructor starts a class and
// invites a new student through the class page; the student signs up from the mailed link, logs a
// coupon with a photo and shares it with the class; the instructor builds a colour sheet with its
// swatch (moving it with the keyboard alone), publishes it (the student is mailed) and downloads
// the PDF, read back with poppler-utils.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, clientAddress } from '../support/app';
import { demo, demoPassword } from '../support/auth';
import { launchBrowser } from '../support/browser';
import { linkIn, waitForMail } from '../support/mail';
import { couponScene, encodeJpeg, renderScene, TINTS } from '../fixtures/synthetic-photos';
import { drawRegion } from '../support/photo-regions';

const widths = [
  { label: 'phone', viewport: { width: 390, height: 844 } },
  { label: 'desk', viewport: { width: 1440, height: 900 } },
];

// Two people, two browsers: the instructor's and the new student's.
let instructorBrowser: Awaited<ReturnType<typeof launchBrowser>>;
let studentBrowser: Awaited<ReturnType<typeof launchBrowser>>;
const cleanUp: { context: () => BrowserContext; path: string }[] = [];

beforeAll(async () => {
  [instructorBrowser, studentBrowser] = await Promise.all([launchBrowser(), launchBrowser()]);
  // A client address of this file's own, so sign-in and sign-up limits of other files never reach it.
  for (const browser of [instructorBrowser, studentBrowser]) await browser.context.setExtraHTTPHeaders({ 'x-forwarded-for': clientAddress });
}, 60_000);

afterAll(async () => {
  // The sheet first (it names the class), then the class, then the student's coupon.
  for (const { context, path: where } of cleanUp.reverse()) await context().request.delete(`${baseUrl}${where}`, { headers: { origin: baseUrl } });
  await Promise.all([instructorBrowser?.close(), studentBrowser?.close()]);
});

const hydrated = (page: Page) =>
  page.waitForFunction(() => document.querySelectorAll('astro-island').length > 0 && !document.querySelector('astro-island[ssr]'));

async function signIn(page: Page, email: string) {
  await page.goto(`${baseUrl}/sign-in`);
  const form = page.getByRole('region', { name: 'Sign in' });
  await form.getByLabel('E-mail address').fill(email);
  await form.getByLabel('Password').fill(demoPassword);
  await form.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${baseUrl}/account`);
}

/** Presses Tab until the focused element's accessible label starts with `prefix` (keyboard only). */
async function tabTo(page: Page, prefix: string, most = 120) {
  for (let presses = 0; presses < most; presses += 1) {
    await page.keyboard.press('Tab');
    const label = await page.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? '');
    if (label.startsWith(prefix)) return label;
  }
  throw new Error(`Tab never reached an element labelled “${prefix}…”`);
}

/** A step's time limit: photo uploads, mail and PDFs on a machine shared with other test files. */
const STEP_MS = 120_000;

const work = mkdtempSync(path.join(tmpdir(), 'oxbloom-class-journey-'));
function readPdf(bytes: Buffer) {
  const file = path.join(work, `${Math.random().toString(36).slice(2)}.pdf`);
  writeFileSync(file, bytes);
  const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
  const size = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(info)!;
  return {
    width: Number(size[1]),
    height: Number(size[2]),
    pages: Number(/Pages:\s+(\d+)/.exec(info)![1]),
    text: execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' '),
  };
}

/** The photo the student takes: one tempered layer (a blue stripe pair) beside a grey card. */
const scene = couponScene(1200, 800, [TINTS.blue, TINTS.blue], { noise: { sigma: 3, seed: 77 } });

describe.each(widths)('a class and its colour sheet in Chromium, at a $label’s width', ({ label, viewport }) => {
  const unique = `${label}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  const className = `Temper colours on 1084, ${unique}`;
  const studentEmail = `student-${unique}@oxbloom.test`;
  const couponTitle = `Ladder coupon 300 °C, ${unique}`;
  const sheetTitle = `Straw to blue, ${unique}`;
  let classPath = '';
  let sheetPath = '';
  let instructor: Page;
  let student: Page;

  beforeAll(async () => {
    [instructor, student] = await Promise.all([instructorBrowser.context.newPage(), studentBrowser.context.newPage()]);
    for (const page of [instructor, student]) {
      await page.setViewportSize(viewport);
      page.setDefaultTimeout(20_000);
    }
    await studentBrowser.context.clearCookies();
  }, 30_000);
  afterAll(async () => {
    await Promise.all([instructor?.close(), student?.close()]);
  });

  it(
    'the instructor starts a class and invites a new student through the class page',
    async () => {
      await instructorBrowser.context.clearCookies();
      await signIn(instructor, demo.instructor);
      await instructor.goto(`${baseUrl}/classes/new`);
      await instructor.getByLabel('Name', { exact: true }).fill(className);
      await instructor.getByLabel('Term').fill('Autumn 2027, Thursday evenings');
      await instructor.getByLabel('Description').fill('Four evenings of temper colours on 1084 offcuts, photographed beside the grey card.');
      await instructor.getByRole('button', { name: 'Start the class' }).click();
      await instructor.waitForURL(/\/classes\/\d+\?created=1$/);
      classPath = new URL(instructor.url()).pathname;
      cleanUp.push({ context: () => instructorBrowser.context, path: `/api${classPath}` });
      await instructor.getByText('Class started. Invite your students below.').waitFor();
      await instructor.getByRole('heading', { name: className }).waitFor();

      await instructor.getByLabel('Invite students by e-mail').fill(studentEmail);
      await instructor.getByRole('button', { name: 'Send invitations' }).click();
      await instructor.waitForURL(new RegExp(`${classPath}`));
      // The roster lists the invitation as waiting.
      await instructor
        .getByRole('listitem')
        .filter({ hasText: studentEmail })
        .getByText(/not joined yet/)
        .waitFor();
    },
    STEP_MS,
  );

  it(
    'the student signs up from the mailed link and lands in the class',
    async () => {
      expect(classPath).not.toBe('');
      const mail = await waitForMail(studentEmail, 'invites you to the class');
      // The invitation names the class and the instructor (the demo's invented instructor).
      expect(mail.subject).toContain(className);
      expect(mail.subject).toContain('Morwenna Kilnworth');
      const link = linkIn(mail, `${baseUrl}/classes/join?token=`);

      await student.goto(link);
      await student.getByRole('heading', { name: `Join ${className}` }).waitFor();
      await expect(student.getByLabel('E-mail address').inputValue()).resolves.toBe(studentEmail);
      await student.getByLabel('Your name').fill('Linnet Saltcote');
      await student.getByLabel('Password', { exact: true }).fill('straw then bronze then blue');
      await student.getByRole('button', { name: 'Make my account and join' }).click();
      await student.waitForURL(new RegExp(`${classPath}\\?joined=1$`));
      await student.getByText(`Welcome to ${className}.`).waitFor();

      // The link works once: opened again it says so, with a 410.
      const again = await student.goto(link);
      expect(again?.status()).toBe(410);
      await student.getByRole('heading', { name: 'This invitation can’t be used' }).waitFor();
    },
    STEP_MS,
  );

  let swatchHex = '';
  it(
    'the student logs a coupon with a photo and shares it with the class through the coupon page',
    async () => {
      await student.goto(`${baseUrl}/coupons/new`);
      await hydrated(student);
      await student.getByLabel('Title').fill(couponTitle);
      await student.getByLabel('Layer 1 alloy').selectOption('steel-1084');
      await student.getByLabel('Grit').fill('400');
      await student.getByLabel('Temperature (°C)').fill('300');
      await student.getByLabel('Hold time (minutes)').fill('10');
      await student.getByLabel('Only me').check();
      await student.getByRole('button', { name: 'Save coupon and add photos' }).click();
      await student.waitForURL(/\/coupons\/\d+\?added=1$/);
      const couponPath = new URL(student.url()).pathname;
      cleanUp.unshift({ context: () => studentBrowser.context, path: `/api${couponPath}` });
      await hydrated(student);

      await student
        .getByLabel('Choose photos')
        .setInputFiles({ name: 'ladder.jpg', mimeType: 'image/jpeg', buffer: await encodeJpeg(renderScene(scene.scene)) });
      await student.getByRole('listitem', { name: 'ladder.jpg' }).getByText('Added').waitFor();
      const photo = student.getByRole('article', { name: /^Photo \d+$/ });
      await drawRegion(student, scene.layers[0].region);
      await photo.getByRole('button', { name: 'Grey card' }).click();
      await drawRegion(student, scene.grey);
      await photo.getByRole('button', { name: 'Save regions' }).click();
      await photo.getByText('Regions saved; swatches updated.').waitFor();
      const chip = await photo.getByRole('region', { name: 'Swatches of Layer 1: 1084 carbon steel' }).getByRole('listitem').first().innerText();
      swatchHex = /#[0-9a-f]{6}/.exec(chip)![0];

      // Sharing: the class's box on the coupon page (the page as served, no script needed).
      await student.reload();
      const sharing = student.getByRole('group', { name: 'Share with a class' });
      await sharing.getByLabel(className).check();
      await student.getByRole('button', { name: 'Save sharing' }).click();
      await student.getByText('Class sharing saved.').waitFor();
      await expect(student.getByRole('group', { name: 'Share with a class' }).getByLabel(className).isChecked()).resolves.toBe(true);

      // The class page lists it (a table at a desk, cards on a phone) with its swatch.
      await student.goto(`${baseUrl}${classPath}`);
      await student.getByRole('link', { name: couponTitle, exact: true }).waitFor();
      await expect(student.getByText(swatchHex).first().isVisible()).resolves.toBe(true);
    },
    STEP_MS,
  );

  it(
    'the instructor builds a sheet with the swatch, arranges it by keyboard, publishes it and downloads the PDF',
    async () => {
      expect(swatchHex).not.toBe('');
      await instructor.goto(`${baseUrl}/sheets/new`);
      await hydrated(instructor);
      await instructor.getByLabel('Title').fill(sheetTitle);
      await instructor.getByLabel('Class').selectOption({ label: className });
      await instructor.getByRole('button', { name: 'Start the sheet' }).click();
      await instructor.waitForURL(/\/sheets\/\d+\/edit$/);
      sheetPath = new URL(instructor.url()).pathname.replace(/\/edit$/, '');
      cleanUp.push({ context: () => instructorBrowser.context, path: `/api${sheetPath}` });
      await hydrated(instructor);

      // The class's shared swatches are offered first.
      await expect(instructor.getByRole('button', { name: 'The class' }).getAttribute('aria-pressed')).resolves.toBe('true');
      await instructor.getByRole('button', { name: `Add ${swatchHex} from ${couponTitle}` }).click();
      await instructor.getByRole('button', { name: 'Add a heading' }).click();
      await instructor.getByRole('textbox', { name: 'Heading', exact: true }).fill('Blue: the spring temper');
      await instructor.getByRole('textbox', { name: `Caption for ${swatchHex}` }).fill('A student’s first ladder: 10 minutes at 300 °C.');

      // The heading went in after the swatch; move the swatch after it with the keyboard alone.
      await instructor.getByRole('button', { name: 'Add a heading' }).focus();
      const before = await tabTo(instructor, `swatch ${swatchHex}`);
      expect(before).toBe(`swatch ${swatchHex}, position 1 of 2`);
      await instructor.keyboard.press('ArrowDown');
      await expect.poll(() => instructor.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe(`swatch ${swatchHex}, position 2 of 2`);
      await expect(instructor.locator('[aria-live="polite"]').first().textContent()).resolves.toBe(`Moved swatch ${swatchHex} to position 2 of 2.`);

      // Autosaved, in exactly that order.
      const id = sheetPath.split('/').pop();
      const saved = async () => {
        const response = await instructor.request.get(`${baseUrl}/api/sheets/${id}`);
        const body = (await response.json()) as { entries: ({ kind: 'heading'; text: string } | { kind: 'swatch'; hex: string; caption: string })[] };
        return body.entries.map((entry) => (entry.kind === 'heading' ? entry.text : `${entry.hex} ${entry.caption}`));
      };
      await expect.poll(saved, { timeout: 15_000 }).toEqual(['Blue: the spring temper', `${swatchHex} A student’s first ladder: 10 minutes at 300 °C.`]);

      await expect(instructor.getByLabel('Who sees it when published').inputValue()).resolves.toBe('class');
      await instructor.getByRole('button', { name: 'Publish' }).click();
      await instructor.getByText('Saved · published').waitFor();

      // The student is told by e-mail, with the sheet's link.
      const mail = await waitForMail(studentEmail, `New colour sheet: ${sheetTitle}`);
      expect(linkIn(mail, `${baseUrl}/sheets/`)).toBe(`${baseUrl}${sheetPath}`);

      // The published page, and its A4 PDF downloaded from the link on it.
      await instructor.goto(`${baseUrl}${sheetPath}`);
      await instructor.getByRole('heading', { name: sheetTitle }).waitFor();
      const href = await instructor.getByRole('link', { name: 'PDF, A4' }).getAttribute('href');
      const download = await instructor.request.get(new URL(href!, baseUrl).toString());
      expect(download.status()).toBe(200);
      expect(download.headers()['content-type']).toBe('application/pdf');
      const pdf = readPdf(await download.body());
      // Source: ISO 216 A4 is 210 × 297 mm = 595.28 × 841.89 pt (1 pt = 1/72 in), written as 595 × 842.
      expect(pdf).toMatchObject({ width: 595, height: 842, pages: 1 });
      expect(pdf.text).toContain(sheetTitle);
      expect(pdf.text).toContain(swatchHex.toUpperCase());
      expect(pdf.text).toContain('Blue: the spring temper');
      expect(pdf.text).toContain(className);
    },
    STEP_MS,
  );

  it(
    'the student sees the published sheet and gets its Letter PDF',
    async () => {
      expect(sheetPath).not.toBe('');
      // From the class page's list of sheets.
      await student.goto(`${baseUrl}${classPath}`);
      await student.getByRole('region', { name: 'Colour sheets' }).getByRole('link', { name: sheetTitle }).click();
      await student.waitForURL(`${baseUrl}${sheetPath}`);
      await student.getByRole('heading', { name: sheetTitle }).waitFor();
      await student.getByText(swatchHex.toUpperCase()).waitFor();
      await student.getByText('A student’s first ladder: 10 minutes at 300 °C.').waitFor();
      await expect(student.getByRole('link', { name: 'Edit' }).count()).resolves.toBe(0);
      const href = await student.getByRole('link', { name: 'PDF, Letter' }).getAttribute('href');
      const download = await student.request.get(new URL(href!, baseUrl).toString());
      expect(download.headers()['content-type']).toBe('application/pdf');
      // Source: ANSI/ASME Y14.1 size A (US Letter) is 8.5 × 11 in = 612 × 792 pt.
      expect(readPdf(await download.body())).toMatchObject({ width: 612, height: 792 });
    },
    STEP_MS,
  );
});
