import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { screenshot, waitForApp } from '../setup/browser';
import { seriousViolations, signedInPage } from './guide-helpers';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();
const GUIDE = 'stock-2wd-buggy-harbour-flats-clay';
// The parameter page comes from the parameter-library work; check it as soon as its route exists.
const hasParameterPage = fs.readFileSync('src/app/router.tsx', 'utf8').includes("'parameters/:slug'");

describe('accessibility (axe): no serious or critical violations', () => {
  it('home, guide list, guide page and comparison, for a visitor', async () => {
    const page = await (await suite.browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
    await page.goto(`${suite.server.baseUrl}/`);
    await page.getByRole('heading', { level: 1 }).waitFor();
    expect(await seriousViolations(page)).toBe('');

    await page.goto(`${suite.server.baseUrl}/guides`);
    await page.getByRole('heading', { name: 'Guides', level: 1 }).waitFor();
    await page.getByText(/\d+ guides/).waitFor();
    expect(await seriousViolations(page)).toBe('');
    await screenshot(page, 'guides-list');

    await page.goto(`${suite.server.baseUrl}/guides/${GUIDE}`);
    await waitForApp(page); // check the app's page, not the server-drawn one it is about to replace
    await page.locator('h1#guide-title').waitFor();
    await page.getByRole('heading', { name: 'History' }).waitFor();
    await page.locator('table').last().waitFor();
    expect(await seriousViolations(page)).toBe('');

    await page.goto(`${suite.server.baseUrl}/guides/${GUIDE}/compare?from=1&to=2`);
    await page.getByRole('heading', { name: 'Changed text' }).waitFor();
    expect(await seriousViolations(page)).toBe('');
    await page.close();
  }, 60_000);

  it.runIf(hasParameterPage)('a parameter page', async () => {
    const page = await (await suite.browser.newContext()).newPage();
    await page.goto(`${suite.server.baseUrl}/parameters/drag-brake`);
    await waitForApp(page);
    await page.getByRole('heading', { level: 1, name: /drag brake/i }).waitFor();
    expect(await seriousViolations(page)).toBe('');
    await page.close();
  });

  it('the editor and the workbench, for a member', async () => {
    const page = await signedInPage(suite.browser, suite.server.baseUrl, 'rosa');
    await page.goto(`${suite.server.baseUrl}/guides/${GUIDE}/edit`);
    await page.getByLabel('Title', { exact: true }).waitFor();
    await page.locator('.w-md-editor').waitFor(); // the lazily loaded Markdown editor, not its fallback
    expect(await seriousViolations(page)).toBe('');
    await screenshot(page, 'guides-editor-edit');
    await page.setViewportSize({ width: 375, height: 800 });
    await screenshot(page, 'guides-editor-phone');

    await page.setViewportSize({ width: 1280, height: 900 });
    await page.goto(`${suite.server.baseUrl}/me/revisions`);
    await page.getByRole('heading', { name: 'My workbench' }).waitFor();
    await page.getByRole('heading', { name: /Drafts/ }).waitFor();
    expect(await seriousViolations(page)).toBe('');
    await page.setViewportSize({ width: 375, height: 800 });
    await screenshot(page, 'guides-workbench-phone');
    await page.context().close();
  }, 60_000);

  it('the review queue and a review page, for a moderator', async () => {
    const page = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    await page.goto(`${suite.server.baseUrl}/review`);
    await page.getByRole('heading', { name: 'Review queue' }).waitFor();
    const first = page.locator('tbody tr th a').first();
    await first.waitFor();
    expect(await seriousViolations(page)).toBe('');
    await screenshot(page, 'guides-review-queue');
    await first.click();
    await page.getByRole('heading', { name: 'Changed text' }).waitFor();
    expect(await seriousViolations(page)).toBe('');
    await screenshot(page, 'guides-review-seeded');
    await page.getByRole('button', { name: 'Send back with a reason' }).click();
    await page.getByRole('dialog').waitFor();
    expect(await seriousViolations(page)).toBe('');
    await page.keyboard.press('Escape');
    await page.setViewportSize({ width: 375, height: 800 });
    await screenshot(page, 'guides-review-phone');
    await page.context().close();
  }, 60_000);
});
