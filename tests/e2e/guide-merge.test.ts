import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, VIEWPORTS, watchPageErrors } from '../setup/browser';
import { documentOf, editBody, openProposal, publishFromQueue, revisionsOf, seriousViolations, signedInPage, submitWithNote, waitSaved } from './guide-helpers';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

const db = () => suite.server.t.db.dataSource;

/** The one revision of `slug` written by `email` that is not published (the proposal under test). */
async function proposalBy(slug: string, email: string) {
  const mine = (await revisionsOf(db(), slug)).filter((r) => r.authorEmail === email && r.state !== 'published' && r.state !== 'archived');
  expect(mine).toHaveLength(1);
  return mine[0];
}

async function phoneShot(page: Page, name: string) {
  const size = page.viewportSize();
  await page.setViewportSize(VIEWPORTS.phone);
  await screenshot(page, name);
  if (size) await page.setViewportSize(size);
}

describe('conflict and merge in Chromium: two members edit the same live guide from the same base', () => {
  it('non-overlapping edits merge by themselves: the second author sees the merged text, saves it and submits; their text is a draft throughout', async () => {
    const slug = 'oval-pan-car-carpet';
    const title = '1/12 oval pan car on carpet, 13.5T on 1S';
    const liveBefore = await documentOf(db(), slug);

    const jonah = await signedInPage(suite.browser, suite.server.baseUrl, 'jonah');
    const calum = await signedInPage(suite.browser, suite.server.baseUrl, 'calum');
    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    const errors = [jonah, calum, owen].map(watchPageErrors);

    // Both open the same live version 1 and edit different paragraphs.
    await openProposal(jonah, suite.server.baseUrl, slug, 'Bring the ramp start down by 1,000 rpm');
    await openProposal(calum, suite.server.baseUrl, slug, 'Under 70 °C after an eight-minute run');
    const jonahLine = 'Bring the ramp start down 500 rpm at a time, and only then add endbell timing.';
    const calumLine = 'Under 65 °C after an eight-minute run is fine in the cold hall';
    await editBody(jonah, 'Bring the ramp start down by 1,000 rpm before adding endbell timing.', jonahLine);
    await editBody(calum, 'Under 70 °C after an eight-minute run is fine', calumLine);
    await waitSaved(jonah);
    await waitSaved(calum);
    const calumDraft = await proposalBy(slug, 'calum@tidewater.test');
    expect(calumDraft).toMatchObject({ state: 'draft', baseRevisionId: liveBefore.publishedRevisionId });
    expect(calumDraft.content.body).toContain(calumLine);

    // Jonah submits first and the moderator publishes him.
    await submitWithNote(jonah, 'Smaller ramp steps when the car is slow off the turns.');
    await jonah.waitForURL('**/me/revisions');
    await publishFromQueue(owen, suite.server.baseUrl, title);
    const liveAfter = await documentOf(db(), slug);
    expect(liveAfter.publishedRevisionId).not.toBe(liveBefore.publishedRevisionId);
    const jonahNumber = (await revisionsOf(db(), slug)).find((r) => r.id === liveAfter.publishedRevisionId)!.number;

    // Calum, whose page still shows version 1 as live, submits: the server answers stale_base and the merge screen opens.
    await submitWithNote(calum, 'Lower motor-temperature line for the cold winter hall.');
    await calum.getByText(`The live guide moved on to version ${jonahNumber} while you were writing`).waitFor({ timeout: 15_000 });
    await calum.getByText(/do not overlap, so they are merged/).waitFor();
    // Focus moved from the closed dialog to the top of the merge.
    await expect.poll(() => calum.evaluate(() => document.activeElement?.textContent)).toBe('Merge your draft with the live guide');
    // Nothing was lost or changed on the server by the refused submit.
    expect(await proposalBy(slug, 'calum@tidewater.test')).toMatchObject({
      id: calumDraft.id,
      state: 'draft',
      baseRevisionId: liveBefore.publishedRevisionId,
      content: expect.objectContaining({ body: calumDraft.content.body }),
    });

    // What comes in from the live version is shown as a diff: Jonah's line is new, the old one struck through.
    const incoming = calum.getByRole('region', { name: 'What the live version brings into your draft' });
    const marked = async (tag: 'ins' | 'del') => (await incoming.locator(tag).allTextContents()).join(' ');
    await expect.poll(() => marked('ins')).toMatch(/500.*rpm at a time.*only.*then/);
    expect(await marked('del')).toMatch(/before.*adding/);
    expect(await incoming.textContent()).not.toContain('Under 70 °C'); // his own edit is not "incoming"
    // The full merged text holds both edits.
    await calum.getByText('The merged text as it will be saved').click();
    const merged = calum.locator('details', { hasText: 'The merged text as it will be saved' }).locator('pre');
    await merged.waitFor();
    await expect.poll(() => merged.textContent()).toContain(jonahLine);
    expect(await merged.textContent()).toContain(calumLine);
    await screenshot(calum, 'guides-merge-clean');
    expect(await seriousViolations(calum)).toBe('');
    await phoneShot(calum, 'guides-merge-clean-phone');

    await calum.getByRole('button', { name: 'Save the merged draft' }).click();
    await calum.getByText('Merged and saved').waitFor();
    await expect.poll(() => calum.getByLabel('Body').inputValue()).toContain(jonahLine);
    expect(await calum.getByLabel('Body').inputValue()).toContain(calumLine);
    // The draft now sits on the new live version, so no "live version changed" warning is left.
    expect(await calum.getByText('The live version changed since you started').count()).toBe(0);
    const afterMerge = await proposalBy(slug, 'calum@tidewater.test');
    expect(afterMerge).toMatchObject({ id: calumDraft.id, state: 'draft', baseRevisionId: liveAfter.publishedRevisionId });
    expect(afterMerge.content.body).toContain(jonahLine);
    expect(afterMerge.content.body).toContain(calumLine);
    await screenshot(calum, 'guides-merge-clean-saved');

    // Submitting again goes through.
    await calum.getByRole('button', { name: 'Submit for review' }).click();
    const dialog = calum.getByRole('dialog', { name: 'Submit for review' });
    expect(await dialog.getByLabel('Edit note').inputValue()).toBe('Lower motor-temperature line for the cold winter hall.');
    await dialog.getByRole('button', { name: 'Submit' }).click();
    await calum.waitForURL('**/me/revisions');
    expect(await proposalBy(slug, 'calum@tidewater.test')).toMatchObject({
      id: calumDraft.id,
      state: 'in_review',
      baseRevisionId: liveAfter.publishedRevisionId,
    });

    expect(errors.flat()).toEqual([]);
  }, 180_000);
  it('overlapping edits are resolved by hand: live text for one passage, mine for another, a hand-edited one, and a detail changed on both sides', async () => {
    const slug = 'short-course-saltings-meadow-loose-dirt';
    const title = 'Short-course truck on Saltings Meadow loose dirt';
    const liveBefore = await documentOf(db(), slug);
    const jonah = await signedInPage(suite.browser, suite.server.baseUrl, 'jonah');
    const calum = await signedInPage(suite.browser, suite.server.baseUrl, 'calum', VIEWPORTS.phone);
    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    const errors = [jonah, calum, owen].map(watchPageErrors);

    const L1 = 'Raise punch a step and straighten the curve a little.';
    const L2 = 'Take drag brake to zero.';
    const L3 = 'Under about 71 °C (160 °F) after a race is comfortable';
    const J3 = 'Under about 65 °C (150 °F) after a race is comfortable';
    await openProposal(jonah, suite.server.baseUrl, slug, L1);
    await openProposal(calum, suite.server.baseUrl, slug, L1);
    for (const [from, to] of [
      [L1, 'Raise punch two steps and straighten the curve a little.'],
      [L2, 'Take drag brake to zero and soften the initial brake.'],
      [L3, J3],
    ])
      await editBody(jonah, from, to);
    await jonah.getByLabel('Summary').fill('A 2WD short-course baseline for the summer field track, tuned for the dusty afternoons.');
    for (const [from, to] of [
      [L1, 'Raise punch one step and leave the curve alone.'],
      [L2, 'Take drag brake to zero; keep brake strength at 60 %.'],
      [L3, 'Under about 75 °C (167 °F) after a race is comfortable'],
    ])
      await editBody(calum, from, to);
    const calumSummary = 'A 2WD short-course baseline for Saltings Meadow, written for the morning hardpack.';
    await calum.getByLabel('Summary').fill(calumSummary);
    await waitSaved(jonah);
    await waitSaved(calum);
    const calumDraft = await proposalBy(slug, 'calum@tidewater.test');
    expect(calumDraft).toMatchObject({ state: 'draft', baseRevisionId: liveBefore.publishedRevisionId });

    await submitWithNote(jonah, 'More punch in the morning, softer initial brake, cooler motor limit.');
    await jonah.waitForURL('**/me/revisions');
    await publishFromQueue(owen, suite.server.baseUrl, title);
    const liveAfter = await documentOf(db(), slug);

    await submitWithNote(calum, 'Morning punch and brake strength from this weekend’s runs.');
    await calum.getByRole('heading', { name: /Overlapping changes in the text \(3\)/ }).waitFor({ timeout: 15_000 });
    const save = calum.getByRole('button', { name: 'Save the merged draft' });
    expect(await save.isDisabled()).toBe(true);
    await calum.getByText('4 left to decide').waitFor();
    expect(await proposalBy(slug, 'calum@tidewater.test')).toMatchObject({
      state: 'draft',
      baseRevisionId: liveBefore.publishedRevisionId,
      content: expect.objectContaining({ body: calumDraft.content.body, summary: calumSummary }),
    });
    await screenshot(calum, 'guides-merge-conflicts-phone');

    // The summary: keep mine.
    await calum
      .getByRole('group', { name: 'Summary' })
      .getByRole('radio', { name: /Your draft/ })
      .check();
    // Passage 1: the live text; passage 2: mine; passage 3: combined by hand.
    await calum.getByRole('region', { name: 'Overlapping change 1', exact: true }).getByRole('button', { name: 'Keep the live text' }).click();
    await calum.getByRole('region', { name: 'Overlapping change 2', exact: true }).getByRole('button', { name: 'Keep my text' }).click();
    const third = calum.getByRole('region', { name: 'Overlapping change 3', exact: true });
    await third.getByRole('button', { name: /Edit by hand/ }).click();
    const combined = third.getByLabel('Your combined text');
    await expect.poll(() => combined.inputValue()).toContain('Under about 65 °C');
    // Keep the live line and fold both limits into it; the draft's second line goes.
    const liveLine = (await combined.inputValue()).split('\n')[0];
    expect(liveLine).toContain(J3);
    await combined.fill(liveLine.replace(J3, 'Under 75 °C after a race is fine on a cool morning, under 70 °C on a hot afternoon'));
    await expect.poll(() => save.isDisabled()).toBe(false);
    expect(await calum.getByText(/left to decide/).count()).toBe(0);
    await calum.setViewportSize(VIEWPORTS.desktop);
    await screenshot(calum, 'guides-merge-conflicts-resolved');
    expect(await seriousViolations(calum)).toBe('');

    await save.click();
    await calum.getByText('Merged and saved').waitFor();
    const body = await calum.getByLabel('Body').inputValue();
    expect(body).toContain('Raise punch two steps and straighten the curve a little.'); // live
    expect(body).toContain('Take drag brake to zero; keep brake strength at 60 %.'); // mine
    expect(body).toContain('fine on a cool morning, under 70 °C on a hot afternoon'); // by hand
    expect(body).not.toContain('Raise punch one step');
    expect(body).not.toContain('soften the initial brake');
    expect(await calum.getByLabel('Summary').inputValue()).toBe(calumSummary);
    const merged = await proposalBy(slug, 'calum@tidewater.test');
    expect(merged).toMatchObject({
      id: calumDraft.id,
      state: 'draft',
      baseRevisionId: liveAfter.publishedRevisionId,
      content: expect.objectContaining({ body, summary: calumSummary }),
    });

    await calum.getByRole('button', { name: 'Submit for review' }).click();
    await calum.getByRole('dialog', { name: 'Submit for review' }).getByRole('button', { name: 'Submit' }).click();
    await calum.waitForURL('**/me/revisions');
    expect(await proposalBy(slug, 'calum@tidewater.test')).toMatchObject({ id: calumDraft.id, state: 'in_review', content: expect.objectContaining({ body }) });
    expect(errors.flat()).toEqual([]);
  }, 180_000);
});
