import { describe, expect, it } from 'vitest';
import { baseUrl } from '../support/app';
import { useBrowser } from '../support/browser';
import { linkIn, waitForMail } from '../support/mail';

const browser = useBrowser();

describe('a new smith in Chromium', () => {
  it('signs up, confirms by e-mail, signs out, and signs in again by an e-mailed link', async () => {
    const email = `browser-${Date.now().toString(36)}@oxbloom.test`;
    await browser().clearCookies();
    const page = await browser().newPage();
    page.setDefaultTimeout(8000);

    await page.goto(`${baseUrl}/sign-up`);
    await page.getByLabel('Your name').fill('Browser Smith');
    await page.getByLabel('E-mail address').fill(email);
    await page.getByLabel('Password').fill('tempered at 300 C');
    await page.getByRole('button', { name: 'Make my account' }).click();
    await expect(page.getByText('Check your e-mail').isVisible()).resolves.toBe(true);

    const confirmation = linkIn(await waitForMail(email, 'Confirm your e-mail'), `${baseUrl}/confirm-email`);
    await page.goto(confirmation);
    await expect(page.getByRole('heading', { name: 'Your address is confirmed' }).isVisible()).resolves.toBe(true);

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(`${baseUrl}/`);
    await expect(page.getByRole('link', { name: 'Sign in' }).isVisible()).resolves.toBe(true);

    await page.goto(`${baseUrl}/sign-in`);
    await page.getByRole('region', { name: 'Or get a sign-in link' }).getByLabel('E-mail address').fill(email);
    await page.getByRole('button', { name: 'E-mail me a link' }).click();
    await page.waitForURL(/\/sign-in\/check-email/);

    const signInLink = linkIn(await waitForMail(email, 'Your Oxbloom sign-in link'), `${baseUrl}/api/auth/callback/nodemailer`);
    await page.goto(signInLink);
    await page.waitForURL(`${baseUrl}/account`);
    await expect(page.getByRole('heading', { name: 'Your account' }).isVisible()).resolves.toBe(true);
    await expect(page.getByText(`Signed in as ${email}`).isVisible()).resolves.toBe(true);
    await page.close();
  });

  it('signs in with a demo password and sees a clear message for a wrong one', async () => {
    await browser().clearCookies();
    const page = await browser().newPage();
    page.setDefaultTimeout(8000);
    await page.goto(`${baseUrl}/sign-in`);
    const form = page.getByRole('region', { name: 'Sign in' });
    await form.getByLabel('E-mail address').fill('member2@oxbloom.test');
    await form.getByLabel('Password').fill('not the right one');
    await form.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByText('That e-mail address and password do not match an account.').isVisible()).resolves.toBe(true);

    await form.getByLabel('E-mail address').fill('member2@oxbloom.test');
    await form.getByLabel('Password').fill('oxbloom-demo');
    await form.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${baseUrl}/account`);
    await expect(page.getByText('Signed in as member2@oxbloom.test').isVisible()).resolves.toBe(true);
    await page.close();
  });
});
