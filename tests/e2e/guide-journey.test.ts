import { describe, expect, it } from 'vitest';
import { revealWorkedExamples, screenshot, waitForApp, watchPageErrors } from '../setup/browser';
import { confirmPublish, signedInPage, waitSaved } from './guide-helpers';
import { browserSuite } from '../setup/browser-suite';

const suite = browserSuite();

const TITLE = 'Stadium truck on Harbour Flats clay, summer layout';
const BODY_V1 = [
  '## The context',
  '',
  'The summer layout opens the back straight, so the truck wants a taller gear than the winter one.',
  '',
  '```worked-example',
  'calc: gearing',
  'spur: 87',
  'pinion: 30',
  'internalRatio: 2.6',
  'tyreDiameterMm: 70',
  '```',
  '',
  '## Brake',
  '',
  'Start with a light drag brake and add it in small steps.',
].join('\n');

describe('guide journey in Chromium: write, review, publish, read, edit, compare', () => {
  it('an expert writes and submits a guide, the moderator publishes it from the diff, a visitor reads it; an edit becomes version 2 and the visitor compares it with version 1', async () => {
    // The expert writes a new guide.
    const rosa = await signedInPage(suite.browser, suite.server.baseUrl, 'rosa');
    const rosaErrors = watchPageErrors(rosa);
    await rosa.goto(`${suite.server.baseUrl}/guides/new`);
    await rosa.getByLabel('Title', { exact: true }).fill(TITLE);
    await rosa.getByLabel('Summary').fill('A baseline for the open summer layout: taller gearing, a light drag brake and the heat checks between rounds.');
    await rosa.getByLabel('Class').selectOption('stadium-truck');
    await rosa.getByLabel('Surface').selectOption('clay');
    await rosa.getByLabel('Conditions').fill('Indoor clay, medium bite, open layout, 22–26 °C air');
    await rosa.getByLabel('Tags').fill('stadium, 13.5T, 2S');
    await rosa.getByLabel('Body').fill(BODY_V1);
    await waitSaved(rosa);
    expect(rosa.url()).toMatch(/\/guides\/new\?draft=[0-9a-f-]{36}$/);
    await screenshot(rosa, 'guides-editor-new');

    // A reload keeps everything (the server has the draft).
    await rosa.reload();
    await expect.poll(() => rosa.getByLabel('Title', { exact: true }).inputValue()).toBe(TITLE);

    await rosa.getByRole('button', { name: 'Submit for review' }).click();
    const dialog = rosa.getByRole('dialog', { name: 'Submit for review' });
    await dialog.getByRole('button', { name: 'Submit' }).click();
    await dialog.getByText(/write an edit note/i).waitFor(); // the note is required
    await dialog.getByLabel('Edit note').fill('First version for the summer layout.');
    await dialog.getByRole('button', { name: 'Submit' }).click();
    await rosa.waitForURL('**/me/revisions');
    const waiting = rosa.getByRole('region', { name: /Waiting for review/ });
    await waiting.getByText(TITLE).waitFor();
    await screenshot(rosa, 'guides-workbench');

    // The moderator sees it in the queue (with the count in the navigation) and publishes it.
    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    const owenErrors = watchPageErrors(owen);
    await owen.getByTestId('review-count').waitFor();
    await owen.goto(`${suite.server.baseUrl}/review`);
    await owen.getByRole('link', { name: TITLE }).click();
    await owen.getByRole('heading', { name: TITLE, level: 1 }).waitFor();
    await owen.getByRole('heading', { name: 'Changed text' }).waitFor();
    expect(await owen.locator('ins').count()).toBeGreaterThan(0); // a new guide: all of it is added
    await screenshot(owen, 'guides-review-new');
    await confirmPublish(owen);
    await owen.waitForURL(`${suite.server.baseUrl}/review`);

    // A visitor finds and reads it.
    const visitorContext = await suite.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const visitor = await visitorContext.newPage();
    const visitorErrors = watchPageErrors(visitor);
    await visitor.goto(`${suite.server.baseUrl}/guides?class=stadium-truck`);
    await visitor.getByRole('link', { name: TITLE }).click();
    await visitor.getByRole('heading', { name: TITLE, level: 1 }).waitFor();
    await expect.poll(() => visitor.getByTestId('version-line').textContent()).toMatch(/^Version 1, published on .+ by Rosa Kittering/);
    await visitor.getByText('Start with a light drag brake').waitFor();
    await revealWorkedExamples(visitor);
    await visitor.locator('[aria-label^="Worked example"]').first().waitFor();
    const slug = new URL(visitor.url()).pathname.split('/')[2];

    // The expert edits it after a re-layout: version 2.
    await rosa.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await rosa.getByRole('link', { name: 'Propose an edit' }).click();
    await rosa.waitForURL(`**/guides/${slug}/edit`);
    await expect.poll(() => rosa.getByLabel('Body').inputValue()).toContain('light drag brake');
    await rosa.getByLabel('Body').fill(BODY_V1.replace('Start with a light drag brake', 'After the re-layout, start with a firmer drag brake'));
    await waitSaved(rosa);
    expect(rosa.url()).toMatch(/\?draft=/);
    await rosa.getByRole('button', { name: 'Submit for review' }).click();
    await rosa.getByLabel('Edit note').fill('Re-layout: firmer drag brake into the new hairpin.');
    await rosa.getByRole('dialog').getByRole('button', { name: 'Submit' }).click();
    await rosa.waitForURL('**/me/revisions');

    await owen.goto(`${suite.server.baseUrl}/review`);
    await owen.getByRole('link', { name: TITLE }).click();
    await owen.getByText('Re-layout: firmer drag brake').waitFor();
    // The body change first as readers will see it: the changed paragraph drawn, removed and added.
    const rendered = owen.getByTestId('rendered-body-diff');
    await expect.poll(() => rendered.locator('[data-diff="added"]').allInnerTexts()).toEqual(expect.arrayContaining([expect.stringContaining('firmer')]));
    await expect.poll(() => rendered.locator('[data-diff="removed"]').allInnerTexts()).toEqual(expect.arrayContaining([expect.stringContaining('light')]));
    // Then word by word in the Markdown.
    await owen.getByRole('button', { name: 'Raw Markdown' }).click();
    await expect.poll(() => owen.locator('ins').allTextContents()).toEqual(expect.arrayContaining([expect.stringContaining('firmer')]));
    await expect.poll(() => owen.locator('del').allTextContents()).toEqual(expect.arrayContaining([expect.stringContaining('light')]));
    await owen.getByRole('button', { name: 'Side by side' }).click();
    await screenshot(owen, 'guides-review-edit');
    await confirmPublish(owen);
    await owen.waitForURL(`${suite.server.baseUrl}/review`);

    // The visitor reads version 2 and compares it with version 1.
    await visitor.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await waitForApp(visitor); // the Compare button answers once the app has taken the page over
    await expect.poll(() => visitor.getByTestId('version-line').textContent()).toMatch(/^Version 2, published on/);
    await visitor.getByText('After the re-layout, start with a firmer drag brake').waitFor();
    await screenshot(visitor, 'guides-guide-v2');
    await visitor.getByRole('button', { name: 'Compare' }).click();
    await visitor.waitForURL(`**/guides/${slug}/compare?from=1&to=2`);
    await visitor.getByRole('heading', { name: 'Changed text' }).waitFor();
    await expect.poll(() => visitor.locator('ins').allTextContents()).toEqual(expect.arrayContaining([expect.stringContaining('firmer')]));
    await screenshot(visitor, 'guides-compare-inline');
    await visitor.getByRole('button', { name: 'Side by side' }).click();
    await screenshot(visitor, 'guides-compare-side-by-side');
    // The permalink of version 1 still shows the old text.
    await visitor.goto(`${suite.server.baseUrl}/guides/${slug}/v/1`);
    await visitor.getByText('Start with a light drag brake').waitFor();
    await visitor.getByText(/not the live guide/).waitFor();

    // Phone width.
    await visitor.setViewportSize({ width: 375, height: 800 });
    await visitor.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await visitor.getByRole('heading', { name: TITLE, level: 1 }).waitFor();
    await screenshot(visitor, 'guides-guide-phone');
    await visitor.goto(`${suite.server.baseUrl}/guides/${slug}/compare?from=1&to=2`);
    await visitor.getByRole('heading', { name: 'Changed text' }).waitFor();
    await screenshot(visitor, 'guides-compare-phone');

    expect([...rosaErrors, ...owenErrors, ...visitorErrors]).toEqual([]);
  }, 180_000); // the whole author-to-reader journey, with two publish confirmations; like guide-merge and guide-returned
});
