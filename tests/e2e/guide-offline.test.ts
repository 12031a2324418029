import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, VIEWPORTS, watchPageErrors } from '../setup/browser';
import { editBody, openProposal, revisionsOf, seriousViolations, signedInPage, waitSaved } from './guide-helpers';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

const status = (page: Page) => page.getByTestId('autosave-status');

/** Types at the very end of the body, key by key, as a person would. */
async function typeAtEnd(page: Page, text: string) {
  const body = page.getByLabel('Body');
  await body.click();
  await body.press('Control+End');
  await body.pressSequentially(text, { delay: 5 });
}

describe('nothing lost offline, in Chromium', () => {
  it('autosave fails while the author keeps typing; the editor says so, offers the text back after a reload, and stores it once the connection returns', async () => {
    const slug = 'drag-car-park-asphalt';
    const rosa = await signedInPage(suite.browser, suite.server.baseUrl, 'rosa');
    const errors = watchPageErrors(rosa);
    const body = rosa.getByLabel('Body');

    // A draft on the server to start from.
    await openProposal(rosa, suite.server.baseUrl, slug, '## ');
    const firstLine = (await body.inputValue()).split('\n').find((l) => l.trim().length > 40)!;
    await editBody(rosa, firstLine, `${firstLine} Checked again on the new surface.`);
    await waitSaved(rosa);
    await rosa.waitForURL(/\?draft=/);
    const draftId = new URL(rosa.url()).searchParams.get('draft')!;
    const draftRow = async () => (await revisionsOf(suite.server.t.db.dataSource, slug)).find((r) => r.id === draftId)!;
    expect((await draftRow()).content.body).toContain('Checked again on the new surface.');

    // The connection to the server drops for saves (reads still work, as on a flaky hall network).
    await rosa.route('**/api/revisions/*', (route) => (route.request().method() === 'PATCH' ? route.abort('internetdisconnected') : route.continue()));
    const offlineText = ' Launch on half punch first; the car park tarmac is cold until noon.';
    await typeAtEnd(rosa, offlineText);
    await rosa.locator('[data-testid="autosave-status"][data-state="offline"]').waitFor({ timeout: 20_000 });
    expect(await status(rosa).textContent()).toBe('Offline — not saved to the server yet, kept in this browser');
    await typeAtEnd(rosa, ' Still typing.');
    expect(await body.inputValue()).toContain(`${offlineText.trim()} Still typing.`);
    // Typing on while offline does not make it look saved or merely pending.
    // (A retry may be under way at this instant: "saving" is honest too.)
    expect(['offline', 'saving']).toContain(await status(rosa).getAttribute('data-state'));
    await rosa.locator('[data-testid="autosave-status"][data-state="offline"]').waitFor({ timeout: 20_000 });
    expect((await draftRow()).content.body).not.toContain('Launch on half punch'); // really not on the server
    await screenshot(rosa, 'guides-editor-offline');
    await rosa.setViewportSize(VIEWPORTS.phone);
    await screenshot(rosa, 'guides-editor-offline-phone');
    await rosa.setViewportSize(VIEWPORTS.desktop);

    // A reload (still unable to save): the editor opens with the server's copy and offers the newer local text.
    await rosa.reload();
    const offer = rosa.getByRole('note').filter({ hasText: 'This browser holds newer text for this draft' });
    await offer.waitFor({ timeout: 15_000 });
    await expect.poll(() => body.inputValue()).toContain('Checked again on the new surface.');
    expect(await body.inputValue()).not.toContain('Launch on half punch');
    await screenshot(rosa, 'guides-editor-restore-offer');
    expect(await seriousViolations(rosa)).toBe('');
    await offer.getByRole('button', { name: 'Restore the newer text' }).click();
    await expect.poll(() => body.inputValue()).toContain(`${offlineText.trim()} Still typing.`);
    expect(await offer.count()).toBe(0);
    // Focus lands in the body (the pressed button is gone), so typing carries on there.
    await expect.poll(() => body.evaluate((el) => el === document.activeElement)).toBe(true);
    // Still offline: it says so, and the server still has the older copy.
    await rosa.locator('[data-testid="autosave-status"][data-state="offline"]').waitFor({ timeout: 20_000 });
    expect((await draftRow()).content.body).not.toContain('Launch on half punch');

    // The connection comes back: the next retry stores the restored text.
    await rosa.unroute('**/api/revisions/*');
    await rosa.locator('[data-testid="autosave-status"][data-state="saved"]').waitFor({ timeout: 30_000 });
    await expect.poll(async () => (await draftRow()).content.body, { timeout: 10_000 }).toContain(`${offlineText.trim()} Still typing.`);

    // Fully offline (the browser knows): the status says so at once, and going online saves without waiting for a retry.
    await rosa.context().setOffline(true);
    await typeAtEnd(rosa, ' Tyre warmers are not allowed in this class.');
    await rosa.locator('[data-testid="autosave-status"][data-state="offline"]').waitFor({ timeout: 20_000 });
    await rosa.context().setOffline(false);
    await rosa.locator('[data-testid="autosave-status"][data-state="saved"]').waitFor({ timeout: 15_000 });
    await expect.poll(async () => (await draftRow()).content.body, { timeout: 10_000 }).toContain('Tyre warmers are not allowed in this class.');
    expect((await draftRow()).state).toBe('draft');

    expect(errors).toEqual([]);
  }, 180_000);
});
