import { describe, expect, it } from 'vitest';
import { createClient } from '../setup/test-app';
import { screenshot, VIEWPORTS, waitForApp, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';
import { signedInPage } from './guide-helpers';
import { proposeEdit } from '../factories/guide';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';

const suite = browserSuite();
/** The phone width the issue asks the screenshots at. */
const PHONE = { width: 390, height: 844 };

/** Mail links carry the configured APP_URL; the test server listens elsewhere, so keep the path and query. */
const onTestServer = (link: string) => {
  const u = new URL(link);
  return `${suite.server.baseUrl}${u.pathname}${u.search}`;
};

async function apiAs(key: string) {
  const account = DEMO_ACCOUNTS.find((a) => a.key === key)!;
  const client = createClient(suite.server.t.app);
  expect((await client.post('/api/auth/sign-in', { email: account.email, password: account.password })).status).toBe(200);
  client.resetCsrf();
  return client;
}

describe('watching a guide in Chromium', () => {
  it('watch → someone else’s edit goes live → the mail in the catcher has a working diff link and a one-click unsubscribe', async () => {
    const slug = 'mod-touring-car-park-asphalt';
    const jonah = await signedInPage(suite.browser, suite.server.baseUrl, 'jonah');
    const errors = watchPageErrors(jonah);
    await jonah.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await waitForApp(jonah);
    const watch = jonah.getByRole('button', { name: 'Watch', exact: true });
    await watch.click();
    await jonah.getByRole('button', { name: 'Watching', pressed: true }).waitFor();

    // Rosa proposes an edit and Owen publishes it.
    const rosa = await apiAs('rosa');
    const draft = await proposeEdit(rosa, slug, { summary: 'Car-park asphalt in the cold: softer punch and a touch more drag brake for the first runs.' });
    expect((await rosa.post(`/api/revisions/${draft.id}/submit`, { note: 'Cold-morning start added to the summary' })).status).toBe(200);
    const owen = await apiAs('owen');
    expect((await owen.post(`/api/reviews/${draft.id}/publish`)).status).toBe(200);

    // The mail arrives in the catcher (the dev mail API), with the edit note and the links.
    type Mail = { subject: string; text: string; headers: Record<string, string> };
    let mail: Mail | undefined;
    await expect
      .poll(
        async () => {
          const res = await jonah.request.get(`${suite.server.baseUrl}/api/dev/mail?to=jonah@tidewater.test`);
          mail = ((await res.json()).data as Mail[]).find((m) => m.subject.startsWith('New version:'));
          return !!mail;
        },
        { timeout: 30_000 },
      )
      .toBe(true);
    expect(mail!.subject).toBe(`New version: Modified touring car on the Tidewater car park circuit (version ${draft.number})`);
    expect(mail!.text).toContain('Edit note: Cold-morning start added to the summary');
    expect(mail!.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');
    const diffLink = /See what changed: (\S+)/.exec(mail!.text)![1];
    const stopLink = /Stop mails about "[^"]+": (\S+)/.exec(mail!.text)![1];

    // The diff link opens the comparison of the two versions.
    await jonah.goto(onTestServer(diffLink));
    await waitForApp(jonah);
    await jonah.getByText('Car-park asphalt in the cold', { exact: false }).first().waitFor();
    expect(jonah.url()).toContain(`from=${draft.number - 1}&to=${draft.number}`);

    // The unsubscribe link works in a browser that is not signed in: one click, no second question.
    const visitor = await (await suite.browser.newContext({ viewport: PHONE })).newPage();
    await visitor.goto(onTestServer(stopLink));
    await visitor.getByRole('heading', { name: 'No more of these mails' }).waitFor();
    await screenshot(visitor, 'watch-unsubscribed-phone');
    await jonah.goto(`${suite.server.baseUrl}/guides/${slug}`);
    await waitForApp(jonah);
    await jonah.getByRole('button', { name: 'Watch', exact: true, pressed: false }).waitFor();
    expect(errors).toEqual([]);
  }, 120_000);

  it('the recent-changes page lists the change, filters by kind and class, and links the feed (390 and 1280 px)', async () => {
    for (const [name, viewport] of [
      ['1280', VIEWPORTS.desktop],
      ['390', PHONE],
    ] as const) {
      const page = await (await suite.browser.newContext({ viewport })).newPage();
      const errors = watchPageErrors(page);
      await page.goto(`${suite.server.baseUrl}/changes`);
      await page.getByRole('heading', { name: 'Recent changes', level: 1 }).waitFor();
      const list = page.getByRole('list', { name: 'Recent changes, newest first' });
      await list.getByRole('listitem').first().waitFor();
      expect(await list.getByRole('listitem').first().textContent()).toContain('Modified touring car on the Tidewater car park circuit');
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      expect(overflow, 'no sideways scrolling').toBeLessThanOrEqual(0);
      await screenshot(page, `changes-${name}`);
      await page.getByLabel('Kind').selectOption('parameter');
      await expect.poll(() => page.url()).toContain('kind=parameter');
      await page.getByLabel('Kind').selectOption('guide');
      await page.getByLabel('Class').selectOption('touring-mod');
      await expect.poll(async () => (await list.getByRole('listitem').allTextContents()).every((t) => t.includes('touring car, modified'))).toBe(true);
      const feed = await page.getByRole('link', { name: 'Atom feed of this list' }).getAttribute('href');
      expect(feed).toBe('/changes.atom?kind=guide&class=touring-mod');
      const res = await page.request.get(`${suite.server.baseUrl}${feed}`);
      expect(res.headers()['content-type']).toMatch(/^application\/atom\+xml/);
      expect(errors).toEqual([]);
    }
  }, 120_000);
});
