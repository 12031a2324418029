import { describe, expect, it } from 'vitest';
import { screenshot, screenshotPath, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

describe('search in Chromium', () => {
  it('types into the header box, moves through suggestions with the keyboard and opens one', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/`);
    const box = page.getByRole('combobox', { name: /search/i });
    await box.pressSequentially('dragbr', { delay: 40 });
    const list = page.getByRole('listbox', { name: 'Suggestions' });
    await list
      .getByRole('option', { name: /Drag brake/ })
      .first()
      .waitFor();
    await expect.poll(() => box.getAttribute('aria-expanded')).toBe('true');
    await screenshot(page, 'search-suggestions-desktop');

    await box.press('ArrowDown');
    const firstId = await list.getByRole('option').first().getAttribute('id');
    expect(await box.getAttribute('aria-activedescendant')).toBe(firstId);
    expect(await list.getByRole('option').first().getAttribute('aria-selected')).toBe('true');
    await box.press('Enter');
    await page.waitForURL('**/parameters/drag-brake');

    // Mouse works too, and Escape closes the list.
    await page.goto(`${suite.server.baseUrl}/`);
    await box.pressSequentially('punch', { delay: 30 });
    await list.getByRole('option', { name: /Throttle punch/ }).waitFor();
    await box.press('Escape');
    await expect.poll(() => box.getAttribute('aria-expanded')).toBe('false');
    await box.press('ArrowDown');
    await list.getByRole('option', { name: /Throttle punch/ }).click();
    await page.waitForURL('**/parameters/throttle-punch');

    // Enter with nothing highlighted opens the full results page.
    await page.goto(`${suite.server.baseUrl}/`);
    await box.fill('17.5T buggy clay');
    await box.press('Enter');
    await page.waitForURL(/\/search\?q=17\.5T\+buggy\+clay|\/search\?q=17\.5T%20buggy%20clay/);
    await page.getByRole('link', { name: 'Stock 2WD buggy on Harbour Flats clay, tight layout', exact: true }).waitFor();
    expect(errors).toEqual([]);
  });

  it('shows results with highlighted snippets and facets whose filters live in the URL', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/search?q=drag%20brake`);
    const results = page.getByRole('region', { name: /results for/i });
    await results.getByRole('link', { name: 'Drag brake' }).first().waitFor();
    const marks = await results.locator('mark').allTextContents();
    expect(marks.map((m) => m.toLowerCase())).toEqual(expect.arrayContaining(['drag', 'brake']));
    // Highlighting is rendered as elements, never as markup text.
    expect(await results.textContent()).not.toContain('<mark>');
    await screenshot(page, 'search-page-desktop');

    await page.getByRole('group', { name: 'Surface' }).getByRole('button', { name: /Clay/ }).click();
    await page.waitForURL(/surface=clay/);
    // The previous list stays (dimmed) until the filtered one arrives; wait for the filtered one.
    await expect
      .poll(async () => {
        const t = await results.getByRole('link').allTextContents();
        return t.length > 0 && t.every((x) => /clay/i.test(x));
      })
      .toBe(true);
    const titles = await results.getByRole('link').allTextContents();
    expect(titles.length).toBeGreaterThan(1);
    // The filtered search is shareable: opening the URL afresh shows the same thing.
    const shared = page.url();
    const other = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await other.goto(shared);
    await other.getByRole('button', { name: /Surface: Clay/ }).waitFor();
    expect(
      await other
        .getByRole('region', { name: /results for/i })
        .getByRole('link')
        .allTextContents(),
    ).toEqual(titles);
    expect(errors).toEqual([]);
  });

  it('offers "did you mean" and starting points when nothing matches', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await page.goto(`${suite.server.baseUrl}/search?q=drgabrkae`);
    await page.getByText('Did you mean').waitFor();
    await screenshot(page, 'search-empty-desktop');
    await page.getByRole('button', { name: 'Drag brake' }).click();
    await page.waitForURL(/q=Drag\+brake|q=Drag%20brake/);
    await page
      .getByRole('region', { name: /results for/i })
      .getByRole('link', { name: 'Drag brake' })
      .first()
      .waitFor();
  });

  it('works at phone width', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 375, height: 800 } });
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/`);
    await page.getByRole('button', { name: 'Menu' }).click();
    const box = page.getByRole('combobox', { name: /search/i });
    await box.pressSequentially('lvc', { delay: 40 });
    await page.getByRole('option', { name: /Low-voltage cutoff/ }).waitFor();
    await screenshot(page, 'search-suggestions-375');
    const width = await page.evaluate(() => document.documentElement.scrollWidth);
    expect(width).toBeLessThanOrEqual(375);
    await page.goto(`${suite.server.baseUrl}/search?q=blinky%20touring`);
    await page
      .getByRole('region', { name: /results for/i })
      .getByRole('link')
      .first()
      .waitFor();
    await screenshot(page, 'search-page-375');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
    expect(errors).toEqual([]);
  });

  it('at 390 px: says what it searched for, and pages through every match with "show more"', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 390, height: 844 } });
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/search?q=dragbreak`);
    const note = page.getByTestId('searched-for');
    await note.waitFor();
    expect(await note.textContent()).toMatch(/Showing results for drag brake — you typed “dragbreak”/);
    await page
      .getByRole('region', { name: /results for/i })
      .getByRole('link', { name: 'Drag brake' })
      .first()
      .waitFor();
    await screenshot(page, 'search-searched-for-390');
    await page.screenshot({ path: screenshotPath('search-searched-for-390-top') });

    // A query with more matches than one page (20).
    let q = '';
    let total = 0;
    for (const candidate of ['brake', 'motor', 'throttle', 'clay', 'timing']) {
      const res = await page.request.get(`${suite.server.baseUrl}/api/search?q=${candidate}&limit=1`);
      total = (await res.json()).meta.total;
      if (total > 20) {
        q = candidate;
        break;
      }
    }
    expect(q, 'a query with more than one page of matches').not.toBe('');
    await page.goto(`${suite.server.baseUrl}/search?q=${q}`);
    const results = page.getByRole('region', { name: /results for/i });
    await results.getByRole('listitem').first().waitFor();
    expect(await results.getByRole('listitem').count()).toBe(20);
    expect(await results.textContent()).toContain(`Showing 20 of ${total}`);
    for (let shown = 20; shown < total; shown += 20) {
      await results.getByRole('button', { name: /^Show \d+ more$/ }).click();
      await expect.poll(() => results.getByRole('listitem').count()).toBe(Math.min(total, shown + 20));
    }
    expect(await results.getByRole('button', { name: /more$/ }).count()).toBe(0);
    const hrefs = await results
      .getByRole('listitem')
      .locator('a')
      .evaluateAll((as) => as.map((a) => `${a.textContent}|${a.getAttribute('href')}`));
    expect(new Set(hrefs).size).toBe(total);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await screenshot(page, 'search-show-more-390');
    await results.getByText(`All ${total} shown`).scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath('search-show-more-390-end') });
    expect(errors).toEqual([]);
  });
});
