import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { holdAppCode, revealWorkedExamples, screenshot, screenshotPath, VIEWPORTS, waitForApp, watchApiRequests, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

async function openPage(path: string, viewport: { width: number; height: number } = VIEWPORTS.desktop) {
  const page = await suite.browser.newPage({ viewport });
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  const requests: string[] = [];
  page.on('request', (r) => requests.push(r.url()));
  await page.goto(`${suite.server.baseUrl}${path}`);
  await revealWorkedExamples(page);
  return { page, errors, requests };
}

const resultText = (page: Page, key: string) => page.locator(`[data-worked-example] [data-result="${key}"] dd`).first().innerText();
const curvePath = (page: Page) => page.locator('[data-worked-example] [data-chart="timing-curve"] path.recharts-curve').first().getAttribute('d');

describe('parameter page /parameters/ramped-advance', () => {
  it('recomputes the worked example and its chart as the reader types, and survives bad input', async () => {
    const { page, errors } = await openPage('/parameters/ramped-advance');
    await page.getByRole('heading', { level: 1, name: 'Ramped advance' }).waitFor();
    const card = page.locator('[data-worked-example]').first();
    await card.locator('[data-chart="timing-curve"] path.recharts-curve').first().waitFor();

    // The block: 10° base + 30° ramped over 8,000–24,000 rpm, read at 16,000 rpm → half the ramp: 25°.
    expect(await resultText(page, 'totalDegAt')).toBe('25°');
    const before = await curvePath(page);
    expect(before).toBeTruthy();

    const ramp = card.getByLabel(/^Ramped advance/);
    await ramp.fill('40');
    await expect.poll(() => resultText(page, 'totalDegAt')).toBe('30°'); // 10 + 40 × 0.5
    const after = await curvePath(page);
    expect(after).toBeTruthy();
    expect(after).not.toBe(before);

    // Keyboard: ArrowUp steps the field by its step (1°).
    await ramp.press('ArrowUp');
    expect(await ramp.inputValue()).toBe('41');
    await expect.poll(() => resultText(page, 'totalDegAt')).toBe('30.5°');

    // Bad input: a message under that field, the last good numbers kept but greyed, no crash.
    await ramp.fill('lots');
    const message = card.locator('[data-field-error="rampDeg"]');
    await expect.poll(() => message.innerText()).toMatch(/Ramped advance must be a number/);
    expect(await card.locator('[data-results-state]').getAttribute('data-results-state')).toBe('stale');
    expect(await resultText(page, 'totalDegAt')).toBe('30.5°');

    await card.getByRole('button', { name: 'Reset to the example' }).click();
    await expect.poll(() => resultText(page, 'totalDegAt')).toBe('25°');
    expect(await curvePath(page)).toBe(before);

    // The entry's other parts: aliases, range, cautions box, related links.
    await expect.poll(() => page.locator('article > header').innerText()).toMatch(/Also called/);
    expect(await page.getByRole('note').filter({ hasText: 'Cautions' }).last().innerText()).toMatch(/Boost makes heat fast/);
    await page.getByRole('link', { name: 'Ramp start rpm' }).first().waitFor();

    await ramp.fill('35');
    await page.screenshot({ path: screenshotPath('parameter-ramped-advance-e2e'), fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  });

  it('lists the guides that discuss the entry and follows a related link inside the app', async () => {
    const { page, errors } = await openPage('/parameters/drag-brake');
    const guides = page.getByTestId('parameter-guides').locator('li');
    await guides.first().waitFor();
    expect(await guides.count()).toBeGreaterThan(1);
    await page.getByRole('complementary').getByRole('link', { name: 'Brake strength' }).click();
    await page.getByRole('heading', { level: 1, name: 'Brake strength' }).waitFor();
    expect(page.url()).toBe(`${suite.server.baseUrl}/parameters/brake-strength`);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('does not download the chart code on a page whose examples have no chart', async () => {
    const { page, requests } = await openPage('/parameters/drag-brake');
    await page.locator('[data-worked-example] [data-result="atNeutralPct"]').first().waitFor();
    await page.waitForLoadState('networkidle');
    expect(requests.some((u) => /calc-chart/.test(u))).toBe(false);
    await page.close();
  });

  it('shows a broken worked-example block as a message in the card naming the field; the rest of the page still works', async () => {
    // A live revision whose block has a typo'd key and a bad value, as a careless edit could publish it.
    const bad = '```worked-example\ncalc: gearing\nspur: 84\npinnion: 40\ninternalRatio: 1.9\ntyreDiameterMm: huge\n```';
    await suite.server.t.db.dataSource.query(
      `UPDATE revisions r SET content = jsonb_set(r.content, '{body}', to_jsonb((r.content->>'body') || E'\n\n' || $1::text))
         FROM documents d WHERE d.published_revision_id = r.id AND d.slug = 'rollout'`,
      [bad],
    );
    const { page, errors } = await openPage('/parameters/rollout');
    const broken = page.locator('[data-worked-example]').filter({ hasText: 'cannot be computed' });
    await broken.waitFor();
    expect(await broken.locator('[data-block-issue="pinnion"]').innerText()).toMatch(/Did you mean "pinion"/);
    expect(await broken.locator('[data-block-issue="tyreDiameterMm"]').innerText()).toMatch(/Tyre diameter must be a number/);
    // The entry's good example above it still computes.
    await page.locator('[data-worked-example] [data-result="rolloutMm"]').first().waitFor();
    await broken.screenshot({ path: screenshotPath('worked-example-broken-block') });
    expect(errors).toEqual([]);
    await page.close();
  });

  it('shows a broken example as a message naming the field (calculator page: bad query value)', async () => {
    const { page, errors } = await openPage('/calculators/pack?chemistry=lipo&cells=two&cutoffPerCellV=3.2');
    await expect.poll(() => page.locator('[data-field-error="cells"]').innerText()).toMatch(/Cells must be a number/);
    await page.getByLabel(/^Cells/).fill('2');
    await expect.poll(() => page.locator('[data-result="fullV"] dd').first().innerText()).toBe('8.40 V'); // 2 × 4.20 V (Wikipedia, "Lithium polymer battery": 4.2 V per cell full)
    expect(new URL(page.url()).searchParams.get('cells')).toBe('2');
    expect(errors).toEqual([]);
    await page.close();
  });
});

describe('parameter page drawn on the server', () => {
  it('reads without script: name, summary, body and cautions are in the page itself', async () => {
    const context = await suite.browser.newContext({ javaScriptEnabled: false, viewport: VIEWPORTS.phone });
    const page = await context.newPage();
    const res = await page.goto(`${suite.server.baseUrl}/parameters/low-voltage-cutoff`);
    expect(res?.status()).toBe(200);
    await expect(page.getByRole('heading', { level: 1, name: 'Low-voltage cutoff' }).isVisible()).resolves.toBe(true);
    const cautions = await page.getByRole('note').filter({ hasText: 'Cautions' }).last().innerText();
    expect(cautions).toMatch(/Cautions\s+\S/);
    expect(cautions.length).toBeGreaterThan(80); // the section's text, not just its heading
    expect(await page.title()).toBe('Low-voltage cutoff · Tunewright');
    await screenshot(page, 'parameter-no-script-phone');
    await context.close();
  });

  it('takes over without asking for the entry again, keeps the reader where they scrolled, and its example comes alive', async () => {
    const page = await suite.browser.newPage({ viewport: VIEWPORTS.phone });
    const errors = watchPageErrors(page);
    const api = watchApiRequests(page);
    // The reader scrolls the server's page first.
    const release = await holdAppCode(page);
    await page.goto(`${suite.server.baseUrl}/parameters/ramped-advance`);
    await page.getByRole('heading', { level: 1, name: 'Ramped advance' }).waitFor();
    await page.evaluate(() => window.scrollTo(0, 600));
    release();
    await waitForApp(page);
    expect(await page.evaluate(() => Math.round(window.scrollY))).toBe(600);
    await revealWorkedExamples(page);
    await page.locator('[data-worked-example] [data-result="totalDegAt"]').first().waitFor();
    expect(api).not.toContain('/api/parameters/ramped-advance');
    expect(api).not.toContain('/api/auth/me');
    expect(errors).toEqual([]);
    await page.close();
  });
});
