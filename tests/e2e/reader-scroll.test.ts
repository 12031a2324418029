import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { screenshot, waitForApp, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();
const GUIDE = '/guides/stock-2wd-buggy-harbour-flats-clay';

async function open(path: string, width: number) {
  const page = await suite.browser.newPage({ viewport: { width, height: 800 } });
  const errors = watchPageErrors(page);
  await page.goto(`${suite.server.baseUrl}${path}`);
  await waitForApp(page);
  return { page, errors };
}

const scrollY = (page: Page) => page.evaluate(() => Math.round(window.scrollY));
/** Where an element's top sits in the viewport, in px. */
const topOf = (page: Page, selector: string) => page.evaluate((s) => Math.round(document.querySelector(s)!.getBoundingClientRect().top), selector);

describe('reading on a phone and a laptop: scroll, jump links, search', () => {
  for (const width of [390, 1366]) {
    it(`at ${width} px a followed link opens its page at the top and Back returns to the exact place`, async () => {
      const { page, errors } = await open('/parameters/drag-brake', width);
      const guideLink = page.getByTestId('parameter-guides').getByRole('link').first();
      await guideLink.scrollIntoViewIfNeeded();
      await page.evaluate(() => window.scrollBy(0, 37)); // an uneven place, not an element's top
      expect(await scrollY(page)).toBeGreaterThan(200);
      await guideLink.hover(); // the pointer reaches it (Playwright scrolls a partly hidden link into view, as a reader would)
      // Where the link sits on screen as it is followed (the page may still have grown above it since the scroll).
      await page.evaluate(() => document.querySelector('[data-testid="parameter-guides"] a')!.setAttribute('data-followed', ''));
      const linkTop = () => topOf(page, '[data-followed]');
      const before = await linkTop();
      await guideLink.click();
      await page.locator('#guide-title').waitFor();
      await expect.poll(() => scrollY(page)).toBe(0);
      // Give the page time to load its cards: it must stay at the top (it used to open thousands of px down).
      await page.getByTestId('guide-toc').waitFor();
      expect(await scrollY(page)).toBe(0);

      await page.goBack();
      await page.getByRole('heading', { level: 1, name: 'Drag brake' }).waitFor();
      await page.evaluate(() => document.querySelector('[data-testid="parameter-guides"] a')!.setAttribute('data-followed', ''));
      await expect.poll(async () => Math.abs((await linkTop()) - before)).toBeLessThanOrEqual(2);
      expect(await scrollY(page)).toBeGreaterThan(200);

      // Forward goes back to the guide's top as well (where the reader left it).
      await page.goForward();
      await page.locator('#guide-title').waitFor();
      await expect.poll(() => scrollY(page)).toBe(0);
      expect(errors).toEqual([]);
      await page.close();
    });

    it(`at ${width} px the guide lists its sections, jumps to them and to the baseline, and Back returns`, async () => {
      const { page, errors } = await open(GUIDE, width);
      const toc = page.getByTestId('guide-toc');
      await toc.waitFor();
      const entries = await toc.getByRole('listitem').allInnerTexts();
      expect(entries).toEqual(expect.arrayContaining(['The context', 'Baseline', 'What to watch', 'Checklist']));
      await screenshot(page, `guide-toc-${width}`);

      // On a phone the contents may sit below the fold: the reader scrolls to them first, and Back returns there.
      const tocLink = toc.getByRole('link', { name: 'What to watch' });
      await tocLink.hover();
      const atToc = await scrollY(page);
      await tocLink.click();
      await expect.poll(() => page.url()).toMatch(/#section-what-to-watch$/);
      // The heading lands at the top with its small margin (16 px), whatever loads above it.
      await expect.poll(() => topOf(page, '#section-what-to-watch')).toBeLessThanOrEqual(20);
      expect(await topOf(page, '#section-what-to-watch')).toBeGreaterThanOrEqual(0);

      await page.goBack();
      await expect.poll(() => scrollY(page)).toBe(atToc);

      await toc.getByRole('link', { name: 'Jump to baseline' }).click();
      await page.getByTestId('baseline-settings').waitFor();
      await expect.poll(() => topOf(page, '#setup')).toBeLessThanOrEqual(20);
      // The baseline card shows the settings themselves, not only the figures computed from them.
      const settings = await page.getByTestId('baseline-settings').innerText();
      expect(settings).toMatch(/Pinion/);
      expect(settings).toMatch(/Spur/);
      expect(settings).toMatch(/Drag brake/i);
      await screenshot(page, `guide-baseline-${width}`);
      expect(errors).toEqual([]);
      await page.close();
    });

    it(`at ${width} px an address with an anchor opens at that section, and the print sheet opens at its top`, async () => {
      const { page, errors } = await open(`${GUIDE}#section-checklist`, width);
      await expect.poll(() => topOf(page, '#section-checklist')).toBeLessThanOrEqual(20);
      expect(await topOf(page, '#section-checklist')).toBeGreaterThanOrEqual(0);

      await page.locator('#setup').getByRole('link', { name: 'Print sheet' }).click();
      await page.locator('.print-sheet').waitFor();
      await expect.poll(() => scrollY(page)).toBe(0);
      expect(errors).toEqual([]);
      await page.close();
    });
  }

  it('at 390 px the search box is on screen on every page without opening the menu', async () => {
    for (const path of ['/', '/guides', GUIDE, '/calculators/gearing', '/setups']) {
      const { page } = await open(path, 390);
      const box = page.getByRole('banner').getByRole('combobox');
      await box.waitFor({ timeout: 5000 }); // visible (the header's search box arrives with the app)
      expect(await box.isVisible(), path).toBe(true);
      expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
      if (path === '/') {
        await box.fill('drag brake');
        await box.press('Enter');
        await page.waitForURL(/\/search\?q=drag/);
        await screenshot(page, 'phone-search-390');
      }
      await page.close();
    }
  });

  it("a worked example's inputs are reached by Tab before its card has loaded", async () => {
    const { page, errors } = await open('/parameters/ramped-advance', 390);
    const placeholder = page.locator('[data-example-placeholder]').first();
    await placeholder.waitFor();
    // Tab from the element just before the card: the placeholder is the next stop, and the focus moves into the card's first input.
    await placeholder.getByRole('button').focus();
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.tagName === 'INPUT' && !!document.activeElement.closest('[data-worked-example]')))
      .toBe(true);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('guide chips open the filtered guide list, and list filters live in the address', async () => {
    const { page, errors } = await open(GUIDE, 1366);
    await page.getByRole('link', { name: /^Guides on / }).click();
    await page.waitForURL(/\/guides\?surface=/);
    const surface = new URL(page.url()).searchParams.get('surface');
    await expect.poll(() => page.getByLabel('Surface').inputValue()).toBe(surface);

    await page.goto(`${suite.server.baseUrl}${GUIDE}`);
    await waitForApp(page);
    const tag = page.getByRole('list', { name: 'Tags' }).getByRole('link').first();
    const tagName = (await tag.innerText()).trim();
    await tag.click();
    await page.waitForURL(/\/guides\?tag=/);
    await page.getByText(`“${tagName}”`).waitFor();
    // Every guide listed carries the tag (the server filters; the guide we came from is among them).
    await page
      .getByRole('link', { name: /stock 2wd/i })
      .first()
      .waitFor();

    await page.goto(`${suite.server.baseUrl}/setups?class=buggy-2wd-stock`);
    await waitForApp(page);
    const filter = page.getByRole('group', { name: 'Filter baselines' });
    await expect.poll(() => filter.getByLabel('Class').inputValue()).toBe('buggy-2wd-stock');
    await filter.getByLabel('Surface').selectOption({ index: 1 });
    await expect.poll(() => new URL(page.url()).searchParams.get('surface')).toBeTruthy();
    expect(new URL(page.url()).searchParams.get('class')).toBe('buggy-2wd-stock');
    expect(errors).toEqual([]);
    await page.close();
  });
});
