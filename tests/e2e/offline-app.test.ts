import { describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { screenshot, VIEWPORTS, waitForApp, watchPageErrors } from '../setup/browser';
import { signedInPage } from './guide-helpers';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

const SLUG = 'drag-car-park-asphalt';
const TITLE = '2WD drag car on the car park lane, 2S';

/** Waits until the service worker controls the page and has stored `path` (the page itself, or an API read). */
async function waitStored(page: Page, path: string, cache: string | null = null) {
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, undefined, { timeout: 60_000 });
  await expect
    .poll(
      () =>
        page.evaluate(
          async ([p, c]) => {
            const url = new URL(p!, location.origin).href;
            return c ? !!(await (await caches.open(c)).match(url)) : !!(await caches.match(url));
          },
          [path, cache],
        ),
      { timeout: 30_000 },
    )
    .toBe(true);
}

const offline = (context: BrowserContext, on: boolean) => context.setOffline(on);

describe('usable without a signal, in Chromium', () => {
  it('a guide opened once reloads offline with its baseline and a dated "saved copy" notice; kept parameter entries and a calculator work too', async () => {
    const context = await suite.browser.newContext({ viewport: VIEWPORTS.desktop });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/guides/${SLUG}`);
    await waitForApp(page);
    await page.getByRole('heading', { level: 1, name: TITLE }).waitFor();
    // Online, no notice.
    expect(await page.getByTestId('saved-copy-notice').count()).toBe(0);
    await waitStored(page, `/guides/${SLUG}`);

    // "Keep for the track" stores the guide's linked entries as well.
    await page.getByRole('button', { name: 'Keep for the track' }).click();
    await page.getByTestId('keep-for-track').getByRole('status').filter({ hasText: 'Kept on this device' }).waitFor({ timeout: 60_000 });
    await waitStored(page, '/api/parameters/throttle-punch');

    const before = Date.now();
    await offline(context, true);
    await page.reload();
    await page.getByRole('heading', { level: 1, name: TITLE }).waitFor();
    await waitForApp(page);
    await page.locator('#setup').getByRole('region', { name: 'Baseline setup' }).waitFor({ timeout: 30_000 });
    const notice = page.getByTestId('saved-copy-notice');
    await notice.waitFor();
    expect(await notice.innerText()).toMatch(/Saved copy from .*\d{4}/);
    // The date shown is when the copy was fetched: this run, a moment ago.
    const savedAt = Date.parse((await notice.getAttribute('data-saved-at'))!);
    expect(savedAt).toBeLessThanOrEqual(before);
    expect(before - savedAt).toBeLessThan(5 * 60_000);
    await screenshot(page, 'offline-guide-saved-copy');
    await page.setViewportSize(VIEWPORTS.phone);
    await screenshot(page, 'offline-guide-saved-copy-phone');
    await page.setViewportSize(VIEWPORTS.desktop);

    // A linked parameter entry, opened offline from the guide: its stored answer, with the notice.
    await page.goto(`${suite.server.baseUrl}/parameters/throttle-punch`);
    await page.getByRole('heading', { level: 1, name: 'Throttle punch' }).waitFor({ timeout: 30_000 });
    await page.getByTestId('saved-copy-notice').waitFor();

    // A calculator never opened before: the app shell and its code come from the precache; it computes offline.
    await page.goto(`${suite.server.baseUrl}/calculators/pack`);
    await waitForApp(page);
    const cells = page.getByLabel('Cells', { exact: false }).first();
    await cells.fill('3');
    // 3 × 4.20 V (Wikipedia, "Lithium polymer battery": 4.2 V per cell full)
    await expect.poll(() => page.locator('[data-result="fullV"] dd').first().innerText(), { timeout: 15_000 }).toBe('12.60 V');
    await screenshot(page, 'offline-calculator');

    await offline(context, false);
    expect(errors.filter((e) => !/ERR_INTERNET_DISCONNECTED|Failed to fetch|net::/.test(e))).toEqual([]);
    await context.close();
  }, 180_000);

  it('answers to a signed-in member are stored apart and removed at sign-out', async () => {
    const rosa = await signedInPage(suite.browser, suite.server.baseUrl, 'rosa');
    await rosa.waitForFunction(() => navigator.serviceWorker?.controller != null, undefined, { timeout: 60_000 });
    // Now through the worker (the first page was fetched before it existed).
    await rosa.goto(`${suite.server.baseUrl}/setups`);
    await waitForApp(rosa);
    await waitStored(rosa, '/api/auth/me', 'tw-private-v1');
    await waitStored(rosa, '/api/setups', 'tw-private-v1');
    // Nothing of hers in the cache anyone on the device reads.
    const publicMe = await rosa.evaluate(async () => {
      const res = await (await caches.open('tw-public-v1')).match(new URL('/api/auth/me', location.origin).href);
      return res ? await res.text() : null;
    });
    expect(publicMe ?? '').not.toContain('rosa');

    await rosa.getByRole('button', { name: 'Sign out' }).click();
    await rosa.waitForURL(`${suite.server.baseUrl}/`);
    await expect
      .poll(() => rosa.evaluate(async () => ((await caches.has('tw-private-v1')) ? (await (await caches.open('tw-private-v1')).keys()).length : 0)))
      .toBe(0);
    // No cache on the device answers her setups any more.
    // No stored answer on the device is hers: none carries the signed-in mark or her address (her name may
    // appear as the author of public content).
    // (The setups library answers anonymous readers too, with the public baselines only.)
    const left = await rosa.evaluate(async () => {
      const out: string[] = [];
      for (const name of await caches.keys()) {
        if (name.startsWith('workbox-precache')) continue;
        const cache = await caches.open(name);
        for (const req of await cache.keys()) {
          const res = (await cache.match(req))!;
          const text = await res.text();
          if (res.headers.has('x-tunewright-private') || /rosa@tidewater/i.test(text)) out.push(`${name} ${req.url}`);
        }
      }
      return out;
    });
    expect(left).toEqual([]);
    // Offline after sign-out: the setups page has nobody's data to show, only the signed-out view.
    await rosa.context().setOffline(true);
    await rosa.goto(`${suite.server.baseUrl}/setups`);
    await waitForApp(rosa);
    await rosa.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();
    expect(await rosa.locator('body').innerText()).not.toMatch(/Rosa|Kittering/);
    await rosa.context().setOffline(false);
    await rosa.context().close();
  }, 120_000);
});
