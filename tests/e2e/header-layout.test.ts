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
