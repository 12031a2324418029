import { describe, expect, it } from 'vitest';
import { screenshot, VIEWPORTS, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';
import { createClient, type TestClient } from '../setup/test-app';
import { createUser } from '../factories/user';
import { guideInput } from '../factories/guide';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';
import { seriousViolations } from './guide-helpers';

const suite = browserSuite();

async function apiAs(email: string, password: string): Promise<TestClient> {
  const client = createClient(suite.server.t.app);
  const res = await client.post('/api/auth/sign-in', { email, password });
  if (res.status !== 200) throw new Error(`sign-in failed: ${JSON.stringify(res.body)}`);
  client.resetCsrf();
  return client;
}

describe('the workbench and Your data in Chromium', () => {
  it('signs in from the header back to the page, opens a submitted guide, sees a sent-back edit’s reason with its changes, discards a draft, downloads the data and deletes the account', async () => {
    const base = suite.server.baseUrl;
    const ds = suite.server.t.db.dataSource;
    const password = 'quay-lantern-gearbox-61';
    const { user } = await createUser(suite.server.t, { displayName: 'Tamsin Reedbank', email: 'tamsin@tidewater.test', password });
    const owenAccount = DEMO_ACCOUNTS.find((a) => a.key === 'owen')!;
    const tamsinApi = await apiAs(user.email, password);
    const owen = await apiAs(owenAccount.email, owenAccount.password);

    // Her work, set up through the API: a new guide waiting for review, an edit of a live guide sent back, a draft.
    const waiting = (await tamsinApi.post('/api/guides', guideInput({ title: 'Touring car on Quayside carpet, long sweeper' }))).body.data.revision
      .id as string;
    expect((await tamsinApi.post(`/api/revisions/${waiting}/submit`, { note: 'First version' })).status).toBe(200);
    const slug = 'stock-2wd-buggy-harbour-flats-clay';
    const history = (await tamsinApi.get(`/api/guides/${slug}/revisions`)).body.data as Array<{ id: string; state: string; number: number }>;
    const live = history.find((r) => r.state === 'published')!;
    const liveBody = (await tamsinApi.get(`/api/guides/${slug}/revisions/${live.number}`)).body.data.revision.content.body as string;
    const edit = await tamsinApi.post(`/api/guides/${slug}/revisions`, {
      baseRevisionId: live.id,
      body: `${liveBody}\n\nOn a cold morning, start with two clicks less punch.`,
    });
    expect(edit.status, JSON.stringify(edit.body)).toBe(201);
    const editId = edit.body.data.revision.id as string;
    expect((await tamsinApi.post(`/api/revisions/${editId}/submit`, { note: 'Cold mornings' })).status).toBe(200);
    const reason = 'Say what air temperature counts as a cold morning.';
    expect((await owen.post(`/api/reviews/${editId}/return`, { reason })).status).toBe(200);
    const draft = (await tamsinApi.post('/api/guides', { title: 'Half-finished notes on the oval' })).body.data as {
      revision: { id: string };
      guide: { slug: string };
    };

    // From a guide page, the header's Sign in comes back to that guide.
    const context = await suite.browser.newContext({ viewport: VIEWPORTS.desktop });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await page.goto(`${base}/guides/${slug}`);
    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).click();
    await page.waitForURL(/\/sign-in\?next=/);
    await page.getByLabel('E-mail').fill(user.email);
    await page.getByLabel('Password').fill(password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${base}/guides/${slug}`);

    // The workbench: the submitted guide opens in the editor, read-only, waiting for review.
    await page.goto(`${base}/me/revisions`);
    const waitingRegion = page.getByRole('region', { name: /Waiting for review/ });
    await waitingRegion.getByRole('link', { name: 'Open: Touring car on Quayside carpet, long sweeper' }).click();
    await page.waitForURL(`**/guides/new?draft=${waiting}`);
    await page.getByRole('note').filter({ hasText: 'Waiting for review' }).or(page.getByText('A moderator will publish it or send it back')).first().waitFor();
    await page.getByRole('button', { name: 'Withdraw to edit' }).waitFor();
    await page.goBack();

    // The sent-back edit: the reason and the changes in one place.
    const sentBack = page.getByRole('region', { name: /Sent back to you/ });
    await sentBack.getByText(reason).waitFor();
    await sentBack.getByText(/What you proposed/).click();
    await expect
      .poll(async () => (await sentBack.locator('ins, [data-diff="added"], .text-ok').allInnerTexts()).join(' '), { timeout: 20_000 })
      .toMatch(/cold morning/);
    await screenshot(page, 'account-workbench-returned');
    expect(await seriousViolations(page)).toBe('');

    // Discard the draft, after confirming.
    const drafts = page.getByRole('region', { name: /^Drafts/ });
    // By keyboard: Enter opens the confirmation with the focus inside it, Escape closes it and keeps the draft.
    const discardButton = drafts.getByRole('button', { name: 'Discard: Half-finished notes on the oval' });
    await discardButton.focus();
    await page.keyboard.press('Enter');
    const confirm = page.getByRole('dialog', { name: 'Discard this draft?' });
    await confirm.waitFor();
    await expect.poll(() => page.evaluate(() => !!document.activeElement?.closest('dialog'))).toBe(true);
    await page.keyboard.press('Escape');
    await confirm.waitFor({ state: 'hidden' });
    await drafts.getByText('Half-finished notes on the oval').waitFor();
    await discardButton.click();
    await confirm.getByText(/never live, so the guide goes with it/).waitFor();
    await screenshot(page, 'account-workbench-discard-dialog');
    await confirm.getByRole('button', { name: 'Discard' }).click();
    await expect.poll(() => drafts.getByText('Half-finished notes on the oval').count()).toBe(0);
    expect(await ds.query(`SELECT 1 FROM documents WHERE slug = $1`, [draft.guide.slug])).toEqual([]);

    await page.setViewportSize(VIEWPORTS.phone);
    await screenshot(page, 'account-workbench-phone');
    await page.setViewportSize(VIEWPORTS.desktop);

    // Your data: the archive downloads; deleting asks for the password.
    await page.goto(`${base}/account`);
    const data = page.getByRole('region', { name: 'Your data' });
    const download = data.getByRole('link', { name: 'Download my data (zip)' });
    expect(await download.getAttribute('href')).toBe('/api/account/export');
    const archive = await page.evaluate(async () => {
      const r = await fetch('/api/account/export');
      const bytes = new Uint8Array(await r.arrayBuffer());
      return { status: r.status, type: r.headers.get('content-type'), magic: Array.from(bytes.slice(0, 2)) };
    });
    expect(archive).toEqual({ status: 200, type: 'application/zip', magic: [0x50, 0x4b] }); // "PK", a zip's first bytes
    await screenshot(page, 'account-your-data');
    await page.setViewportSize(VIEWPORTS.phone);
    await data.scrollIntoViewIfNeeded();
    await screenshot(page, 'account-your-data-phone');
    await page.setViewportSize(VIEWPORTS.desktop);

    await data.getByRole('button', { name: 'Delete my account…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Delete your account?' });
    await dialog.getByLabel('Current password').fill('not-my-password-at-all');
    await dialog.getByRole('button', { name: 'Delete my account' }).click();
    await dialog.getByText('That is not your current password').waitFor();
    await dialog.getByLabel('Current password').fill(password);
    await screenshot(page, 'account-delete-dialog');
    await dialog.getByRole('button', { name: 'Delete my account' }).click();
    await page.waitForURL(`${base}/`);
    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();
    const mail = await suite.server.t.waitForMail(user.email, /^Your Tunewright account was deleted$/, 20_000);
    // She had published nothing, so nothing of hers stays in the library.
    expect(mail.text).toContain('nothing of yours stays in the library');
    const [row] = await ds.query(`SELECT display_name, deleted_at FROM users WHERE id = $1`, [user.id]);
    expect(row.display_name).toBe('Former member');
    expect(row.deleted_at).not.toBeNull();
    expect(errors).toEqual([]);
    await context.close();
  }, 180_000);
});
