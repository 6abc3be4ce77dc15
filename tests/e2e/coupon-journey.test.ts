// Journey 1 in Chromium, at phone and desk width: a brand-new person signs up (the confirmation
// link read from the captured mail), logs a two-layer coupon, uploads a photo of it by the file
// picker, watches the upload finish, marks a region per layer and the grey card, and sees the
// swatches; then another member cannot open the coupon while it is private.
import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { converter, differenceCiede2000 } from 'culori';
import { api, baseUrl, clientAddress } from '../support/app';
import { demo, demoPassword, signedIn } from '../support/auth';
import { useBrowser } from '../support/browser';
import { linkIn, waitForMail } from '../support/mail';
import { couponScene, encodeJpeg, illuminantACast, renderScene, TINTS } from '../fixtures/synthetic-photos';
import { drawRegion } from '../support/photo-regions';

// ΔE00 per Sharma, Wu & Dalal (2005) on CIELAB D65 per CIE 15.
const ciede2000 = differenceCiede2000();
const toLab65 = converter('lab65');
const deltaE = (first: string, second: string) => ciede2000(toLab65(first)!, toLab65(second)!);

const browser = useBrowser();

/** The photo: straw over purple, a grey card beside them, under a warm (illuminant A) light. */
const scene = couponScene(1200, 800, [TINTS.straw, TINTS.purple], { cast: illuminantACast(), noise: { sigma: 4, seed: 51 } });

