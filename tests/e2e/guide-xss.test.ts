import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { createClient } from '../setup/test-app';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';
import { screenshot, waitForApp } from '../setup/browser';
import { confirmPublish, signedInPage } from './guide-helpers';
import { XSS_CORPUS, collectDialogs, readXssFlag, strictDomScan } from '../setup/xss';
import { browserSuite } from '../setup/browser-suite';

// The page runs with CSP bypassed, so the sanitizer is the only thing standing between the body and the page.
const CORPUS = XSS_CORPUS;

const BODY = `## Harmless heading\n\nOrdinary text before the corpus.\n\n${CORPUS.join('\n\n')}\n\nOrdinary text after the corpus.`;

const suite = browserSuite();
let slug: string;
let revisionId: string;

async function apiAs(key: string) {
  const a = DEMO_ACCOUNTS.find((d) => d.key === key)!;
  const client = createClient(suite.server.t.app);
  const res = await client.post('/api/auth/sign-in', { email: a.email, password: a.password });
  if (res.status !== 200) throw new Error(`sign-in ${key}: ${res.status}`);
  client.resetCsrf();
  return client;
}

beforeAll(async () => {
  const rosa = await apiAs('rosa');
  const created = await rosa.post('/api/guides', {
    title: 'Corpus check on Harbour Flats carpet',
    summary: 'A guide body made of hostile markup, to check that none of it runs.',
    class: 'touring-mod',
    surface: 'carpet',
    tags: ['test'],
    parameters: [],
    body: BODY,
  });
  expect(created.status).toBe(201);
  slug = created.body.data.guide.slug;
  revisionId = created.body.data.revision.id;
  // The image check refuses every image in the corpus (none is an image uploaded here) before any renderer meets it ...
  const refused = await rosa.post(`/api/revisions/${revisionId}/submit`, { note: 'Corpus for the sanitizer check.' });
  expect(refused.status).toBe(422);
  expect(refused.body.error.code).toBe('image_check_failed');
  expect(refused.body.error.details.length).toBeGreaterThan(0);
  expect(refused.body.error.details.every((d: { path: string }) => d.path === 'content.body')).toBe(true);
  // ... so, to test the renderers themselves (content written before that check, or a check that misses one),
  // the draft is put into review directly, as the submit command would have done.
  await suite.server.t.ctx.dataSource.query(`UPDATE revisions SET state = 'in_review', submitted_at = now() WHERE id = $1`, [revisionId]);
}, 60_000);

/** Loads a page with CSP bypassed, trips every event the corpus listens for, and reports what ran. */
async function probe(page: Page, path: string, ready: string, prepare?: () => Promise<void>) {
  const dialogs = collectDialogs(page);
  await page.goto(`${suite.server.baseUrl}${path}`);
  // Probe the page the app draws (the server-drawn one it replaces has had its chance by then too).
  await waitForApp(page);
  await page.getByText(ready).first().waitFor();
  if (prepare) await prepare();
  // The whole body as readers see it (the review page also draws each changed block on its own, above it).
  const body = page
    .locator('.prose-notebook')
    .filter({ hasText: 'Ordinary text before the corpus.' })
    .filter({ hasText: 'Ordinary text after the corpus.' })
    .first();
  await body.getByText('Ordinary text before the corpus.').waitFor();
  await body.getByText('Ordinary text after the corpus.').waitFor();
  // Every drawn copy of the corpus on the page is probed.
  const drawn = page.locator('.prose-notebook');
  // Give handlers a chance: hover and focus everything, click every link and button inside the body.
  for (const el of await drawn.locator('a, button, div, summary, input').all()) {
    await el.hover({ timeout: 500 }).catch(() => {});
    await el.focus({ timeout: 500 }).catch(() => {});
  }
  for (const a of await drawn.locator('a').all()) {
    const href = await a.getAttribute('href');
    if (href && !/^https?:/i.test(href)) await a.click({ timeout: 1000, noWaitAfter: true }).catch(() => {});
  }
  await page.waitForTimeout(300);
  const flag = await readXssFlag(page);
  const dom: unknown[] = [];
  for (const el of await drawn.all()) dom.push(...(await el.evaluate(strictDomScan)));
  return { flag, dialogs, dom, url: page.url() };
}

describe('XSS corpus through guide bodies, rendered in Chromium', () => {
  it('runs no script on the review page, where a moderator meets the proposal first', async () => {
    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen');
    const ctx = owen.context();
    const page = await ctx
      .browser()!
      .newContext({ bypassCSP: true, storageState: await ctx.storageState() })
      .then((c) => c.newPage());
    const result = await probe(page, `/review/${revisionId}`, 'Corpus check on Harbour Flats carpet', () =>
      page.getByText('Read the proposal as readers would see it').click(),
    );
    await screenshot(page, 'guides-xss-review');
    expect(result).toEqual({ flag: null, dialogs: [], dom: [], url: `${suite.server.baseUrl}/review/${revisionId}` });
    // Publish it so readers can reach it.
    await owen.goto(`${suite.server.baseUrl}/review/${revisionId}`);
    await confirmPublish(owen);
    await owen.waitForURL(`${suite.server.baseUrl}/review`);
  }, 90_000);

  it('runs no script on the public guide page, and the text around the corpus still reads', async () => {
    const context = await suite.browser.newContext({ bypassCSP: true });
    const page = await context.newPage();
    const result = await probe(page, `/guides/${slug}`, 'Corpus check on Harbour Flats carpet');
    await screenshot(page, 'guides-xss-corpus');
    expect(result).toEqual({ flag: null, dialogs: [], dom: [], url: `${suite.server.baseUrl}/guides/${slug}` });
    await page.getByRole('heading', { name: 'Harmless heading' }).waitFor();
    await context.close();
  }, 90_000);

  it('the probe itself notices a script that does run (so a pass above means something)', async () => {
    const context = await suite.browser.newContext({ bypassCSP: true });
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await page.locator('.prose-notebook').getByText('Ordinary text after the corpus.').waitFor();
    // Plant into the app's own page, not the server-drawn one the app replaces when it starts.
    await waitForApp(page);
    await page.evaluate(() => {
      const img = document.createElement('img');
      img.setAttribute('src', 'x');
      img.setAttribute('onerror', 'window.__xss = "planted"');
      document.querySelector('.prose-notebook')!.appendChild(img);
    });
    await page.waitForFunction(() => (window as unknown as { __xss?: string }).__xss === 'planted');
    const dom = await page.locator('.prose-notebook img[onerror]').count();
    expect(dom).toBe(1);
    await context.close();
  });
});
