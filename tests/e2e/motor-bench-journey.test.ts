import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, watchPageErrors } from '../setup/browser';
import { createUser } from '../factories/user';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${suite.server.baseUrl}/sign-in?next=%2Fmotors`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/motors');
}

async function fillCheck(page: Page, values: Record<string, string>) {
  const form = page.getByRole('form', { name: 'Add a bench check' });
  for (const [name, value] of Object.entries(values)) await form.locator(`[name="${name}"]`).fill(value);
  await form.getByRole('button', { name: 'Save check' }).click();
}

/** More checks through the API from inside the page (same session and CSRF token as the app). */
async function addChecksByApi(page: Page, motorId: string, rpms: number[]) {
  await page.evaluate(
    async ({ motorId, rpms }) => {
      const token = (await (await fetch('/api/csrf')).json()).data.token;
      for (const [i, rpm] of rpms.entries()) {
        const res = await fetch(`/api/motors/${motorId}/checks`, {
          method: 'POST',
          headers: { 'content-type': 'application/json', 'x-csrf-token': token },
          body: JSON.stringify({ testVoltageV: 7.4, noLoadRpm: rpm, noLoadCurrentA: 2.1, testedAt: new Date(Date.UTC(2026, 10, 10 + i)).toISOString() }),
        });
        if (res.status !== 201) throw new Error(`check ${i}: ${res.status}`);
      }
    },
    { motorId, rpms },
  );
}

describe('motor bench journey in Chromium', () => {
  for (const [label, viewport] of [
    ['phone', { width: 390, height: 844 }],
    ['desktop', { width: 1366, height: 900 }],
  ] as const) {
    it(`registers a motor, adds two checks, compares them and reads the history (${label})`, async () => {
      const { user, password } = await createUser(suite.server.t, { displayName: 'Harbour Bench Racer' });
      const context = await suite.browser.newContext({ viewport });
      const page = await context.newPage();
      const errors = watchPageErrors(page);
      await signIn(page, user.email, password);

      // Register.
      await page.getByLabel('Your label').fill('Blue can 17.5');
      await page.getByLabel('Wind (turns)').fill('17.5');
      await page.getByRole('button', { name: 'Register motor' }).click();
      await page.waitForURL(/\/motors\/[0-9a-f-]{36}$/);
      const motorId = page.url().split('/').pop()!;
      await page.getByRole('heading', { name: 'Blue can 17.5' }).waitFor();

      // A refused check names its field and keeps what was typed.
      await fillCheck(page, { testVoltageV: '0', noLoadRpm: '17020' });
      await page.getByText('Test voltage must be above 0 V').waitFor();
      expect(await page.locator('[name="noLoadRpm"]').inputValue()).toBe('17020');

      // Before teardown, then after the rebuild (timing moved, repeats on the speed).
      await fillCheck(page, {
        testVoltageV: '7.4',
        noLoadRpm: '17020',
        noLoadCurrentA: '2.1',
        timingDeg: '30',
        phaseResistanceOhm: '0.0215',
        resistanceTempC: '22',
        testedAt: '2026-11-01T19:30',
        notes: 'Before teardown',
      });
      await page.locator('tbody tr[data-check-id]').first().waitFor();
      await fillCheck(page, {
        testVoltageV: '7.4',
        noLoadRpm: '17880 17920 17900',
        noLoadCurrentA: '1.7',
        timingDeg: '38',
        phaseResistanceOhm: '0.0216',
        resistanceTempC: '23',
        testedAt: '2026-11-08T19:30',
        notes: 'After rebuild, new bearings',
      });
      await expect.poll(() => page.locator('tbody tr[data-check-id]').count(), { timeout: 20_000 }).toBe(2);
      await page.getByText('(3×)').waitFor();

      // Compare: the timing row is clearly outside and highlighted; the finding says what it usually means.
      const timing = page.locator('[data-quantity="timingDeg"]:visible');
      await timing.waitFor();
      expect(await timing.getAttribute('data-verdict')).toBe('clearly_outside');
      await page.locator('[data-finding="timing-moved"]').waitFor();
      await page.getByText(/endbell or the sensor board/).waitFor();
      await page.getByRole('note').filter({ hasText: 'motor maker’s voltage and speed limits' }).first().waitFor();
      await page.getByRole('heading', { name: 'Before and after' }).scrollIntoViewIfNeeded();
      await screenshot(page, `motor-compare-${label}`);

      // History: no limits with two checks; with eight the control limits are drawn.
      const chart = page.locator('[data-chart="motor-history"]');
      await chart.waitFor();
      expect(await chart.getAttribute('data-limits')).toBe('none');
      await addChecksByApi(page, motorId, [17_010, 17_050, 16_990, 17_030, 17_000, 17_040]);
      await page.reload();
      await expect.poll(() => page.locator('tbody tr[data-check-id]').count(), { timeout: 20_000 }).toBe(8);
      await page.locator('[data-chart="motor-history"][data-limits="shown"]').waitFor();
      await page.getByText('upper limit').waitFor();
      await page.locator('[data-chart="motor-history"]').scrollIntoViewIfNeeded();
      await screenshot(page, `motor-history-${label}`);

      // Printable sheet.
      await page.goto(`${suite.server.baseUrl}/motors/${motorId}/print`);
      await page.getByRole('heading', { name: 'Blue can 17.5' }).waitFor();
      await screenshot(page, `motor-print-${label}`);
      expect(errors).toEqual([]);
      await context.close();
    }, 120_000);
  }

  it('shows the timing reading in mechanical degrees for the motor’s pole count as it is typed (phone)', async () => {
    const { user, password } = await createUser(suite.server.t, { displayName: 'Harbour Four-Pole Racer' });
    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await signIn(page, user.email, password);
    await page.getByLabel('Your label').fill('Four-pole mod');
    await page.getByLabel('Rotor poles').selectOption('4');
    await page.getByRole('button', { name: 'Register motor' }).click();
    await page.waitForURL(/\/motors\/[0-9a-f-]{36}$/);
    const form = page.getByRole('form', { name: 'Add a bench check' });
    const timing = form.getByLabel(/Timing reading, electrical degrees/);
    const out = form.getByTestId('timing-mechanical');
    // Before anything is typed: the rule for this rotor.
    await expect.poll(() => out.textContent()).toMatch(/electrical ÷ 2 on this 4-pole rotor/);
    // Handbook relation: mechanical degrees = electrical degrees ÷ pole pairs; a 4-pole rotor has 2 pole pairs.
    await timing.fill('30');
    await expect.poll(() => out.textContent()).toBe('30° electrical = 15° mechanical (endbell) on this 4-pole rotor');
    await timing.fill('30 31');
    await expect.poll(() => out.textContent()).toBe('30, 31° electrical = 15, 15.5° mechanical (endbell) on this 4-pole rotor');
    // The hint is the field's description, so a screen reader hears it with the field.
    expect(await timing.getAttribute('aria-describedby')).toBeTruthy();
    await timing.scrollIntoViewIfNeeded();
    await screenshot(page, 'motor-check-timing-degrees-phone');
    expect(errors).toEqual([]);
    await context.close();
  }, 60_000);

  it("another member's motor page says it is not found", async () => {
    const owner = await createUser(suite.server.t);
    const other = await createUser(suite.server.t);
    const context = await suite.browser.newContext({ viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    await signIn(page, owner.user.email, owner.password);
    await page.getByLabel('Your label').fill('Private motor');
    await page.getByRole('button', { name: 'Register motor' }).click();
    await page.waitForURL(/\/motors\/[0-9a-f-]{36}$/);
    const url = page.url();
    await context.clearCookies();
    await signIn(page, other.user.email, other.password);
    await page.goto(url);
    await page.getByText('Motor not found').waitFor();
    await context.close();
  }, 60_000);
});
