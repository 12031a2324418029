import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';
import { screenshot, screenshotPath, waitForApp, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';
import { createClient } from '../setup/test-app';
import { documentOf, signedInPage } from './guide-helpers';

const suite = browserSuite();
const account = (key: string) => DEMO_ACCOUNTS.find((a) => a.key === key)!;
const db = () => suite.server.t.db.dataSource;

/** The account's row and its newest audit row, straight from PostgreSQL. */
async function userState(email: string) {
  const [u] = await db().query(`SELECT id, role, disabled_at AS "disabledAt" FROM users WHERE email = $1`, [email]);
  const audit = await db().query(`SELECT action, from_value AS "from", to_value AS "to", reason FROM audit_log WHERE subject_id = $1 ORDER BY seq`, [u.id]);
  return { ...u, audit } as { id: string; role: string; disabledAt: Date | null; audit: Array<{ action: string; from: string; to: string; reason: string }> };
}

describe('administration and the audit log in Chromium', () => {
  it('an administrator changes a role and disables an account, each with a reason; the disabled person is told so only after the right password', async () => {
    const nell = await signedInPage(suite.browser, suite.server.baseUrl, 'nell', { width: 1366, height: 900 });
    const errors = [watchPageErrors(nell)];
    await nell.goto(`${suite.server.baseUrl}/admin/users`);
    await nell.getByRole('link', { name: 'Audit log' }).waitFor();
    const calumRow = nell.getByRole('row').filter({ hasText: 'calum@tidewater.test' });
    const roleSelect = calumRow.getByRole('combobox', { name: 'Role of Calum Fenwick' });
    await roleSelect.waitFor({ timeout: 20_000 });
    // Roles read in our words, not as stored values.
    expect(await roleSelect.locator('option').allTextContents()).toEqual(['Member', 'Moderator', 'Administrator']);
    await roleSelect.selectOption({ label: 'Moderator' });
    const roleDialog = nell.getByRole('dialog', { name: 'Change the role of Calum Fenwick?' });
    await roleDialog.getByText(/From Member to Moderator: moderators can also review/).waitFor();
    // No reason, no change.
    await roleDialog.getByRole('button', { name: 'Make moderator' }).click();
    await roleDialog.getByText(/Give a reason/).waitFor();
    expect((await userState('calum@tidewater.test')).role).toBe('member');
    await roleDialog.getByLabel('Reason').fill('Reviews the oval guides this season');
    await screenshot(nell, 'admin-role-dialog-1366');
    await roleDialog.getByRole('button', { name: 'Make moderator' }).click();
    await nell.getByText('Calum Fenwick is now moderator').waitFor();
    await roleDialog.waitFor({ state: 'hidden' });
    await expect.poll(() => roleSelect.inputValue()).toBe('moderator');
    expect(await userState('calum@tidewater.test')).toMatchObject({
      role: 'moderator',
      audit: [{ action: 'user.role', from: 'member', to: 'moderator', reason: 'Reviews the oval guides this season' }],
    });

    // Disabling Mira, keyboard only once the dialog is open: the reason, then Tab past Cancel to the button.
    const miraRow = nell.getByRole('row').filter({ hasText: 'mira@tidewater.test' });
    await miraRow.getByRole('button', { name: 'Disable' }).click();
    const disableDialog = nell.getByRole('dialog', { name: 'Disable Mira Quillon?' });
    await disableDialog.getByText(/signed out everywhere at once/).waitFor();
    // Escape backs out without a change.
    await nell.keyboard.press('Escape');
    await disableDialog.waitFor({ state: 'hidden' });
    expect((await userState('mira@tidewater.test')).disabledAt).toBeNull();
    await miraRow.getByRole('button', { name: 'Disable' }).click();
    await disableDialog.getByLabel('Reason').focus();
    await nell.keyboard.type('Copied a printed manual into three guides');
    await nell.keyboard.press('Tab');
    await expect.poll(() => nell.evaluate(() => document.activeElement?.textContent)).toBe('Cancel');
    await nell.keyboard.press('Tab');
    await expect.poll(() => nell.evaluate(() => document.activeElement?.textContent)).toBe('Disable account');
    await nell.keyboard.press('Enter');
    await nell.getByText('Mira Quillon is disabled and signed out').waitFor();
    const mira = await userState('mira@tidewater.test');
    expect(mira.disabledAt).not.toBeNull();
    expect(mira.audit).toEqual([{ action: 'user.disable', from: 'active', to: 'disabled', reason: 'Copied a printed manual into three guides' }]);

    // The same dialog on a phone fits the width.
    await nell.setViewportSize({ width: 390, height: 844 });
    await nell.getByRole('row').filter({ hasText: 'rosa@tidewater.test' }).getByRole('button', { name: 'Disable' }).click();
    const phoneDialog = nell.getByRole('dialog', { name: 'Disable Rosa Kittering?' });
    await phoneDialog.getByLabel('Reason').waitFor();
    expect(await phoneDialog.evaluate((el) => el.getBoundingClientRect().width)).toBeLessThanOrEqual(390);
    await nell.screenshot({ path: screenshotPath('admin-disable-dialog-390') });
    await nell.keyboard.press('Escape');
    await phoneDialog.waitFor({ state: 'hidden' });

    // Mira, on her phone: a wrong password gets the usual answer; the right one says the account is disabled.
    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    const phone = await context.newPage();
    errors.push(watchPageErrors(phone));
    await phone.goto(`${suite.server.baseUrl}/sign-in`);
    await waitForApp(phone);
    await phone.getByLabel('E-mail').fill(account('mira').email);
    await phone.getByLabel('Password').fill('not-her-password-at-all');
    await phone.getByRole('button', { name: 'Sign in' }).click();
    const notice = phone.getByRole('alert').filter({ hasText: /sign in|disabled/i });
    await notice.getByText('That e-mail and password do not match an account.').waitFor();
    expect(await notice.textContent()).not.toMatch(/disabled/i);
    await phone.getByLabel('Password').fill(account('mira').password);
    await phone.getByRole('button', { name: 'Sign in' }).click();
    await notice.getByText(/This account is disabled, so it cannot sign in\./).waitFor();
    await screenshot(phone, 'sign-in-disabled-390');
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    expect(errors.flat()).toEqual([]);
    await context.close();
  }, 120_000);

  it('a moderator goes from the review queue to the audit log, filters it, downloads it as CSV, and shows a hidden guide again', async () => {
    const slug = 'oval-pan-car-carpet';
    const reason = '=HYPERLINK("http://evil.test") pasted into the gearing table';
    const api = createClient(suite.server.t.app);
    expect((await api.post('/api/auth/sign-in', { email: account('priya').email, password: account('priya').password })).status).toBe(200);
    api.resetCsrf();
    expect((await api.post(`/api/guides/${slug}/hide`, { reason })).status).toBe(200);

    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen', { width: 1366, height: 900 });
    const errors = watchPageErrors(owen);
    await owen.goto(`${suite.server.baseUrl}/review`);
    const hidden = owen.getByRole('list', { name: 'Hidden from readers' });
    const item = hidden.getByRole('listitem').filter({ hasText: reason });
    await item.getByText(/hidden .* by Priya Lockhart/).waitFor();
    const title = (await item.getByRole('link').textContent())!;

    // Publishing asks first, saying what goes live; focus starts on Cancel, and Escape backs out.
    const proposal = 'Stock 2WD buggy on Harbour Flats clay, tight layout';
    await owen.getByRole('link', { name: proposal }).click();
    await owen.getByRole('heading', { name: proposal, level: 1 }).waitFor();
    await owen.getByRole('button', { name: 'Publish', exact: true }).click();
    const confirm = owen.getByRole('dialog', { name: 'Publish this version?' });
    await confirm.getByText(/Readers will see version 4 of .+ by Rosa Kittering in place of live version 3/).waitFor();
    await confirm.getByText(/The text changes in \d+ place/).waitFor();
    await expect.poll(() => owen.evaluate(() => document.activeElement?.textContent)).toBe('Cancel');
    await screenshot(owen, 'review-confirm-publish-1366');
    await owen.keyboard.press('Escape');
    await confirm.waitFor({ state: 'hidden' });
    const [waiting] = await db().query(
      `SELECT r.state FROM revisions r JOIN documents d ON d.id = r.document_id WHERE d.slug = 'stock-2wd-buggy-harbour-flats-clay' AND r.number = 4`,
    );
    expect(waiting).toEqual({ state: 'in_review' });
    await owen.goto(`${suite.server.baseUrl}/review`);
    await hidden.getByRole('listitem').filter({ hasText: reason }).waitFor();

    await owen.getByRole('link', { name: 'Audit log' }).click();
    await owen.waitForURL(`${suite.server.baseUrl}/audit`);
    await owen.getByRole('heading', { name: 'Audit log', level: 1 }).waitFor();
    const table = owen.getByRole('table', { name: 'Audit entries, newest first' });
    const hideRow = table.getByRole('row').filter({ hasText: reason });
    await hideRow.getByText('Hid from readers').waitFor();
    await hideRow.getByRole('link', { name: title }).waitFor();
    await screenshot(owen, 'audit-log-1366');

    // Filter by action: only hides, and the address holds the filter.
    await owen.getByLabel('Action').selectOption({ label: 'Hid from readers' });
    await owen.waitForURL(/action=document\.hide/);
    await expect.poll(async () => (await table.getByRole('row').allTextContents()).slice(1).every((t) => t.includes('Hid from readers'))).toBe(true);
    // By person: Priya's rows only.
    await hideRow.getByRole('button', { name: 'Only rows by Priya Lockhart' }).click();
    await owen.waitForURL(/actor=/);
    await owen.getByText('By').filter({ hasText: 'Priya Lockhart' }).first().waitFor();
    await expect.poll(async () => (await table.getByRole('row').count()) - 1).toBe(1);

    // The CSV link carries the same filters; the reason that looks like a formula arrives as text.
    const href = (await owen.getByRole('link', { name: 'Download these entries as CSV' }).getAttribute('href'))!;
    expect(href).toMatch(/^\/api\/audit\.csv\?/);
    expect(href).toContain('action=document.hide');
    const res = await owen.request.get(`${suite.server.baseUrl}${href}`);
    expect(res.status()).toBe(200);
    const rows = Papa.parse<string[]>((await res.text()).replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
    expect(rows).toHaveLength(2);
    expect(rows[1][10]).toBe(`'${reason}`);

    // On a phone the entries stack, and nothing runs off the side.
    await owen.setViewportSize({ width: 390, height: 844 });
    const phoneList = owen.getByRole('list', { name: 'Audit entries, newest first' });
    await phoneList.getByRole('listitem').first().getByText('Hid from readers').waitFor();
    await expect.poll(() => owen.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await screenshot(owen, 'audit-log-390');
    await owen.setViewportSize({ width: 1366, height: 900 });

    // Back on the queue, "Show again" brings the guide back to readers.
    await owen.goto(`${suite.server.baseUrl}/review`);
    await owen.setViewportSize({ width: 390, height: 844 });
    await hidden.getByRole('button', { name: `Show “${title}” again` }).waitFor();
    await hidden.screenshot({ path: screenshotPath('review-queue-hidden-390') });
    await owen.setViewportSize({ width: 1366, height: 900 });
    await hidden.getByRole('button', { name: `Show “${title}” again` }).click();
    await owen.getByText(`“${title}” is visible to readers again`).waitFor();
    await expect.poll(() => hidden.getByRole('listitem').filter({ hasText: reason }).count()).toBe(0);
    expect((await documentOf(db(), slug)).hiddenAt).toBeNull();
    const [unhide] = await db().query(
      `SELECT a.action FROM audit_log a JOIN users u ON u.id = a.actor_id WHERE u.email = $1 AND a.action = 'document.unhide'`,
      [account('owen').email],
    );
    expect(unhide).toEqual({ action: 'document.unhide' });
    await screenshot(owen, 'review-queue-hidden-1366');
    expect(errors).toEqual([]);
  }, 120_000);
});
