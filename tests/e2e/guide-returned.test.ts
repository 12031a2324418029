import { describe, expect, it } from 'vitest';
import { screenshot, VIEWPORTS, watchPageErrors } from '../setup/browser';
import { editBody, revisionsOf, seriousViolations, signedInPage, waitSaved } from './guide-helpers';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

/** The path and query of the first link in a mail's text, to open on the test server. */
function linkIn(text: string) {
  const url = text.match(/https?:\/\/\S+/)?.[0];
  if (!url) throw new Error(`no link in mail: ${text}`);
  const u = new URL(url);
  return `${u.pathname}${u.search}`;
}

describe('returned revision in Chromium: send back with a reason, edit, resubmit', () => {
  it('the moderator sends a proposal back; the author sees why on the workbench, in the mail and in the editor, edits and resubmits; the moderator sees the new text in the queue', async () => {
    // Seeded: Rosa's version 4 of the stock buggy guide is waiting for review.
    const slug = 'stock-2wd-buggy-harbour-flats-clay';
    const title = 'Stock 2WD buggy on Harbour Flats clay, tight layout';
    const proposal = (await revisionsOf(suite.server.t.db.dataSource, slug)).find((r) => r.state === 'in_review')!;
    expect(proposal).toMatchObject({ authorEmail: 'rosa@tidewater.test', number: 4 });
    const reason =
      'The brake-curve example uses 15 % initial brake, but the checklist still says 10 %. Make them agree, and say which tyres the afternoon numbers were run on.';

    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    const rosa = await signedInPage(suite.browser, suite.server.baseUrl, 'rosa');
    const errors = [owen, rosa].map(watchPageErrors);

    // The moderator opens it from the queue and sends it back; a reason is required.
    await owen.goto(`${suite.server.baseUrl}/review`);
    await owen.getByRole('link', { name: title }).click();
    await owen.getByRole('heading', { name: title, level: 1 }).waitFor();
    await owen.getByRole('button', { name: 'Send back with a reason' }).click();
    const dialog = owen.getByRole('dialog', { name: 'Send this revision back' });
    await expect.poll(() => owen.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? document.activeElement?.tagName)).not.toBe('BODY');
    await dialog.getByRole('button', { name: 'Send back' }).click();
    await dialog.getByText(/Give the author a reason/).waitFor();
    await dialog.getByLabel('Reason for the author').fill(reason);
    await screenshot(owen, 'guides-return-dialog');
    await dialog.getByRole('button', { name: 'Send back' }).click();
    await owen.waitForURL(`${suite.server.baseUrl}/review`);
    await owen.getByText('Sent back to the author').waitFor();
    expect(await owen.getByRole('link', { name: title }).count()).toBe(0);
    const returned = (await revisionsOf(suite.server.t.db.dataSource, slug)).find((r) => r.id === proposal.id)!;
    expect(returned).toMatchObject({ state: 'returned', reason, content: proposal.content });

    // The author is told by mail, with the reason and a link that opens the revision in the editor.
    const mail = await suite.server.t.waitForMail('rosa@tidewater.test', /^Sent back for changes: Stock 2WD buggy/, 20_000);
    expect(mail.text).toContain(reason);
    const editorLink = linkIn(mail.text.slice(mail.text.indexOf('Open your revision')));
    expect(editorLink).toBe(`/guides/${slug}/edit?draft=${proposal.id}`);

    // On the workbench: the state and the reason.
    await rosa.goto(`${suite.server.baseUrl}/me/revisions`);
    const sentBack = rosa.getByRole('region', { name: /Sent back to you/ });
    await sentBack.getByText(title).waitFor();
    await sentBack.getByText(reason).waitFor();
    await sentBack.getByText('Sent back', { exact: true }).waitFor(); // the state badge, in our words
    expect(
      await rosa
        .getByRole('region', { name: /Waiting for review/ })
        .getByText(title)
        .count(),
    ).toBe(0);
    await screenshot(rosa, 'guides-workbench-returned');
    expect(await seriousViolations(rosa)).toBe('');
    await rosa.setViewportSize(VIEWPORTS.phone);
    await screenshot(rosa, 'guides-workbench-returned-phone');
    await rosa.setViewportSize(VIEWPORTS.desktop);

    // The mail's link opens the editor with the reason on top.
    await rosa.goto(`${suite.server.baseUrl}${editorLink}`);
    const why = rosa.getByRole('note').filter({ hasText: 'Sent back by Owen Saltmarsh' });
    await why.getByText(reason).waitFor();
    await expect.poll(() => rosa.getByLabel('Body').inputValue()).toContain('Initial brake');
    await screenshot(rosa, 'guides-editor-returned');
    expect(await seriousViolations(rosa)).toBe('');

    // She fixes the checklist; the first change makes it a draft again, with the moderator's reason kept.
    const body = await rosa.getByLabel('Body').inputValue();
    const checklistLine = body.split('\n').find((l) => l.startsWith('- ') && /initial brake/i.test(l));
    expect(checklistLine, 'the checklist names the initial brake').toBeTruthy();
    const fixedLine = `${checklistLine} (15 % initial brake, as in the brake-curve example; afternoon numbers on worn pin tyres)`;
    await editBody(rosa, checklistLine!, fixedLine);
    await waitSaved(rosa);
    const edited = (await revisionsOf(suite.server.t.db.dataSource, slug)).find((r) => r.id === proposal.id)!;
    expect(edited).toMatchObject({ state: 'draft', reason });
    expect(edited.content.body).toContain(fixedLine);

    // Resubmit with a new note.
    await rosa.getByRole('button', { name: 'Submit for review' }).click();
    const submit = rosa.getByRole('dialog', { name: 'Submit for review' });
    expect(await submit.getByLabel('Edit note').inputValue()).toBe(proposal.note); // the old note, to build on
    await submit.getByLabel('Edit note').fill(`${proposal.note} Checklist now matches the brake-curve example; tyres named.`);
    await submit.getByRole('button', { name: 'Submit' }).click();
    await rosa.waitForURL('**/me/revisions');
    await rosa
      .getByRole('region', { name: /Waiting for review/ })
      .getByText(title)
      .waitFor();
    expect(await rosa.getByRole('region', { name: /Sent back to you/ }).count()).toBe(0);
    const resubmitted = (await revisionsOf(suite.server.t.db.dataSource, slug)).find((r) => r.id === proposal.id)!;
    expect(resubmitted).toMatchObject({ state: 'in_review', reason: null });
    expect(resubmitted.note).toMatch(/Checklist now matches/);

    // The moderator is told again; the link opens the review page, which shows the new text.
    const request = await suite.server.t.waitForMail('owen@tidewater.test', /^Waiting for review: Stock 2WD buggy/, 20_000);
    const reviewLink = linkIn(request.text.slice(request.text.indexOf('Open it in the review queue')));
    expect(reviewLink).toBe(`/review/${proposal.id}`);
    await owen.goto(`${suite.server.baseUrl}/review`);
    await owen.getByRole('link', { name: title }).waitFor();
    await screenshot(owen, 'guides-queue-resubmitted');
    await owen.goto(`${suite.server.baseUrl}${reviewLink}`);
    await owen.getByRole('heading', { name: title, level: 1 }).waitFor();
    await owen.getByText(/Checklist now matches the brake-curve example/).waitFor();
    // The reason it went back and what she changed since, in one place at the top.
    const since = owen.getByRole('region', { name: 'Changed since it was sent back' });
    await since.getByText(reason).waitFor();
    await expect.poll(async () => (await since.locator('ins').allTextContents()).join(' ')).toMatch(/worn pin tyres/);
    await expect
      .poll(async () => (await owen.getByTestId('rendered-body-diff').locator('[data-diff="added"]').allInnerTexts()).join(' '))
      .toMatch(/worn pin tyres/);
    await owen.getByRole('button', { name: 'Raw Markdown' }).click();
    await expect.poll(async () => (await owen.locator('ins').allTextContents()).join(' ')).toMatch(/worn pin tyres/);
    expect(await owen.getByRole('button', { name: 'Publish' }).isEnabled()).toBe(true);
    await screenshot(owen, 'guides-review-resubmitted');

    expect(errors.flat()).toEqual([]);
  }, 180_000);
});
