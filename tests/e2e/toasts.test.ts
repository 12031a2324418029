import { describe, expect, it } from 'vitest';
import { screenshot, waitForApp, watchPageErrors } from '../setup/browser';
import { signedInPage } from './guide-helpers';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();
const GUIDE = '/guides/stock-2wd-buggy-harbour-flats-clay';

describe('toasts, in Chromium', () => {
  it('load with the first toast, sit in the page above the content on a phone and bottom-right on a laptop', async () => {
    for (const viewport of [
      { width: 390, height: 844 },
      { width: 1366, height: 900 },
    ]) {
      const page = await signedInPage(suite.browser, suite.server.baseUrl, 'jonah', viewport);
      const errors = watchPageErrors(page);
      await page.goto(`${suite.server.baseUrl}${GUIDE}`);
      await waitForApp(page);
      // No toast yet: the toaster (its live region) is not in the page; its code has not been fetched.
      expect(await page.locator('section[aria-label^="Notifications"]').count()).toBe(0);

      const watch = page.getByRole('button', { name: /^(Watch|Watching)$/ }).first();
      await watch.click();
      if (viewport.width < 640) {
        // On a phone: in the page's flow above the content (never over a table or a form); the floating stack is hidden.
        const inFlow = page.getByTestId('phone-toasts');
        await inFlow.getByRole('status').first().waitFor({ timeout: 30_000 });
        expect(await page.locator('[data-sonner-toaster]').evaluateAll((els) => els.every((el) => getComputedStyle(el).display === 'none'))).toBe(true);
        const [t, h] = [(await inFlow.boundingBox())!, (await page.locator('main h1').first().boundingBox())!];
        expect(t.y + t.height).toBeLessThanOrEqual(h.y);
      } else {
        const toast = page.locator('[data-sonner-toast]').first();
        await toast.waitFor({ timeout: 30_000 });
        await expect.poll(() => toast.evaluate((el) => getComputedStyle(el).opacity), { timeout: 10_000 }).toBe('1');
        const box = (await toast.boundingBox())!;
        // Bottom-right, out of the reading column.
        expect(box.y).toBeGreaterThan(viewport.height / 2);
        expect(box.x + box.width / 2).toBeGreaterThan(viewport.width * 0.6);
      }
      await screenshot(page, `toast-${viewport.width}`);
      // Put the watch back as it was for the next size.
      await watch.click();
      await expect.poll(() => page.locator('[data-sonner-toast]').count(), { timeout: 30_000 }).toBeGreaterThan(0);
      expect(errors).toEqual([]);
      await page.context().close();
    }
  }, 180_000);
});
