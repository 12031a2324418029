import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { screenshot, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';

// The comparison page shows what its address names: after two comparisons, back shows the first pair
// again (pickers, legend, rpm, tables), forward the second, exactly as a fresh load of that address would.
const A = 'guide:stock-2wd-buggy-harbour-flats-clay';
const B = 'guide:mod-4wd-buggy-harbour-flats-clay';
const C = 'guide:stadium-truck-harbour-flats-clay';
const suite = browserSuite();
let titles: Record<string, string>;

beforeAll(async () => {
  const library = (await (await fetch(`${suite.server.baseUrl}/api/setups`)).json()) as {
    data: { baselines: Array<{ guideSlug: string; guideTitle: string; revisionNumber: number }> };
  };
  titles = Object.fromEntries(library.data.baselines.map((b) => [`guide:${b.guideSlug}`, `${b.guideTitle} (v${b.revisionNumber})`]));
});

/** What the page shows once it has caught up with its address: the picks, the legend, the rpm field, the filter and both tables' text. */
async function shown(page: Page) {
  // The URL changes a moment before the page renders for it: wait until pickers and tables match it.
  await page.waitForFunction(() => {
    const q = new URL(location.href).searchParams;
    const rpm = Number(q.get('rpm') || 20000);
    const table = document.querySelector('[data-testid="deltas-table"]');
    const pick = (name: string) => (document.querySelector(`select[name="${name}"]`) as HTMLSelectElement | null)?.value;
    return (
      !!table &&
      table.textContent!.includes(`at ${rpm.toLocaleString('en-GB')} rpm`) &&
      pick('a') === (q.get('a') ?? '') &&
      pick('b') === (q.get('b') ?? '') &&
      !document.body.textContent!.includes('Comparing…')
    );
  });
  return {
    a: await page.getByLabel(/^A /).inputValue(),
    b: await page.getByLabel(/^B /).inputValue(),
    legend: (await page.locator('p', { has: page.locator('strong', { hasText: /^A$/ }) }).textContent())?.replace(/\s+/g, ' ').trim(),
    rpm: await page.locator('input[name="rpm"]').inputValue(),
    onlyChanged: await page.getByLabel('Show only differences').isChecked(),
    deltas: (await page.getByTestId('deltas-table').innerText()).trim(),
    fields: (await page.getByTestId('fields-table').innerText()).trim(),
  };
}

/** The same address loaded in a fresh page: what back or forward must reproduce. */
async function freshLoad(url: string) {
  const page = await suite.browser.newPage();
  try {
    await page.goto(url);
    return await shown(page);
  } finally {
    await page.close();
  }
}

async function waitForPair(page: Page, b: string) {
  await page.waitForFunction((want) => new URL(location.href).searchParams.get('b') === want, b);
  await page.locator('p', { hasText: `B = ${titles[b]}` }).waitFor();
}

describe('GET /setups/compare in Chromium: back and forward between two comparisons', () => {
  it('picking two pairs in the page, then back and forward, shows each pair as its address names it', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const errors = watchPageErrors(page);
    // As from a guide's "Compare" link: A chosen, B still open.
    await page.goto(`${suite.server.baseUrl}/setups/compare?a=${encodeURIComponent(A)}`);
    await page.getByText('Choose two setups to compare').waitFor();

    // First comparison, read at 30,000 rpm with only the differences shown.
    await page.getByLabel(/^B /).selectOption(B);
    await waitForPair(page, B);
    await page.locator('input[name="rpm"]').fill('30000');
    await page.locator('input[name="rpm"]').press('Enter');
    await page.waitForFunction(() => new URL(location.href).searchParams.get('rpm') === '30000');
    await page.getByLabel('Show only differences').check();
    await page.waitForFunction(() => new URL(location.href).searchParams.get('only') === 'changed');
    const firstUrl = page.url();
    const first = await shown(page);
    expect(first).toMatchObject({ a: A, b: B, rpm: '30000', onlyChanged: true });
    expect(first.legend).toBe(`A = ${titles[A]} · B = ${titles[B]}`);

    // Second comparison: another B, then the timing read at 12,000 rpm.
    await page.getByLabel(/^B /).selectOption(C);
    await waitForPair(page, C);
    await page.locator('input[name="rpm"]').fill('12000');
    await page.locator('input[name="rpm"]').press('Enter');
    await page.waitForFunction(() => new URL(location.href).searchParams.get('rpm') === '12000');
    const secondUrl = page.url();
    const second = await shown(page);
    expect(second).toMatchObject({ a: A, b: C, rpm: '12000' });
    // The two comparisons differ, so a stale page cannot pass for the right one.
    expect(second.deltas).not.toBe(first.deltas);
    await screenshot(page, 'setups-compare-second');

    await page.goBack();
    await waitForPair(page, B);
    expect(page.url()).toBe(firstUrl);
    const back = await shown(page);
    expect(back).toEqual(first);
    expect(back).toEqual(await freshLoad(firstUrl));
    await screenshot(page, 'setups-compare-back');

    await page.goForward();
    await waitForPair(page, C);
    expect(page.url()).toBe(secondUrl);
    expect(await shown(page)).toEqual(second);

    // Back past both pairs: the page as the guide's link opened it, with B open again.
    await page.goBack();
    await page.goBack();
    await page.getByText('Choose two setups to compare').waitFor();
    expect(await page.getByLabel(/^B /).inputValue()).toBe('');
    expect(await page.getByTestId('deltas-table').count()).toBe(0);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('two comparisons opened by address, then back: the first pair, not the second', async () => {
    const page = await suite.browser.newPage();
    const errors = watchPageErrors(page);
    const one = `${suite.server.baseUrl}/setups/compare?a=${encodeURIComponent(A)}&b=${encodeURIComponent(B)}&rpm=25000`;
    const two = `${suite.server.baseUrl}/setups/compare?a=${encodeURIComponent(A)}&b=${encodeURIComponent(C)}`;
    await page.goto(one);
    const first = await shown(page);
    await page.goto(two);
    await waitForPair(page, C);
    await page.goBack();
    await waitForPair(page, B);
    expect(await shown(page)).toEqual(first);
    expect(first).toMatchObject({ b: B, rpm: '25000', onlyChanged: false });
    expect(errors).toEqual([]);
    await page.close();
  });
});
