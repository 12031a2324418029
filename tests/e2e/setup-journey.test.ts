import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { SetupRecord } from '../../shared/schemas/setup-record';
import { screenshot, watchPageErrors } from '../setup/browser';
import { createUser } from '../factories/user';
import { browserSuite } from '../setup/browser-suite';

const GUIDE = 'stock-2wd-buggy-harbour-flats-clay';
const suite = browserSuite();
let work: string;

beforeAll(async () => {
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-setup-journey-'));
});
afterAll(async () => {
  if (work) fs.rmSync(work, { recursive: true, force: true });
});

async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${suite.server.baseUrl}/sign-in?next=%2Fsetups`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/setups');
}

describe('setup journey in Chromium', () => {
  it('a racer downloads a baseline, uploads an edited copy and sees the comparison with its cautions', async () => {
    const { user, password } = await createUser(suite.server.t, { displayName: 'Harbour Racer' });
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await signIn(page, user.email, password);

    // The library lists the live baselines; filter to the class and download the JSON.
    const table = page.getByTestId('baselines-table');
    await table.getByRole('link', { name: 'Stock 2WD buggy on Harbour Flats clay, tight layout', exact: true }).waitFor();
    await screenshot(page, 'setups-library');
    await page.getByLabel('Class').selectOption('buggy-2wd-stock');
    await expect.poll(() => table.locator('tbody tr').count()).toBe(1);
    const [download] = await Promise.all([page.waitForEvent('download'), table.getByRole('link', { name: /as JSON/ }).click()]);
    expect(download.suggestedFilename()).toBe(`${GUIDE}-v3.tunewright.json`);
    const baseline: SetupRecord = JSON.parse(fs.readFileSync(await download.path(), 'utf8'));
    expect(baseline.gearing.pinionTeeth).toBe(32);

    // The racer's own copy: two teeth more on the pinion, and the cutoff lowered to 2.9 V per cell.
    const mine = {
      ...baseline,
      gearing: { ...baseline.gearing, pinionTeeth: 34 },
      escSettings: { ...baseline.escSettings, 'low-voltage-cutoff': { value: 2.9, unit: 'V' } },
    };
    const file = path.join(work, 'my-stock-buggy.json');
    fs.writeFileSync(file, JSON.stringify(mine, null, 2));
    await page.getByLabel('Setup file').setInputFiles(file);
    await page.getByRole('button', { name: 'Upload' }).click();
    await page.getByText('Uploaded my-stock-buggy.json').first().waitFor();
    await page.getByTestId('uploads-list').getByText('my-stock-buggy.json').waitFor();

    // A refused upload lists its problem by path and stores nothing.
    const bad = path.join(work, 'broken.json');
    fs.writeFileSync(bad, JSON.stringify({ ...mine, escSettings: { 'drag-brak': { value: 8, unit: '%' } } }));
    await page.getByLabel('Setup file').setInputFiles(bad);
    await page.getByRole('button', { name: 'Upload' }).click();
    await page.getByTestId('upload-errors').getByText('escSettings.drag-brak').waitFor();
    await screenshot(page, 'setups-upload-refused');
    expect(await page.getByTestId('uploads-list').locator('li').count()).toBe(1);

    // Compare the upload with the guide's baseline.
    await page.getByTestId('uploads-list').getByRole('link', { name: 'Compare' }).click();
    await page.waitForURL('**/setups/compare?b=*');
    await page.getByLabel(/^A /).selectOption(`guide:${GUIDE}`);
    const cautions = page.getByTestId('cautions');
    await cautions.getByText('Cutoff below the safe window').waitFor();
    await expect.poll(() => cautions.getByRole('alert').first().textContent()).toContain('2.90 V per cell');
    const changed = page.getByTestId('fields-table').locator('tr[data-changed]');
    await expect.poll(() => changed.count()).toBe(2);
    expect(await changed.allTextContents()).toEqual([expect.stringContaining('Low-voltage cutoff'), expect.stringContaining('Pinion')]);
    const fdrRow = page.getByTestId('deltas-table').getByRole('row', { name: /Final drive ratio/ });
    expect(await fdrRow.textContent()).toContain('6.83:1');
    expect(await fdrRow.textContent()).toContain('6.42:1');
    await screenshot(page, 'setups-compare');
    await page.setViewportSize({ width: 375, height: 800 });
    await screenshot(page, 'setups-compare-375');
    await page.screenshot({ path: '.test-artifacts/screenshots/setups-compare-375-top.png' });

    // The print sheet: no navigation, everything on one A4 page.
    await page.setViewportSize({ width: 1280, height: 900 });
    await page.goto(`${suite.server.baseUrl}/guides/${GUIDE}/setup/print`);
    await page.getByRole('heading', { name: /Stock 2WD buggy on Harbour Flats clay/ }).waitFor();
    expect(await page.getByRole('navigation', { name: 'Main' }).count()).toBe(0);
    await screenshot(page, 'setup-print-sheet');
    await page.setViewportSize({ width: 375, height: 800 });
    await screenshot(page, 'setup-print-sheet-375');
    await page.screenshot({ path: '.test-artifacts/screenshots/setup-print-sheet-375-top.png' });
    await page.emulateMedia({ media: 'print' });
    await page.setViewportSize({ width: 794, height: 1123 }); // A4 at 96 dpi
    await screenshot(page, 'setup-print-sheet-print-media');
    const pdf = await page.pdf({ format: 'A4', printBackground: false });
    const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
    expect(pages).toBe(1);

    // The library at phone width.
    await page.emulateMedia({ media: 'screen' });
    await page.setViewportSize({ width: 375, height: 800 });
    await page.goto(`${suite.server.baseUrl}/setups`);
    await page.getByTestId('baselines-table').waitFor();
    await screenshot(page, 'setups-library-375');
    await page.getByTestId('baselines-table').scrollIntoViewIfNeeded();
    await page.screenshot({ path: '.test-artifacts/screenshots/setups-library-375-table.png' });

    expect(errors).toEqual([]);
    await context.close();
  }, 120_000); // a whole journey (download, two uploads, compare, print sheet, phone width), like the run-log journeys

  it('builds a setup on /setups/new from the parameter library and checks it live', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const errors = watchPageErrors(page);
    await page.goto(`${suite.server.baseUrl}/setups/new`);
    await page.getByLabel('Spur (teeth)').fill('84');
    await page.getByLabel('Pinion (teeth)').fill('32');
    await page.getByLabel('Internal ratio (:1)').fill('2.6');
    await page.getByLabel('Tyre diameter (mm)').fill('62');
    await page.getByLabel('kV (rpm/V)').fill('2200');
    await page.getByLabel('Add a setting').selectOption('low-voltage-cutoff');
    await page.getByRole('button', { name: 'Add', exact: true }).click();
    const cutoff = page.getByRole('textbox', { name: /Low-voltage cutoff/ });
    await cutoff.fill('4');
    await page.getByRole('button', { name: 'Make the setup file' }).click();
    await page.getByText('Low-voltage cutoff must be between 2.5 V and 3.6 V (got 4 V)').waitFor();
    await cutoff.fill('3.2');
    await page.getByRole('button', { name: 'Make the setup file' }).click();
    await page.getByText('Your setup record is ready').waitFor();
    expect(await page.getByTestId('computed-values').textContent()).toContain('6.83:1');
    await screenshot(page, 'setups-new');
    expect(errors).toEqual([]);
    await page.close();
  });
});
