import { describe, expect, it } from 'vitest';
import { holdAppCode, revealWorkedExamples, screenshot, VIEWPORTS, waitForApp, watchApiRequests, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';

const SLUG = 'stock-2wd-buggy-harbour-flats-clay';
const TITLE = 'Stock 2WD buggy on Harbour Flats clay, tight layout';

const suite = browserSuite();

describe('guide page drawn on the server', () => {
  it('reads without script: title, chips, body and tables are in the page itself', async () => {
    const context = await suite.browser.newContext({ javaScriptEnabled: false, viewport: VIEWPORTS.phone });
    const page = await context.newPage();
    const res = await page.goto(`${suite.server.baseUrl}/guides/${SLUG}`);
    expect(res?.status()).toBe(200);
    await expect(page.getByRole('heading', { level: 1, name: TITLE }).isVisible()).resolves.toBe(true);
    await expect(page.getByRole('heading', { level: 2, name: 'Baseline' }).isVisible()).resolves.toBe(true);
    await expect(page.getByRole('cell', { name: 'Drag brake', exact: true }).first().isVisible()).resolves.toBe(true);
    await expect(page.getByText(/^Version \d+, published on/).isVisible()).resolves.toBe(true);
    expect(await page.title()).toBe(`${TITLE} · Tunewright`);
    await screenshot(page, 'guide-no-script-phone');
    await context.close();
  });

  it('takes over without asking for the guide again, without errors, and its cards come alive', async () => {
    const page = await suite.browser.newPage({ viewport: VIEWPORTS.phone });
    const errors = watchPageErrors(page);
    const api = watchApiRequests(page);
    await page.goto(`${suite.server.baseUrl}/guides/${SLUG}`);
    await revealWorkedExamples(page);
    const card = page.locator('[data-worked-example]').first();
    await card.locator('[data-result]').first().waitFor();
    // The app is running: a calculator input reacts to typing.
    const result = card.locator('[data-result]').first();
    const before = await result.innerText();
    await card.getByRole('textbox').first().fill('90');
    await expect.poll(() => result.innerText()).not.toBe(before);
    await page.getByRole('heading', { level: 1, name: TITLE }).waitFor();
    expect(api).not.toContain(`/api/guides/${SLUG}`);
    expect(api).not.toContain('/api/auth/me');
    expect(errors).toEqual([]);
    await screenshot(page, 'guide-after-takeover-phone');
    await page.close();
  });

  it('follows links inside the app after the take-over (the page is a normal app page)', async () => {
    const page = await suite.browser.newPage({ viewport: VIEWPORTS.desktop });
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/guides/${SLUG}`);
    await page.waitForFunction(() => !document.querySelector('[data-example-slot] > pre'));
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Parameters' }).click();
    await page.waitForURL('**/parameters');
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    await page.goBack();
    await page.getByRole('heading', { level: 1, name: TITLE }).waitFor();
    expect(errors).toEqual([]);
    await page.close();
  });

  it('keeps what a reader typed into the header search before the app started, and Enter before then opens the results', async () => {
    const context = await suite.browser.newContext({ viewport: VIEWPORTS.desktop });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    // The typing must land on the server-drawn page.
    const release = await holdAppCode(page);
    await page.goto(`${suite.server.baseUrl}/guides/${SLUG}`);
    await page.getByRole('heading', { level: 1, name: TITLE }).waitFor();
    const box = page.getByRole('banner').getByRole('combobox');
    await box.click();
    await box.pressSequentially('drag br');
    expect(await page.evaluate(() => document.documentElement.dataset.app ?? null)).toBeNull(); // still the server's page
    release();
    await waitForApp(page);
    expect(await box.inputValue()).toBe('drag br');
    expect(await box.evaluate((el) => el === document.activeElement)).toBe(true);
    // The app knows the text (not just the DOM): typing on shows suggestions for the whole query.
    await box.pressSequentially('ake');
    await page
      .getByRole('listbox', { name: 'Suggestions' })
      .getByRole('option', { name: /Drag brake/ })
      .first()
      .waitFor();
    expect(errors).toEqual([]);

    // Enter before the app is there: the box is a real form, so the results page opens.
    const second = await context.newPage();
    await second.route('**/assets/start-*.js', () => new Promise(() => {})); // never arrives
    await second.goto(`${suite.server.baseUrl}/guides/${SLUG}`);
    await second.getByRole('heading', { level: 1, name: TITLE }).waitFor();
    const box2 = second.getByRole('banner').getByRole('combobox');
    await box2.fill('lvc');
    await box2.press('Enter');
    await second.waitForURL(/\/search\?q=lvc$/);
    await context.close();
  });
});
