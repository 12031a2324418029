import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, screenshotPath, VIEWPORTS, waitForApp, watchPageErrors } from '../setup/browser';
import { documentOf, revisionsOf, seriousViolations, signedInPage } from './guide-helpers';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

const db = () => suite.server.t.db.dataSource;
const focusedText = (page: Page) => page.evaluate(() => document.activeElement?.textContent?.trim() ?? null);

async function visitorPage(viewport: { width: number; height: number } = VIEWPORTS.desktop) {
  const context = await suite.browser.newContext({ viewport });
  return context.newPage();
}

describe('withdraw, restore and hide in Chromium', () => {
  it('an author withdraws a proposal from the workbench and another from the editor: both are drafts again, out of the queue', async () => {
    const rosa = await signedInPage(suite.browser, suite.server.baseUrl, 'rosa');
    const jonah = await signedInPage(suite.browser, suite.server.baseUrl, 'jonah');
    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    const errors = [rosa, jonah, owen].map(watchPageErrors);

    // From the workbench: Rosa's new astroturf guide is waiting for review.
    const astroSlug = 'mod-2wd-buggy-brackwater-astroturf';
    const astroTitle = 'Modified 2WD buggy on astroturf, Brackwater Barn away round';
    expect((await revisionsOf(db(), astroSlug)).map((r) => r.state)).toEqual(['in_review']);
    await rosa.goto(`${suite.server.baseUrl}/me/revisions`);
    const waiting = rosa.getByRole('region', { name: /Waiting for review/ });
    await waiting.getByRole('button', { name: `Withdraw: ${astroTitle}` }).click();
    await rosa.getByText('Withdrawn: it is a draft again').waitFor();
    const drafts = rosa.getByRole('region', { name: /^Drafts/ });
    await drafts.getByText(astroTitle).waitFor();
    expect(await waiting.getByText(astroTitle).count()).toBe(0);
    // Focus follows the proposal into "Drafts", on its edit link.
    await expect.poll(() => rosa.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe(`Continue editing: ${astroTitle}`);
    expect(await revisionsOf(db(), astroSlug)).toEqual([expect.objectContaining({ state: 'draft', authorEmail: 'rosa@tidewater.test' })]);
    await screenshot(rosa, 'guides-workbench-withdrawn');
    expect(await seriousViolations(rosa)).toBe('');

    // From the editor: Jonah opens his own guide, is pointed at the proposal he already has, and withdraws it there.
    const eighthSlug = 'eighth-e-buggy-saltings-meadow';
    const proposal = (await revisionsOf(db(), eighthSlug)).find((r) => r.state === 'in_review')!;
    expect(proposal.authorEmail).toBe('jonah@tidewater.test');
    await jonah.goto(`${suite.server.baseUrl}/guides/${eighthSlug}`);
    await jonah.getByRole('link', { name: 'Propose an edit' }).click();
    const already = jonah.getByRole('note').filter({ hasText: 'You already have a revision of this in progress' });
    await already.getByRole('link', { name: 'Continue that one' }).click();
    await jonah.waitForURL(`**/guides/${eighthSlug}/edit?draft=${proposal.id}`);
    await jonah.getByRole('note').filter({ hasText: 'Waiting for review' }).waitFor();
    expect(await jonah.getByLabel('Title', { exact: true }).isDisabled()).toBe(true); // nothing to type into while it waits
    await screenshot(jonah, 'guides-editor-in-review');
    await jonah.getByRole('button', { name: 'Withdraw to edit' }).click();
    await jonah.getByText('Withdrawn: it is a draft on your workbench again').waitFor();
    await expect.poll(() => jonah.getByLabel('Title', { exact: true }).isDisabled()).toBe(false);
    await expect.poll(() => jonah.getByLabel('Body').evaluate((el) => el === document.activeElement)).toBe(true);
    await jonah.getByRole('button', { name: 'Submit for review' }).waitFor();
    expect(await jonah.getByRole('note').filter({ hasText: 'Waiting for review' }).count()).toBe(0);
    expect((await revisionsOf(db(), eighthSlug)).find((r) => r.id === proposal.id)).toMatchObject({ state: 'draft' });

    // Neither is in the moderator's queue any more.
    await owen.goto(`${suite.server.baseUrl}/review`);
    await owen.getByRole('table').waitFor();
    expect(await owen.getByRole('link', { name: astroTitle }).count()).toBe(0);
    expect(await owen.getByRole('link', { name: '1/8 electric buggy on Saltings Meadow' }).count()).toBe(0);
    expect(errors.flat()).toEqual([]);
  }, 120_000);

  it('a moderator restores version 1 from the history: a new live version that says what it restores, read as such by a visitor', async () => {
    const slug = 'mod-touring-car-park-asphalt';
    const v1Line = 'Gearing: 106 spur, 32 pinion, 1.9:1 internal, 64 mm tyres';
    const before = await revisionsOf(db(), slug);
    expect(before.map((r) => [r.number, r.state])).toEqual([
      [1, 'archived'],
      [2, 'archived'],
      [3, 'archived'],
      [4, 'published'],
    ]);
    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    const errors = watchPageErrors(owen);
    await owen.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await waitForApp(owen); // buttons on the server-drawn page answer once the app has started
    const history = owen.getByRole('region', { name: 'History' });
    await history.getByRole('table').waitFor();
    await history.getByRole('button', { name: 'Restore version 1' }).click();
    const dialog = owen.getByRole('dialog', { name: 'Restore version 1?' });
    await dialog.getByText(/current live version 4 becomes superseded/).waitFor();
    // A restore needs a reason: without one it says so and restores nothing.
    await dialog.getByRole('button', { name: 'Publish a copy of version 1' }).click();
    await dialog.getByText(/Say why this version is restored/).waitFor();
    await dialog.getByLabel('Reason').fill('Version 4 lost the warm-up caution');
    await owen.screenshot({ path: screenshotPath('guides-restore-dialog') }); // the viewport: the dialog sits where the history is
    await dialog.getByRole('button', { name: 'Publish a copy of version 1' }).click();
    await owen.getByText('Version 1 restored as version 5').waitFor();
    await expect
      .poll(() => owen.getByTestId('version-line').textContent())
      .toMatch(/^Version 5, published on .+ by Mira Quillon · restores version 1, brought back by Owen Saltmarsh$/);

    const after = await revisionsOf(db(), slug);
    expect(after.map((r) => [r.number, r.state, r.restoredFromNumber])).toEqual([
      [1, 'archived', null],
      [2, 'archived', null],
      [3, 'archived', null],
      [4, 'archived', null],
      [5, 'published', 1],
    ]);
    expect(after[4].content).toEqual(before[0].content);
    // Still credited to Mira, who wrote version 1; Owen is named as the one who brought it back.
    expect(before[0].authorEmail).toBe('mira@tidewater.test');
    expect(after[4]).toMatchObject({ authorEmail: 'mira@tidewater.test', note: 'Restored version 1', baseNumber: 4 });
    // Mira is told, with Owen's reason.
    await expect
      .poll(
        async () => {
          const res = await owen.request.get(`${suite.server.baseUrl}/api/dev/mail?to=mira@tidewater.test`);
          const mails = (await res.json()).data as Array<{ subject: string; text: string }>;
          return mails.find((m) => m.subject.startsWith('Your version is live again'))?.text ?? '';
        },
        { timeout: 30_000 },
      )
      .toMatch(/Owen Saltmarsh restored your version 1[\s\S]*Version 4 lost the warm-up caution/);
    expect((await documentOf(db(), slug)).publishedRevisionId).toBe(after[4].id);

    // A visitor reads version 5 with version 1's text, and sees in the line and the history what it is.
    const visitor = await visitorPage();
    const visitorErrors = watchPageErrors(visitor);
    await visitor.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await expect
      .poll(() => visitor.getByTestId('version-line').textContent())
      .toMatch(/^Version 5, published on .+ by Mira Quillon · restores version 1, brought back by Owen Saltmarsh$/);
    await visitor.getByText(v1Line).first().waitFor();
    const row5 = visitor
      .getByRole('region', { name: 'History' })
      .getByRole('row')
      .filter({ has: visitor.getByRole('rowheader', { name: 'Version 5' }) });
    await row5.getByText('Restores version 1').waitFor();
    await row5.getByText('Live').waitFor();
    expect(await visitor.getByRole('button', { name: /Restore version/ }).count()).toBe(0); // readers cannot restore
    await screenshot(visitor, 'guides-restored-v5');
    await visitor.setViewportSize(VIEWPORTS.phone);
    // On a phone the history is a list of versions, newest first, that fits the width.
    await expect.poll(() => visitor.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(VIEWPORTS.phone.width);
    const phoneHistory = visitor.getByRole('region', { name: 'History' });
    expect(await phoneHistory.getByRole('table').count()).toBe(0);
    const items = phoneHistory.getByRole('list', { name: 'Versions of this guide, newest first' }).getByRole('listitem');
    expect(await items.count()).toBe(5);
    await items.first().getByRole('link', { name: 'Version 5' }).waitFor();
    await items.first().getByText('Restores version 1').waitFor();
    await items.nth(4).getByRole('link', { name: 'Compare with live (version 1)' }).waitFor();
    const tallest = await items.evaluateAll((els) => Math.max(...els.map((e) => e.getBoundingClientRect().height)));
    await phoneHistory.screenshot({ path: screenshotPath('guides-history-phone') });
    expect(tallest).toBeLessThan(320); // no column squeezed into a tower (a long edit note wraps at full width)
    await screenshot(visitor, 'guides-restored-v4-phone');
    expect([...errors, ...visitorErrors]).toEqual([]);
  }, 120_000);

  it('a moderator hides a guide for abuse with a reason: readers get a clear "not available" page and search stops finding it; the moderator still sees it and shows it again', async () => {
    const slug = 'crawler-saltings-meadow-rock-garden';
    const title = 'Scale crawler on the Saltings Meadow rock garden';
    const reason = 'Reported: the body was replaced with advertising for a parts shop. Hidden until the author restores the text.';
    const visitor = await visitorPage();
    const visitorErrors = watchPageErrors(visitor);
    const searchFinds = async () => {
      await visitor.goto(`${suite.server.baseUrl}/search?q=${encodeURIComponent('crawler rock garden')}`);
      const results = visitor.getByRole('region', { name: /results for/i });
      await results.waitFor(); // "N results for …" or "No results for …"
      return results.getByRole('link', { name: title, exact: true }).count();
    };
    // Before: the visitor finds it.
    expect(await searchFinds()).toBeGreaterThan(0);

    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    const errors = watchPageErrors(owen);
    await owen.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await waitForApp(owen);
    await owen.getByRole('heading', { name: title, level: 1 }).waitFor();
    await owen.getByRole('button', { name: 'Hide guide' }).click();
    const dialog = owen.getByRole('dialog', { name: 'Hide this guide?' });
    await dialog.getByRole('button', { name: 'Hide guide' }).click();
    await dialog.getByText(/Say why the guide is hidden/).waitFor(); // a reason is required
    await dialog.getByLabel('Reason').fill(reason);
    await dialog.getByRole('button', { name: 'Hide guide' }).click();
    await owen.getByText('The guide is hidden from readers').waitFor();
    // The moderator still reads it, with the reason on top, and focus is on the way back.
    const notice = owen.getByRole('alert').filter({ hasText: 'Hidden from readers' });
    await notice.getByText(reason).waitFor();
    await owen.getByRole('heading', { name: title, level: 1 }).waitFor();
    await expect.poll(() => focusedText(owen)).toBe('Show it to readers again');
    expect(await owen.getByRole('button', { name: 'Hide guide' }).count()).toBe(0);
    await screenshot(owen, 'guides-hidden-moderator');
    expect(await seriousViolations(owen)).toBe('');
    const doc = await documentOf(db(), slug);
    expect(doc.hiddenAt).not.toBeNull();
    expect(doc.hiddenReason).toBe(reason);
    const [auditRow] = await db().query(`SELECT reason, to_value FROM audit_log WHERE subject_id = $1 AND action = 'document.hide'`, [doc.id]);
    expect(auditRow).toEqual({ reason, to_value: 'hidden' });

    // The visitor: a clear page instead of the guide, no reason shown, and nothing in the list or search.
    await visitor.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await visitor.getByRole('heading', { name: 'This guide is not available', level: 1 }).waitFor();
    await visitor.getByText(/taken it out of public view/).waitFor();
    expect(await visitor.getByText(reason).count()).toBe(0);
    expect(await visitor.getByText(/a few members have built a crawler course/).count()).toBe(0);
    await screenshot(visitor, 'guides-hidden-visitor');
    expect(await seriousViolations(visitor)).toBe('');
    await visitor.setViewportSize(VIEWPORTS.phone);
    await screenshot(visitor, 'guides-hidden-visitor-phone');
    await visitor.setViewportSize(VIEWPORTS.desktop);
    await visitor.getByRole('link', { name: 'Browse all guides' }).click();
    await visitor.getByRole('heading', { level: 1 }).first().waitFor();
    await visitor
      .getByRole('link', { name: /Stock 2WD buggy on Harbour Flats clay/ })
      .first()
      .waitFor();
    expect(await visitor.getByRole('link', { name: title }).count()).toBe(0);
    await expect.poll(searchFinds, { timeout: 20_000 }).toBe(0);

    // Shown again: readers and search have it back; the moderator's focus lands on "Hide guide".
    await owen.getByRole('button', { name: 'Show it to readers again' }).click();
    await owen.getByText('The guide is visible to readers again').waitFor();
    await expect.poll(() => focusedText(owen)).toBe('Hide guide');
    expect(await owen.getByRole('alert').filter({ hasText: 'Hidden from readers' }).count()).toBe(0);
    expect((await documentOf(db(), slug)).hiddenAt).toBeNull();
    await visitor.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await visitor.getByRole('heading', { name: title, level: 1 }).waitFor();
    await expect.poll(searchFinds, { timeout: 20_000 }).toBeGreaterThan(0);
    expect([...errors, ...visitorErrors]).toEqual([]);
  }, 120_000);
});
