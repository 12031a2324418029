import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { revealWorkedExamples, screenshot, waitForApp, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';
import { seriousViolations, signedInPage } from './guide-helpers';

const suite = browserSuite();
const A = 'guide:stock-2wd-buggy-harbour-flats-clay';
const B = 'guide:mod-4wd-buggy-harbour-flats-clay';
const WAIT = { timeout: 30_000 };

/** Opens the header's Display switch (the one visible at this width) and picks a choice in it. */
async function choose(page: Page, group: 'Units' | 'Theme', label: string) {
  const button = page.getByRole('banner').getByRole('button', { name: 'Display' }).filter({ visible: true });
  if ((await button.getAttribute('aria-expanded')) !== 'true') await button.click();
  const panel = page.getByRole('group', { name: 'Display' });
  await panel.getByRole('group', { name: group }).getByRole('radio', { name: label }).check();
  await page.keyboard.press('Escape');
  await panel.waitFor({ state: 'detached' });
}

const result = (page: Page, key: string) => page.locator(`[data-result="${key}"] dd`).first();
/** The page background's relative luminance (WCAG 2.x formula), 0 black … 1 white. */
const backgroundLuminance = (page: Page) =>
  page.evaluate(() => {
    const m = getComputedStyle(document.body)
      .backgroundColor.match(/\d+(\.\d+)?/g)!
      .map(Number);
    const lin = (c: number) => (c / 255 <= 0.03928 ? c / 255 / 12.92 : ((c / 255 + 0.055) / 1.055) ** 2.4);
    return 0.2126 * lin(m[0]) + 0.7152 * lin(m[1]) + 0.0722 * lin(m[2]);
  });

describe('display preferences: units and theme', () => {
  it("a member's units change the calculator, a worked example and the comparison, and survive a reload", async () => {
    const page = await signedInPage(suite.browser, suite.server.baseUrl, 'jonah');
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/calculators/gearing`);
    await waitForApp(page);
    await expect.poll(() => result(page, 'rolloutMm').textContent(), WAIT).toMatch(/^\d+\.\d\d mm$/);
    const metricRatio = await result(page, 'finalDriveRatio').textContent();
    expect(metricRatio).toMatch(/^\d+\.\d\d:1$/); // ratio notation "N.NN:1"

    const saved = page.waitForResponse((r) => r.url().endsWith('/api/account') && r.request().method() === 'PATCH');
    await choose(page, 'Units', 'Imperial');
    expect((await saved).status()).toBe(200);
    await expect.poll(() => result(page, 'rolloutMm').textContent(), WAIT).toMatch(/^\d\.\d\d\d in$/);
    expect(await result(page, 'finalDriveRatio').textContent()).toBe(metricRatio); // a ratio has no units
    await expect.poll(() => page.locator('[data-chart="gearing"]').textContent(), WAIT).toContain('Rollout (in)');

    // Kept in the account: a reload (and so any other device) shows inches.
    await page.reload();
    await waitForApp(page);
    await expect.poll(() => result(page, 'rolloutMm').textContent(), WAIT).toMatch(/ in$/);
    await page.goto(`${suite.server.baseUrl}/calculators/top-speed`);
    await expect.poll(() => result(page, 'loadedKmh').textContent(), WAIT).toMatch(/^\d+\.\d mph$/);
    await screenshot(page, 'display-imperial-top-speed');

    // A guide's worked examples follow too.
    await page.goto(`${suite.server.baseUrl}/guides/mod-4wd-buggy-harbour-flats-clay`);
    await revealWorkedExamples(page, 90_000);
    const shown = await page.locator('[data-worked-example] [data-result] dd').allTextContents();
    expect(shown.some((t) => / (in|mph)$/.test(t))).toBe(true);
    expect(shown.some((t) => / (mm|km\/h)$/.test(t))).toBe(false);

    // And the comparison: rollout in inches, top speed in mph, ratios as N.NN:1.
    await page.goto(`${suite.server.baseUrl}/setups/compare?a=${A}&b=${B}`);
    const deltas = page.getByTestId('deltas-table');
    await deltas.waitFor(WAIT);
    const row = async (name: RegExp) => (await deltas.getByRole('row', { name }).textContent()) ?? '';
    expect(await row(/Final drive ratio/)).toMatch(/\d\.\d\d:1.*\d\.\d\d:1/);
    expect(await row(/Rollout/)).toMatch(/\d\.\d\d\d in/);
    expect(await row(/top speed/)).toMatch(/\d\.\d mph/);
    expect(
      await page
        .getByTestId('fields-table')
        .getByRole('row', { name: /Tyre diameter/ })
        .textContent(),
    ).toMatch(/\d\.\d\d\d in/);

    // A pair of published baselines where B goes up in pinion from a setup whose notes warn of heat (several
    // guides' notes name motor temperatures of 75–80 °C): the comparison page shows the pinion heat caution.
    const pair = await page.evaluate(async () => {
      const lib = ((await (await fetch('/api/setups')).json()).data.baselines as Array<{ guideSlug: string }>).map((x) => `guide:${x.guideSlug}`);
      for (const a of lib)
        for (const b of lib) {
          if (a === b) continue;
          const q = new URLSearchParams({ a, b });
          const cmp = (await (await fetch(`/api/setups/compare?${q}`)).json()).data;
          if (cmp.cautions.some((c: { code: string }) => c.code === 'heat-pinion-up')) return q.toString();
        }
      return null;
    });
    expect(pair).not.toBeNull();
    await page.goto(`${suite.server.baseUrl}/setups/compare?${pair}`);
    await page
      .getByTestId('cautions')
      .getByText(/Bigger pinion on a setup that runs hot/)
      .waitFor(WAIT);
    expect(await page.getByTestId('cautions').textContent()).toMatch(/from a \d+- to a \d+-tooth pinion, and [AB]'s notes warn of high temperatures/);

    // The account page shows the same choice, and changing it there changes it everywhere.
    await page.goto(`${suite.server.baseUrl}/account`);
    const unitsGroup = page.getByRole('group', { name: 'Units for figures' });
    await unitsGroup.waitFor(WAIT);
    expect(await unitsGroup.getByRole('radio', { name: /Imperial/ }).isChecked()).toBe(true);

    const me = await page.evaluate(async () => (await (await fetch('/api/auth/me')).json()).data.user.units);
    expect(me).toBe('imperial');
    expect(errors).toEqual([]);
    await page.context().close();
  }, 180_000);

  it("a visitor's units stay in the browser across a reload", async () => {
    const page = await (await suite.browser.newContext({ viewport: { width: 1366, height: 900 } })).newPage();
    await page.goto(`${suite.server.baseUrl}/calculators/top-speed`);
    await waitForApp(page);
    await expect.poll(() => result(page, 'loadedKmh').textContent(), WAIT).toMatch(/ km\/h$/);
    await choose(page, 'Units', 'Imperial');
    await expect.poll(() => result(page, 'loadedKmh').textContent(), WAIT).toMatch(/ mph$/);
    await page.reload();
    await waitForApp(page);
    await expect.poll(() => result(page, 'loadedKmh').textContent(), WAIT).toMatch(/ mph$/);
    expect(await page.evaluate(() => localStorage.getItem('tw.units'))).toBe('imperial');
    await page.context().close();
  }, 90_000);

  it('follows a dark system setting, passes axe contrast in dark, and the switch overrides it and is remembered', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1366, height: 900 }, colorScheme: 'dark' });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/`);
    await page.getByRole('heading', { level: 1 }).waitFor();
    expect(await backgroundLuminance(page)).toBeLessThan(0.05);
    expect(await seriousViolations(page)).toBe('');
    await screenshot(page, 'dark-home-1366');

    for (const path of ['/calculators/gearing', '/guides/stock-2wd-buggy-harbour-flats-clay', `/setups/compare?a=${A}&b=${B}`, '/parameters']) {
      await page.goto(`${suite.server.baseUrl}${path}`);
      await waitForApp(page);
      await page.locator('main h1').first().waitFor();
      if (path.startsWith('/calculators')) await page.locator('[data-chart] svg').first().waitFor(WAIT);
      if (path.startsWith('/setups')) await page.getByTestId('deltas-table').waitFor(WAIT);
      if (path.startsWith('/guides')) await revealWorkedExamples(page, 90_000);
      expect(await seriousViolations(page), path).toBe('');
      await screenshot(page, `dark${path.replace(/[/?=&:]+/g, '-')}`);
    }

    // The chart is drawn in the dark palette's colours, not the light one's ink.
    await page.goto(`${suite.server.baseUrl}/calculators/gearing`);
    await page.locator('[data-chart] .recharts-cartesian-axis-tick-value').first().waitFor(WAIT);
    const tickFill = await page.locator('[data-chart] .recharts-cartesian-axis-tick-value').first().getAttribute('fill');
    expect(tickFill?.toLowerCase()).not.toBe('#3a4763');

    // Light, chosen with the switch, wins over the system setting and survives a reload.
    await choose(page, 'Theme', 'Light');
    await expect.poll(() => backgroundLuminance(page)).toBeGreaterThan(0.8);
    await page.reload();
    await page.locator('main h1').first().waitFor();
    expect(await backgroundLuminance(page)).toBeGreaterThan(0.8);
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('light');
    // Dark, chosen on a light system.
    await page.emulateMedia({ colorScheme: 'light' });
    await waitForApp(page);
    await choose(page, 'Theme', 'Dark');
    await expect.poll(() => backgroundLuminance(page)).toBeLessThan(0.05);
    // System again: follows the (now light) system.
    await choose(page, 'Theme', 'System');
    await expect.poll(() => backgroundLuminance(page)).toBeGreaterThan(0.8);
    expect(errors).toEqual([]);
    await context.close();
  }, 240_000);

  it('on a 390 px phone: the switch sits beside Menu, the comparison says its wide table scrolls, and keyboard can scroll it', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 }, colorScheme: 'dark' });
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/setups/compare?a=${A}&b=${B}`);
    await waitForApp(page);
    await page.getByTestId('fields-table').waitFor(WAIT);
    const banner = page.getByRole('banner');
    const display = banner.getByRole('button', { name: 'Display' }).filter({ visible: true });
    const menu = banner.getByRole('button', { name: 'Menu' });
    const [d, m] = [(await display.boundingBox())!, (await menu.boundingBox())!];
    expect(Math.abs(d.y - m.y)).toBeLessThan(8); // one row
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    // Each wide table either fits or says it scrolls and can take focus.
    for (const id of ['deltas-table', 'fields-table']) {
      const frame = page.getByTestId(id).locator('xpath=..');
      const wide = await frame.evaluate((el) => el.scrollWidth > el.clientWidth + 1);
      if (wide) {
        expect(await frame.getAttribute('tabindex')).toBe('0');
        expect(await frame.getAttribute('aria-label')).toMatch(/scrolls sideways/);
        await frame.focus();
        await page.keyboard.press('ArrowRight');
        await expect.poll(() => frame.evaluate((el) => el.scrollLeft)).toBeGreaterThan(0);
      }
    }
    expect(await seriousViolations(page)).toBe('');
    await screenshot(page, 'dark-setups-compare-390');
    await page.getByTestId('deltas-table').scrollIntoViewIfNeeded();
    await page.screenshot({ path: '.test-artifacts/screenshots/dark-setups-compare-390-deltas.png' });
    await page.evaluate(() => window.scrollTo(0, 0));
    await display.click();
    await page.getByRole('group', { name: 'Display' }).waitFor();
    await page.screenshot({ path: '.test-artifacts/screenshots/dark-display-open-390.png' });
    await context.close();
  }, 90_000);

  it('at 200 % zoom (640 CSS px) the guide history keeps each edit note whole and its actions in view', async () => {
    const page = await signedInPage(suite.browser, suite.server.baseUrl, 'owen', { width: 640, height: 450 });
    await page.goto(`${suite.server.baseUrl}/guides/stock-2wd-buggy-harbour-flats-clay`);
    await waitForApp(page);
    const list = page.getByRole('list', { name: 'Versions of this guide, newest first' });
    await list.waitFor(WAIT);
    expect(await page.locator('table:has(caption:text("Versions of this guide"))').isVisible()).toBe(false);
    await list.scrollIntoViewIfNeeded();
    const items = await list.locator(':scope > li').evaluateAll((lis) =>
      lis.map((li) => {
        const box = li.getBoundingClientRect();
        const actions = [...li.querySelectorAll('a, button')].map((el) => el.getBoundingClientRect());
        return { right: box.right, actionsInside: actions.every((r) => r.right <= window.innerWidth && r.left >= 0), text: li.textContent ?? '' };
      }),
    );
    expect(items.length).toBeGreaterThan(1);
    for (const it of items) {
      expect(it.right).toBeLessThanOrEqual(640);
      expect(it.actionsInside).toBe(true);
    }
    // An older version offers "Compare with live" (and, for a moderator, Restore), on screen.
    expect(items.some((i) => i.text.includes('Compare with live'))).toBe(true);
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    await page.screenshot({ path: '.test-artifacts/screenshots/history-zoom200.png' });
    await page.context().close();
  }, 90_000);

  it('on a phone a toast sits in the page flow above the content, never floating over it', async () => {
    const page = await signedInPage(suite.browser, suite.server.baseUrl, 'mira', { width: 390, height: 844 });
    await page.goto(`${suite.server.baseUrl}/guides`);
    await waitForApp(page);
    await page.getByRole('button', { name: 'Menu' }).click();
    await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).click();
    const inFlow = page.getByTestId('phone-toasts');
    await inFlow.getByText('Signed out').waitFor(WAIT);
    // The floating stack is hidden at this width, and the message is laid out before the page's heading.
    expect(await page.locator('[data-sonner-toaster]').evaluateAll((els) => els.every((el) => getComputedStyle(el).display === 'none'))).toBe(true);
    const [t, h] = [(await inFlow.boundingBox())!, (await page.locator('main h1').first().boundingBox())!];
    expect(t.y + t.height).toBeLessThanOrEqual(h.y);
    await inFlow.getByRole('button', { name: 'Dismiss' }).click();
    await inFlow.waitFor({ state: 'detached' });
    await page.context().close();
  }, 90_000);
});
