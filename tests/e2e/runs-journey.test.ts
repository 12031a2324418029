import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, waitForApp, watchPageErrors } from '../setup/browser';
import { createUser } from '../factories/user';
import { browserSuite } from '../setup/browser-suite';
import { buildRunCsv, uploadRun } from '../factories/run';
import { createDraftGuide } from '../factories/guide';
import { createClient } from '../setup/test-app';

const suite = browserSuite();
let work: string;

beforeAll(() => {
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-runs-journey-'));
});
afterAll(() => {
  if (work) fs.rmSync(work, { recursive: true, force: true });
});

/** Our simulator's CSV rewritten the way another logger might export it: semicolons, decimal commas, ms, mA, °F. */
function foreignCsv(opts: Parameters<typeof buildRunCsv>[0]): string {
  const lines = buildRunCsv(opts).trim().split('\n').slice(1);
  const rows = lines.map((l) => {
    const [t, thr, rpm, mt, et, a, v] = l.split(',').map(Number);
    return [Math.round(t * 1000), thr.toFixed(1), rpm, ((mt * 9) / 5 + 32).toFixed(1), et.toFixed(1), Math.round(a * 1000), v.toFixed(3)]
      .map((x) => String(x).replace('.', ','))
      .join(';');
  });
  return ['Time [ms];Throttle [%];Motor RPM;Motor Temp [°F];ESC Temp [°C];Current [mA];Battery [V]', ...rows].join('\r\n') + '\r\n';
}

