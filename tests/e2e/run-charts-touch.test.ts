import { describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { screenshot, watchPageErrors } from '../setup/browser';
import { createUser } from '../factories/user';
import { browserSuite } from '../setup/browser-suite';
import { buildRunCsv, uploadRun } from '../factories/run';
import { createClient } from '../setup/test-app';

const suite = browserSuite();

/** Every stacked chart's stretch in view, [min, max] in seconds, read from the charts' own elements. */
async function views(page: Page): Promise<Array<[number, number]>> {
  const raw = await page.locator('[data-testid="run-charts"] .uplot').evaluateAll((els) => els.map((e) => (e as HTMLElement).dataset.view ?? ''));
  return raw.map((v) => v.split('–').map(Number) as [number, number]);
}

/** All panels show the same stretch (to the millisecond). */
async function oneView(page: Page): Promise<[number, number]> {
  const all = await views(page);
  expect(all.length).toBeGreaterThanOrEqual(5);
  for (const v of all) expect(v).toEqual(all[0]);
  return all[0];
}

/** Real touch input through Chromium's DevTools protocol: each step a list of finger positions (page px). */
async function touch(context: BrowserContext, page: Page, steps: Array<Array<[number, number]>>) {
  const cdp = await context.newCDPSession(page);
  const points = (p: Array<[number, number]>) => p.map(([x, y], id) => ({ x, y, id }));
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: points(steps[0]) });
  for (const step of steps.slice(1)) await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: points(step) });
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
  await cdp.detach();
}

const lerp = (a: number, b: number, k: number) => a + (b - a) * k;

describe('run charts on a touch screen (Chromium, touch input)', () => {
  it('pinch zooms and a sideways swipe pans every stacked chart together; Reset zoom shows the whole run again', async () => {
    const { user, password } = await createUser(suite.server.t, { displayName: 'Harbour Touch Racer' });
    const api = createClient(suite.server.t.app);
    expect((await api.post('/api/auth/sign-in', { email: user.email, password })).status).toBe(200);
    api.resetCsrf();
    const id = await uploadRun(api, { fields: { title: 'Heat 3, phone in the pits' }, body: buildRunCsv({ durationS: 40 }) });

    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/sign-in?next=${encodeURIComponent(`/runs/${id}`)}`);
    await page.getByLabel('E-mail').fill(user.email);
    await page.getByLabel('Password').fill(password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Heat 3, phone in the pits' }).waitFor();
    await expect.poll(async () => (await views(page)).filter(([a, b]) => b > a).length).toBeGreaterThanOrEqual(5);
    const whole = await oneView(page);
    expect(whole[1] - whole[0]).toBeGreaterThan(35); // the 40 s run

    // Pinch out on the motor speed chart: fingers 60 px apart move to 240 px apart, so the view narrows to a quarter.
    const over = page.locator('.u-over').nth(1);
    await over.scrollIntoViewIfNeeded();
    const box = (await over.boundingBox())!;
    const [cx, cy] = [box.x + box.width / 2, box.y + box.height / 2];
    const steps = Array.from({ length: 7 }, (_v, i) => {
      const half = lerp(30, 120, i / 6);
      return [
        [cx - half, cy],
        [cx + half, cy],
      ] as Array<[number, number]>;
    });
    await touch(context, page, steps);
    await expect.poll(async () => (await views(page))[0][1] - (await views(page))[0][0]).toBeLessThan((whole[1] - whole[0]) * 0.3);
    const zoomed = await oneView(page);
    const width = zoomed[1] - zoomed[0];
    expect(width / (whole[1] - whole[0])).toBeCloseTo(0.25, 1); // 60 px → 240 px apart (geometry of the gesture)
    // The moment under the middle of the fingers stays under it: the view is centred where the pinch was.
    expect((zoomed[0] + zoomed[1]) / 2).toBeCloseTo((whole[0] + whole[1]) / 2, 0);
    await screenshot(page, 'run-page-phone-pinched');

    // A sideways swipe to the left (100 px) shows later time; the width is kept.
    await touch(
      context,
      page,
      Array.from({ length: 6 }, (_v, i) => [[lerp(cx + 50, cx - 50, i / 5), cy]] as Array<[number, number]>),
    );
    await expect.poll(async () => (await views(page))[0][0]).toBeGreaterThan(zoomed[0] + 0.1);
    const panned = await oneView(page);
    expect(panned[1] - panned[0]).toBeCloseTo(width, 2);
    const secondsPerPx = width / box.width;
    expect(panned[0] - zoomed[0]).toBeCloseTo(100 * secondsPerPx, 0);

    // A vertical swipe belongs to the page, not the chart: the view does not move.
    await touch(
      context,
      page,
      Array.from({ length: 6 }, (_v, i) => [[cx, lerp(cy + 40, cy - 40, i / 5)]] as Array<[number, number]>),
    );
    expect(await oneView(page)).toEqual(panned);

    await page.getByRole('button', { name: 'Reset zoom' }).click();
    await expect.poll(async () => (await views(page))[0]).toEqual(whole);
    await oneView(page);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    expect(errors).toEqual([]);
    await context.close();
  }, 120_000);
});
