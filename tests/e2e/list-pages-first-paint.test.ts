import { describe, expect, it } from 'vitest';
import { holdAppCode, screenshot, VIEWPORTS, waitForApp, watchApiRequests, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

// The four pages a reader lands on from a link or a search engine, what each must show without script,
// and the API reads the page came with (the app must not ask for them again when it takes over).
const PAGES = [
  {
    name: 'home',
    path: '/',
    heading: 'The tuning notebook for speed controllers, motors and gearing.',
    text: 'Heat and lithium packs deserve respect',
    sent: [],
  },
  { name: 'parameter-library', path: '/parameters', heading: 'Parameter library', text: 'Low-voltage cutoff', sent: ['/api/parameters'] },
  { name: 'guides', path: '/guides', heading: 'Guides', text: 'Stock 2WD buggy on Harbour Flats clay, tight layout', sent: ['/api/guides', '/api/parameters'] },
  { name: 'search', path: '/search?q=drag+brake', heading: '“drag brake”', text: 'Drag brake', sent: ['/api/search'] },
];

describe('home, library, guides list and search results drawn on the server', () => {
  it('read without script: each page’s heading and content are in the page itself', async () => {
    const context = await suite.browser.newContext({ javaScriptEnabled: false, viewport: VIEWPORTS.phone });
    const page = await context.newPage();
    for (const p of PAGES) {
      const res = await page.goto(`${suite.server.baseUrl}${p.path}`);
      expect(res?.status(), p.path).toBe(200);
      await expect(page.getByRole('heading', { level: 1, name: p.heading }).isVisible(), p.path).resolves.toBe(true);
      await expect(page.locator('main').getByText(p.text).first().isVisible(), p.path).resolves.toBe(true);
      await screenshot(page, `${p.name}-no-script-phone`);
    }
    // The search results page lists its hits as links, with their counts.
    await page.goto(`${suite.server.baseUrl}/search?q=drag+brake`);
    await expect(page.getByRole('heading', { level: 2, name: /\d+ results? for/ }).isVisible()).resolves.toBe(true);
    await expect(page.getByRole('link', { name: 'Drag brake' }).first().isVisible()).resolves.toBe(true);
    await context.close();
  });

  it('the app takes over each page in one go: no blank or spinner in between, no second copy, no repeated reads', async () => {
    for (const p of PAGES) {
      const page = await suite.browser.newPage({ viewport: VIEWPORTS.desktop });
      const errors = watchPageErrors(page);
      const api = watchApiRequests(page);
      const release = await holdAppCode(page);
      await page.goto(`${suite.server.baseUrl}${p.path}`);
      await page.getByRole('heading', { level: 1, name: p.heading }).waitFor();
      // From now on, every change to the page is looked at: the heading must always be there, once.
      await page.evaluate(() => {
        const w = window as unknown as { __headings: number[] };
        w.__headings = [];
        new MutationObserver(() => w.__headings.push(document.querySelectorAll('#root h1').length)).observe(document.getElementById('root')!, {
          childList: true,
          subtree: true,
        });
      });
      release();
      await waitForApp(page);
      await page.getByRole('heading', { level: 1, name: p.heading }).waitFor();
      const seen = await page.evaluate(() => (window as unknown as { __headings: number[] }).__headings);
      expect(seen.length, `${p.path}: the app replaced the page`).toBeGreaterThan(0);
      expect(Math.min(...seen), `${p.path}: never without its heading`).toBe(1);
      expect(Math.max(...seen), `${p.path}: never two copies`).toBe(1);
      await page.locator('main').getByText(p.text).first().waitFor();
      for (const read of p.sent) expect(api, `${p.path} asked again for ${read}`).not.toContain(read);
      expect(api).not.toContain('/api/auth/me');
      expect(errors).toEqual([]);
      await page.close();
    }
  });

  it('search results page works as the app after the take-over: a filter narrows the results', async () => {
    const page = await suite.browser.newPage({ viewport: VIEWPORTS.desktop });
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/search?q=brake`);
    await waitForApp(page);
    const count = page.locator('#results-heading');
    const before = await count.innerText();
    await page
      .getByRole('complementary', { name: 'Filter results' })
      .getByRole('button', { name: /^Guide/ })
      .first()
      .click();
    await page.waitForURL(/type=guide/);
    await expect.poll(() => count.innerText()).not.toBe(before);
    expect(errors).toEqual([]);
    await page.close();
  });
});
