import { describe, expect, it } from 'vitest';
import { screenshot, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite({ seed: false });

describe('sign-up journey in Chromium', () => {
  it('signs up, opens the verification mail, verifies, signs in, sees the account page and signs out', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const errors = watchPageErrors(page);
    const email = 'harbour-newcomer@tidewater.test';
    const password = 'lantern-quay-pinion-snail-8';

    await page.goto(`${suite.server.baseUrl}/`);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toContain('tuning notebook');
    await screenshot(page, 'skeleton-home');

    await page.getByRole('link', { name: 'Join' }).click();
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Display name').fill('Harbour Newcomer');
    await page.getByLabel('Password').fill('password1234');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page
      .getByText(/too easy to guess/i)
      .first()
      .waitFor();
    await screenshot(page, 'skeleton-sign-up-weak-password');
    await page.getByLabel('Password').fill(password);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Check your mail').waitFor();

    // The mail catcher captured the verification mail; the dev mailbox page shows it.
    await suite.server.t.waitForMail(email, /confirm/i);
    await page.goto(`${suite.server.baseUrl}/dev/mail`);
    await page.getByText('Confirm your e-mail for Tunewright').first().waitFor();
    await screenshot(page, 'skeleton-dev-mail');
    const link = page.locator('a[href*="/verify?token="]').first();
    const spent = await link.getAttribute('href');
    await link.click();
    // Confirming signs the person in and opens their workbench; the spent link is not kept as a place to return to.
    await page.waitForURL('**/me/revisions');
    await page.getByRole('heading', { name: 'My workbench' }).waitFor();
    await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();
    await page.goto(new URL(spent!, suite.server.baseUrl).toString()); // the spent confirmation link again
    await page.getByText('That link did not work').waitFor();
    expect(await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).getAttribute('href')).toBe('/sign-in');

    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).click();
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL('**/account');
    await page.getByRole('heading', { name: 'Harbour Newcomer' }).waitFor();
    await screenshot(page, 'skeleton-account');

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();
    await page.waitForURL(`${suite.server.baseUrl}/`);
    const me = await page.evaluate(() => fetch('/api/auth/me').then((r) => r.json()));
    expect(me.data.user).toBeNull();
    expect(errors).toEqual([]);

    await page.setViewportSize({ width: 375, height: 800 });
    await page.goto(`${suite.server.baseUrl}/sign-in`);
    await screenshot(page, 'skeleton-sign-in-phone');
    await page.close();
  }, 90_000);

  it('shows the guarded pages to the wrong people as "sign in" and "not allowed"', async () => {
    const page = await suite.browser.newPage();
    await page.goto(`${suite.server.baseUrl}/admin/users`);
    await page.getByRole('heading', { name: 'Sign in to continue' }).waitFor();
    await page.goto(`${suite.server.baseUrl}/no/such/page`);
    await page.getByRole('heading', { name: 'No page here' }).waitFor();
    await page.close();
  });
});