async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${suite.server.baseUrl}/sign-in?next=%2Fruns`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/runs');
}

async function uploadThrough(page: Page, file: string, title: string) {
  await page.goto(`${suite.server.baseUrl}/runs`);
  await page.getByLabel('Run log (CSV)').setInputFiles(file);
  await page.getByTestId('mapping-editor').waitFor();
  await page.getByLabel('Title').fill(title);
  await page.getByRole('button', { name: 'Store this run' }).click();
  await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
  return page.url().split('/').pop()!;
}

describe('run log journey in Chromium', () => {
  it('a racer uploads a foreign CSV, confirms the mapping, reads the run with the cursor and compares two runs', async () => {
    const { user, password } = await createUser(suite.server.t, { displayName: 'Harbour Racer' });
    const context = await suite.browser.newContext({ viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await signIn(page, user.email, password);

    const before = path.join(work, 'heat-1.csv');
    fs.writeFileSync(before, '\ufeff' + foreignCsv({ durationS: 40, rateHz: 25 }));
    await page.getByLabel('Run log (CSV)').setInputFiles(before);
    // The worker's preview: the proposed mapping on the first rows, with every change listed.
    const editor = page.getByTestId('mapping-editor');
    await editor.waitFor();
    await expect.poll(() => page.getByLabel('Column for Time').inputValue()).toBe('Time [ms]');
    expect(await page.getByLabel('Unit for Time').inputValue()).toBe('ms');
    expect(await page.getByLabel('Unit for Motor temperature').inputValue()).toBe('F');
    expect(await page.getByLabel('Unit for Current').inputValue()).toBe('mA');
    await page
      .getByTestId('import-notes')
      .getByText(/decimal comma/)
      .waitFor();
    await screenshot(page, 'runs-upload-preview');
    // The person edits the proposal: the controller column is left out.
    await page.getByLabel('Column for Controller temperature').selectOption('');
    await page.getByLabel('Title').fill('Heat 1, 32-tooth pinion');
    await page.getByRole('button', { name: 'Store this run' }).click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    const first = page.url().split('/').pop()!;

    // The run page: figures, then the cursor shows values across the stacked charts.
    await page.getByRole('heading', { name: 'Heat 1, 32-tooth pinion' }).waitFor();
    const figures = page.getByTestId('run-figures');
    await figures.getByText('Peak motor speed').waitFor();
    expect(await figures.getByText('Hottest controller reading').count()).toBe(0);
    const chart = page.locator('.u-over').nth(1);
    await chart.waitFor();
    const box = (await chart.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.4, box.y + box.height / 2);
    await expect.poll(() => page.getByTestId('cursor-readout').textContent()).toMatch(/at \d+(\.\d+)? s.*Motor speed [\d,–.]+ rpm/);
    await screenshot(page, 'run-page-desktop');
    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForTimeout(300);
    const wide = await page.evaluate(() => document.documentElement.scrollWidth);
    expect(wide).toBeLessThanOrEqual(390);
    await screenshot(page, 'run-page-phone');
    await page.setViewportSize({ width: 1366, height: 900 });

    // A second run after a change, then the comparison: aligned, figures side by side.
    const after = path.join(work, 'heat-2.csv');
    fs.writeFileSync(after, foreignCsv({ durationS: 40, rateHz: 25, idleS: 3, loadScale: 1.15, seed: 11 }));
    const second = await uploadThrough(page, after, 'Heat 2, 34-tooth pinion');
    await page.goto(`${suite.server.baseUrl}/runs/compare?a=${first}&b=${second}`);
    await page.getByTestId('compare-figures').getByText('Peak current').waitFor();
    await expect
      .poll(() => page.getByTestId('alignment').textContent())
      .toMatch(/shifted by (0\.9|1\.0)\d s \(matched throttle traces by cross-correlation, r = (0\.9\d|1\.00)\)/);
    await page.getByRole('button', { name: '+0.1 s' }).click();
    await expect.poll(() => page.getByTestId('alignment').textContent()).toMatch(/shifted by 1\.(0|1)\d s \(.*, nudged \+0\.1 s\)/);
    await screenshot(page, 'runs-compare-desktop');

    expect(errors).toEqual([]);
    await context.close();
  }, 120_000);

  it('a run offered on a guide draft: the moderator sees its figures in review, readers see the evidence card once live', async () => {
    const { user, password } = await createUser(suite.server.t, { displayName: 'Harbour Author' });
    const api = createClient(suite.server.t.app);
    expect((await api.post('/api/auth/sign-in', { email: user.email, password })).status).toBe(200);
    api.resetCsrf();
    await uploadRun(api, { fields: { title: 'Heat 1, 32-tooth pinion' } });
    const context = await suite.browser.newContext({ viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/sign-in?next=%2Fruns`);
    await page.getByLabel('E-mail').fill(user.email);
    await page.getByLabel('Password').fill(password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL('**/runs');
    // Evidence: the racer offers the first run on a guide draft in the editor.
    const { slug, revision } = await createDraftGuide(api, { title: 'Stock buggy gearing, backed by a logged run' });
    await page.goto(`${suite.server.baseUrl}/guides/new?draft=${revision.id}`);
    const picker = page.getByTestId('evidence-picker');
    await picker.getByLabel('Heat 1, 32-tooth pinion').click();
    await expect.poll(async () => (await api.get(`/api/revisions/${revision.id}/runs`)).body.data?.length).toBe(1);
    await expect.poll(() => picker.getByLabel('Heat 1, 32-tooth pinion').isChecked()).toBe(true);
    expect((await api.post(`/api/revisions/${revision.id}/submit`, { note: 'Gearing backed by heat 1' })).status).toBe(200);

    // The moderator sees the run's figures in review, then publishes; readers see the evidence card.
    const mod = await createUser(suite.server.t, { role: 'moderator', displayName: 'Harbour Marshal' });
    const modContext = await suite.browser.newContext({ viewport: { width: 1366, height: 900 } });
    const modPage = await modContext.newPage();
    await modPage.goto(`${suite.server.baseUrl}/sign-in?next=%2Freview%2F${revision.id}`);
    await modPage.getByLabel('E-mail').fill(mod.user.email);
    await modPage.getByLabel('Password').fill(mod.password);
    await modPage.getByRole('button', { name: 'Sign in' }).click();
    await modPage.getByTestId('review-evidence').getByText('Peak motor speed').waitFor();
    await screenshot(modPage, 'review-evidence');
    const modApi = createClient(suite.server.t.app);
    expect((await modApi.post('/api/auth/sign-in', { email: mod.user.email, password: mod.password })).status).toBe(200);
    modApi.resetCsrf();
    expect((await modApi.post(`/api/reviews/${revision.id}/publish`)).status).toBe(200);
    await modContext.close();

    const reader = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    const readerPage = await reader.newPage();
    await readerPage.goto(`${suite.server.baseUrl}/guides/${slug}`);
    // The card's chart code is fetched only when the reader comes near it (below the body, before the history).
    await waitForApp(readerPage);
    await readerPage.locator('#history').scrollIntoViewIfNeeded();
    const card = readerPage.getByTestId('guide-evidence');
    await card.getByRole('link', { name: 'Heat 1, 32-tooth pinion' }).waitFor();
    await card.locator('canvas').first().waitFor();
    await readerPage.getByTestId('guide-evidence').scrollIntoViewIfNeeded();
    await screenshot(readerPage, 'guide-evidence-phone');
    await card.getByRole('link', { name: 'Heat 1, 32-tooth pinion' }).click();
    await readerPage.getByTestId('run-figures').waitFor();
    await reader.close();
    expect(errors).toEqual([]);
    await context.close();
  }, 120_000);
});
