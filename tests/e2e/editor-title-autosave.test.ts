import { describe, expect, it } from 'vitest';
import { screenshot, VIEWPORTS, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';
import { signedInPage, waitSaved } from './guide-helpers';

const suite = browserSuite();

describe('a new guide in Chromium: saved from its title on, length counted as it is typed', () => {
  it('saves the draft to the server as soon as it has a title, counts the title past its limit without cutting it, and says Saved (never "No changes yet") when reopened', async () => {
    const base = suite.server.baseUrl;
    const ds = suite.server.t.db.dataSource;
    const page = await signedInPage(suite.browser, base, 'jonah');
    const errors = watchPageErrors(page);
    await page.goto(`${base}/guides/new`);
    const title = page.getByLabel('Title', { exact: true });
    await title.waitFor();
    await expect.poll(() => page.getByTestId('autosave-status').getAttribute('data-state')).toBe('idle');

    // A title alone: the draft goes to the server and the address names it.
    await title.fill('Mini on the school-hall tiles');
    await waitSaved(page);
    await page.waitForURL(/\/guides\/new\?draft=[0-9a-f-]{36}$/);
    const draftId = new URL(page.url()).searchParams.get('draft')!;
    const [stored] = await ds.query(
      `SELECT r.state, r.content->>'title' AS title, r.content->>'summary' AS summary, d.slug FROM revisions r JOIN documents d ON d.id = r.document_id WHERE r.id = $1`,
      [draftId],
    );
    expect(stored).toEqual({ state: 'draft', title: 'Mini on the school-hall tiles', summary: '', slug: 'mini-on-the-school-hall-tiles' });

    // The count follows the typing; past the limit nothing is cut off and the server's reason is shown.
    await page.getByText('29 / 140 characters').waitFor();
    const long = `Mini on the school-hall tiles ${'with a very long afterthought '.repeat(4)}`.trim();
    expect(long.length).toBeGreaterThan(140);
    await title.fill(long);
    expect(await title.inputValue()).toBe(long);
    await page.getByText(`${long.length} / 140 characters: ${long.length - 140} too many`).waitFor();
    await expect.poll(() => page.getByTestId('autosave-status').textContent(), { timeout: 20_000 }).toContain('Keep the title to 140 characters');
    await screenshot(page, 'editor-title-over-limit');

    // Back under the limit, with a summary: saved, and the address follows the title while the guide was never live.
    await title.fill('Mini on the school-hall tiles, tight infield');
    await page.getByLabel('Summary').fill('Gentle punch for the slick tiles.');
    await waitSaved(page);
    await expect
      .poll(async () => (await ds.query(`SELECT d.slug FROM revisions r JOIN documents d ON d.id = r.document_id WHERE r.id = $1`, [draftId]))[0].slug)
      .toBe('mini-on-the-school-hall-tiles-tight-infield');

    // Reopened: the status says saved, not "No changes yet".
    await page.reload();
    await expect.poll(() => title.inputValue(), { timeout: 15_000 }).toBe('Mini on the school-hall tiles, tight infield');
    await expect.poll(() => page.getByTestId('autosave-status').getAttribute('data-state')).toBe('saved');
    expect(await page.getByTestId('autosave-status').textContent()).toMatch(/^Saved \d{2}:\d{2}$/);
    await page.getByText('33 / 500 characters').waitFor();
    await screenshot(page, 'editor-title-saved');
    await page.setViewportSize(VIEWPORTS.phone);
    await screenshot(page, 'editor-title-saved-phone');

    // It is on the workbench as a draft.
    await page.setViewportSize(VIEWPORTS.desktop);
    await page.goto(`${base}/me/revisions`);
    await page
      .getByRole('region', { name: /^Drafts/ })
      .getByText('Mini on the school-hall tiles, tight infield')
      .waitFor();
    expect(errors).toEqual([]);
    await page.context().close();
  }, 120_000);
});