async function signIn(page: Page, email: string, password = demoPassword) {
  await browser().clearCookies();
  await page.goto(`${baseUrl}/sign-in`);
  const form = page.getByRole('region', { name: 'Sign in' });
  await form.getByLabel('E-mail address').fill(email);
  await form.getByLabel('Password').fill(password);
  await form.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${baseUrl}/account`);
}

const NEW_PASSWORD = 'quenched from 800 C';

/** A brand-new person signs up and confirms the address from the mailed link; returns the address. */
async function signUp(page: Page, width: string): Promise<string> {
  // This file's own client address, so other files' sign-up limits never reach it.
  await browser().setExtraHTTPHeaders({ 'x-forwarded-for': clientAddress });
  // Signed out: an earlier test of this file left someone signed in.
  await browser().clearCookies();
  const email = `coupons-${width}-${Date.now().toString(36)}@oxbloom.test`;
  await page.goto(`${baseUrl}/sign-up`);
  await page.getByLabel('Your name').fill(`Coupon Logger ${width}`);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password').fill(NEW_PASSWORD);
  await page.getByRole('button', { name: 'Make my account' }).click();
  await expect.poll(() => page.getByText('Check your e-mail').isVisible()).toBe(true);
  await page.goto(linkIn(await waitForMail(email, 'Confirm your e-mail', 0, 20_000), `${baseUrl}/confirm-email`));
  await expect.poll(() => page.getByRole('heading', { name: 'Your address is confirmed' }).isVisible()).toBe(true);
  return email;
}

const widths = [
  { name: 'phone', width: 390, height: 844 },
  { name: 'desk', width: 1440, height: 900 },
];

const hydrated = (page: Page) =>
  page.waitForFunction(() => document.querySelectorAll('astro-island').length > 0 && !document.querySelector('astro-island[ssr]'));

describe.each(widths)('logging a coupon with photos in Chromium at $name width', (width) => {
  let couponPath: string;
  let email: string;

  // The library stays as it was for the other tests.
  afterAll(async () => {
    if (couponPath) await api(`/api${couponPath}`, { jar: await signedIn(email, NEW_PASSWORD), method: 'DELETE' });
  });

  it('a new person signs up, logs a two-layer coupon, uploads a photo, marks its layers and sees their swatches', async () => {
    const page = await browser().newPage();
    page.setDefaultTimeout(15_000);
    await page.setViewportSize({ width: width.width, height: width.height });
    email = await signUp(page, width.name);
    await signIn(page, email, NEW_PASSWORD);

    await page.goto(`${baseUrl}/coupons/new`);
    await hydrated(page);
    await page.getByLabel('Title').fill('Browser journey laminate, 560 °C');
    await page.getByLabel('Layer 1 alloy').selectOption('ti-grade-2');
    await page.getByRole('button', { name: 'Add a layer' }).click();
    await page.getByLabel('Layer 2 alloy').selectOption('ti-grade-5');
    await page.getByLabel('Grit').fill('400');
    await page.getByLabel('Temperature (°C)').fill('560');
    await page.getByLabel('Hold time (minutes)').fill('30');
    await page.getByLabel('Only me').check();
    await page.getByRole('button', { name: 'Save coupon and add photos' }).click();
    await page.waitForURL(/\/coupons\/\d+\?added=1$/);
    couponPath = new URL(page.url()).pathname;
    await hydrated(page);

    // Upload by the file picker over a slow link, watching the progress bar fill; then it is added.
    const jpeg = await encodeJpeg(renderScene(scene.scene));
    const network = await browser().newCDPSession(page);
    await network.send('Network.enable');
    await network.send('Network.emulateNetworkConditions', {
      offline: false,
      latency: 20,
      downloadThroughput: -1,
      uploadThroughput: Math.round(jpeg.length / 3),
    });
    await page.getByLabel('Choose photos').setInputFiles({ name: 'laminate.jpg', mimeType: 'image/jpeg', buffer: jpeg });
    const upload = page.getByRole('listitem', { name: 'laminate.jpg' });
    const progress = upload.getByRole('progressbar');
    await page.waitForFunction(() =>
      [...document.querySelectorAll('[role="progressbar"]')].some((bar) => {
        const percent = Number(bar.getAttribute('aria-valuenow'));
        return percent > 0 && percent < 100;
      }),
    );
    await upload.getByText('Added').waitFor();
    expect(await progress.getAttribute('aria-valuenow')).toBe('100');
    await network.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

    // Until a layer is marked, the whole photo is measured.
    const photo = page.getByRole('article', { name: /^Photo \d+$/ });
    await photo.getByText('Whole photo (no layer marked yet)').waitFor();

    // One rectangle per layer (the editor moves on to the next layer by itself), then the grey card.
    await expect(photo.getByRole('button', { name: 'Layer 1: Titanium Grade 2' }).getAttribute('aria-pressed')).resolves.toBe('true');
    await drawRegion(page, scene.layers[0].region);
    await drawRegion(page, scene.layers[1].region);
    await photo.getByRole('button', { name: 'Grey card' }).click();
    await drawRegion(page, scene.grey);
    for (const name of ['Layer 1: Titanium Grade 2 region', 'Layer 2: Ti-6Al-4V (Grade 5) region', 'Grey card region']) {
      await photo.getByRole('group', { name }).waitFor();
    }
    await photo.getByRole('button', { name: 'Save regions' }).click();
    await photo.getByText('Regions saved; swatches updated.').waitFor();

    // Swatches per layer, white-balanced from the grey card: the leading chip is the layer's colour.
    // Source: the known layer colours of the synthetic scene (see tests/fixtures/synthetic-photos.ts).
    await photo.getByText('White-balanced and exposed from the grey card.').waitFor();
    for (const [index, name] of ['Layer 1: Titanium Grade 2', 'Layer 2: Ti-6Al-4V (Grade 5)'].entries()) {
      const swatches = photo.getByRole('region', { name: `Swatches of ${name}` });
      const chip = swatches.getByRole('listitem').first();
      const text = await chip.innerText();
      expect(text).toMatch(/\d+ %/);
      expect(text).toMatch(/L\* \d+\.\d/);
      const hex = /#[0-9a-f]{6}/.exec(text)![0];
      expect(deltaE(hex, scene.layers[index].colour)).toBeLessThan(2);
    }
    await expect(photo.getByText('Whole photo (no layer marked yet)').count()).resolves.toBe(0);

    // The page shows the same after a reload (it was saved, not only drawn).
    await page.reload();
    await page.getByRole('region', { name: 'Swatches of Layer 2: Ti-6Al-4V (Grade 5)' }).waitFor();
    await page.close();
  });

  it('does not show the private coupon to another member', async () => {
    expect(couponPath).toBeDefined();
    const page = await browser().newPage();
    page.setDefaultTimeout(15_000);
    await signIn(page, demo.member2);
    const response = await page.goto(`${baseUrl}${couponPath}`);
    expect(response?.status()).toBe(404);
    await expect(page.getByRole('heading', { name: 'Nothing here' }).isVisible()).resolves.toBe(true);
    await expect(page.getByText('Browser journey laminate').count()).resolves.toBe(0);
    await page.close();
  });
});

describe('the coupon form in Chromium', () => {
  it('keeps the draft and says so when the session has ended before saving', async () => {
    const page = await browser().newPage();
    page.setDefaultTimeout(15_000);
    await signIn(page, demo.member);
    await page.goto(`${baseUrl}/coupons/new`);
    await hydrated(page);
    await page.getByLabel('Title').fill('Coupon typed while signed out');
    await page.getByLabel('Layer 1 alloy').selectOption('steel-1084');
    await page.getByLabel('Temperature (°C)').fill('230');
    await page.getByLabel('Hold time (minutes)').fill('60');
    // The session ends (signed out in another tab, or expired) while the form is open.
    await browser().clearCookies();
    await page.getByRole('button', { name: 'Save coupon and add photos' }).click();
    await expect(page.getByRole('alert').textContent()).resolves.toBe('Your session has ended: sign in again in another tab, then save — your draft is kept.');
    const draft = await page.evaluate(() => localStorage.getItem('oxbloom:coupon-draft:new'));
    expect(JSON.parse(draft!)).toMatchObject({ title: 'Coupon typed while signed out', layers: ['steel-1084'], temperature: '230' });
    await page.evaluate(() => localStorage.removeItem('oxbloom:coupon-draft:new'));
    await page.close();
  });
});
