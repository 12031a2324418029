import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { screenshot, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';
import { signedInPage } from './guide-helpers';

const suite = browserSuite();

/** Where the header's parts sit: the brand, the last nav link, the search box and the account link. */
async function headerBoxes(page: Page) {
  return page.evaluate(() => {
    const header = document.querySelector('header')!;
    const box = (el: Element | null) => {
      if (!el) return null;
      const r = el.getBoundingClientRect();
      return { top: Math.round(r.top), bottom: Math.round(r.bottom), left: Math.round(r.left), right: Math.round(r.right), height: Math.round(r.height) };
    };
    const links = header.querySelectorAll('nav[aria-label="Main"] a');
    return {
      header: box(header)!,
      brand: box(header.querySelector('a[aria-label="Tunewright home"]'))!,
      lastLink: box(links[links.length - 1]),
      search: box(header.querySelector('[role="search"]')),
      account: box(header.querySelector('a[href="/account"], a[href^="/sign-in"]')),
      // The last control of the search-and-account group (Sign out, or Join for a visitor).
      lastControl: box(header.querySelector('[role="search"]')?.parentElement?.lastElementChild?.lastElementChild ?? null),
      overflowX: document.documentElement.scrollWidth > window.innerWidth,
    };
  });
}

/** True when b's vertical middle lies within a's band (the two sit on one row). */
const sameRow = (a: { top: number; bottom: number }, b: { top: number; bottom: number }) => {
  const mid = (b.top + b.bottom) / 2;
  return mid >= a.top && mid <= a.bottom;
};

type Who = 'visitor' | 'rosa' | 'owen' | 'nell';

/** /guides at `width` px as `who` sees it once the header has loaded (the account's name, the queue count). */
async function openAs(who: Who, width: number) {
  const page =
    who === 'visitor'
      ? await suite.browser.newPage({ viewport: { width, height: 800 } })
      : await signedInPage(suite.browser, suite.server.baseUrl, who, { width, height: 800 });
  const errors = watchPageErrors(page);
  await page.goto(`${suite.server.baseUrl}/guides`);
  await page.getByRole('heading', { level: 1 }).first().waitFor();
  if (who !== 'visitor')
    await page
      .getByRole('banner')
      .getByRole('link', { name: DEMO_ACCOUNTS.find((a) => a.key === who)!.displayName })
      .waitFor();
  if (who === 'owen' || who === 'nell')
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: /Review \d+/ })
      .waitFor();
  return { page, errors, boxes: await headerBoxes(page) };
}

