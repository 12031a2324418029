import type { Browser, Page } from 'playwright-core';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';

/** A page signed in as a demo account through the sign-in form, in its own browser context. */
export async function signedInPage(browser: Browser, baseUrl: string, key: string, viewport = { width: 1280, height: 900 }): Promise<Page> {
  const account = DEMO_ACCOUNTS.find((a) => a.key === key);
  if (!account) throw new Error(`no demo account ${key}`);
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password').fill(account.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).waitFor();
  return page;
}

/** Waits until the editor reports the draft saved on the server. */
export async function waitSaved(page: Page) {
  await page.locator('[data-testid="autosave-status"][data-state="saved"]').waitFor({ timeout: 15_000 });
}