describe('site header', () => {
  // The widest navigation is the administrator's (every item plus the review count).
  const oneRow: Array<[Who, number]> = [
    ['visitor', 1280],
    ['rosa', 1280],
    ['owen', 1280],
    ['nell', 1280],
    ['visitor', 1024],
    ['rosa', 1024],
  ];
  for (const [who, width] of oneRow) {
    it(`keeps brand, navigation, search and account on one row at ${width} px for ${who}`, async () => {
      const { page, errors, boxes: b } = await openAs(who, width);
      expect(b.overflowX).toBe(false);
      expect(b.lastLink && sameRow(b.brand, b.lastLink)).toBe(true);
      expect(b.search && sameRow(b.brand, b.search)).toBe(true);
      expect(b.account && sameRow(b.brand, b.account)).toBe(true);
      // One row of controls: the header is no taller than the tallest control plus its padding.
      expect(b.header.height).toBeLessThan(72);
      if (who === 'owen' || who === 'nell') await screenshot(page, `header-${who}-${width}`);
      expect(errors).toEqual([]);
      await page.context().close();
    });
  }

  it("gives a moderator's longer navigation its own row at 1024 px, with search and account tidy beneath it", async () => {
    const { page, errors, boxes: b } = await openAs('nell', 1024);
    expect(b.overflowX).toBe(false);
    expect(b.lastLink && sameRow(b.brand, b.lastLink)).toBe(true);
    expect(b.search && b.account).toBeTruthy();
    // Search and account share the second row, below the first, and end at the header's right edge like the content.
    expect(sameRow(b.search!, b.account!)).toBe(true);
    expect(b.search!.top).toBeGreaterThanOrEqual(b.brand.bottom);
    expect(b.lastControl!.right).toBeGreaterThan(1024 - 40);
    await screenshot(page, 'header-nell-1024');
    expect(errors).toEqual([]);
    await page.context().close();
  });

  it('opens the Notebook (setups, run logs, motors) from one header entry, by mouse and by keyboard, at 1280 px', async () => {
    const { page, errors, boxes: b } = await openAs('rosa', 1280);
    const nav = page.getByRole('navigation', { name: 'Main' });
    const notebook = nav.getByRole('button', { name: 'Notebook' });
    const box = (await notebook.boundingBox())!;
    expect(sameRow(b.brand, { top: box.y, bottom: box.y + box.height })).toBe(true);
    expect(await notebook.getAttribute('aria-expanded')).toBe('false');

    // Keyboard: Enter opens, the arrow moves into the list, Escape closes and puts focus back on the button.
    await notebook.focus();
    await page.keyboard.press('Enter');
    await nav.getByRole('link', { name: /Run logs/ }).waitFor();
    expect(await notebook.getAttribute('aria-expanded')).toBe('true');
    await page.keyboard.press('ArrowDown');
    await expect.poll(() => page.evaluate(() => document.activeElement?.textContent ?? '')).toMatch(/^Setups/);
    await page.keyboard.press('ArrowDown');
    await expect.poll(() => page.evaluate(() => document.activeElement?.textContent ?? '')).toMatch(/^Run logs/);
    await screenshot(page, 'header-notebook-open-1280');
    const after = await headerBoxes(page);
    expect(after.overflowX).toBe(false);
    expect(after.header.height).toBe(b.header.height); // the list floats over the page; the header keeps its one row
    await page.keyboard.press('Escape');
    await nav.getByRole('link', { name: /Run logs/ }).waitFor({ state: 'detached' });
    expect(await notebook.getAttribute('aria-expanded')).toBe('false');
    expect(await notebook.evaluate((el) => el === document.activeElement)).toBe(true);

    // Mouse: a click elsewhere closes it; choosing an entry goes there and closes it.
    await notebook.click();
    await nav.getByRole('link', { name: /Motors/ }).waitFor();
    await page
      .getByRole('heading', { level: 1 })
      .first()
      .click({ position: { x: 5, y: 5 } });
    await nav.getByRole('link', { name: /Motors/ }).waitFor({ state: 'detached' });
    await notebook.click();
    await nav.getByRole('link', { name: /Motors/ }).click();
    await page.waitForURL('**/motors');
    await nav.getByRole('link', { name: /Motors/ }).waitFor({ state: 'detached' });
    // The entry shows that a notebook page is the current one.
    await expect.poll(() => notebook.evaluate((el) => el.className)).toMatch(/bg-ink/);
    expect(errors).toEqual([]);
    await page.context().close();
  }, 90_000);

  it('reaches the Notebook inside the phone menu at 390 px', async () => {
    const page = await signedInPage(suite.browser, suite.server.baseUrl, 'rosa', { width: 390, height: 844 });
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/guides`);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    await page.getByRole('button', { name: 'Menu' }).click();
    const nav = page.getByRole('navigation', { name: 'Main' });
    await nav.getByRole('button', { name: 'Notebook' }).click();
    await nav.getByRole('link', { name: /Run logs/ }).waitFor();
    expect((await headerBoxes(page)).overflowX).toBe(false);
    await screenshot(page, 'header-notebook-open-phone');
    await page.keyboard.press('Escape');
    await nav.getByRole('link', { name: /Run logs/ }).waitFor({ state: 'detached' });
    expect(await nav.isVisible()).toBe(true); // Escape closed the Notebook list, not the phone menu
    await nav.getByRole('button', { name: 'Notebook' }).click();
    await nav.getByRole('link', { name: /Run logs/ }).click();
    await page.waitForURL('**/runs');
    // Choosing a page folds the phone menu away again.
    await expect.poll(() => nav.isVisible()).toBe(false);
    expect(errors).toEqual([]);
    await page.context().close();
  }, 90_000);

  it('folds navigation, search and account into the menu on a phone', async () => {
    const page = await signedInPage(suite.browser, suite.server.baseUrl, 'nell', { width: 375, height: 780 });
    await page.goto(`${suite.server.baseUrl}/guides`);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    const nav = page.getByRole('navigation', { name: 'Main' });
    expect(await nav.isVisible()).toBe(false);
    await page.getByRole('button', { name: 'Menu' }).click();
    await nav.getByRole('link', { name: 'Review' }).waitFor();
    expect(await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).isVisible()).toBe(true);
    const b = await headerBoxes(page);
    expect(b.overflowX).toBe(false);
    await screenshot(page, 'header-menu-open-phone');
    await page.context().close();
  });
});
