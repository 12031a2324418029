import { describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS } from '../../server/db/demo-accounts';
import { screenshot, watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';
import { createClient } from '../setup/test-app';
import { confirmPublish, revisionsOf, signedInPage } from './guide-helpers';

const suite = browserSuite();

describe('two moderators in Chromium', () => {
  it('a proposal that makes the gearing over 5 % taller needs two moderators: the first approves, the second publishes, and the screen says why and who', async () => {
    const slug = 'mod-4wd-buggy-harbour-flats-clay';
    const title = 'Modified 4WD buggy on Harbour Flats clay, after the spring re-layout';
    // Jonah proposes two pinion teeth more on his guide's baseline (24 → 26: rollout about 8 % longer).
    const jonah = createClient(suite.server.t.app);
    const account = DEMO_ACCOUNTS.find((a) => a.key === 'jonah')!;
    expect((await jonah.post('/api/auth/sign-in', { email: account.email, password: account.password })).status).toBe(200);
    jonah.resetCsrf();
    const live = (await jonah.get(`/api/guides/${slug}/setup`)).body.data;
    const history = (await jonah.get(`/api/guides/${slug}/revisions`)).body.data as Array<{ id: string; state: string }>;
    const draft = await jonah.post(`/api/guides/${slug}/revisions`, { baseRevisionId: history.find((h) => h.state === 'published')!.id });
    expect(draft.status).toBe(201);
    const id = draft.body.data.revision.id as string;
    const { provenance: _provenance, ...record } = live;
    expect((await jonah.put(`/api/revisions/${id}/setup`, { ...record, gearing: { ...record.gearing, pinionTeeth: 26 } })).status).toBe(200);
    expect((await jonah.post(`/api/revisions/${id}/submit`, { note: 'Two more pinion teeth for the longer straight' })).status).toBe(200);

    const owen = await signedInPage(suite.browser, suite.server.baseUrl, 'owen', { width: 1366, height: 900 });
    const priya = await signedInPage(suite.browser, suite.server.baseUrl, 'priya', { width: 390, height: 844 });
    const errors = [owen, priya].map(watchPageErrors);

    await owen.goto(`${suite.server.baseUrl}/review/${id}`);
    await owen.getByRole('heading', { name: title, level: 1 }).waitFor();
    const why = owen.getByRole('note').filter({ hasText: 'Needs two moderators' });
    await why.getByText(/Makes the gearing 8\.3\d* % taller/).waitFor();
    await why.getByText('No approvals yet.').waitFor();
    await confirmPublish(owen, 'Approve (1 of 2)');
    await why.getByText(/^Approved by Owen Saltmarsh/).waitFor();
    expect(await owen.getByRole('button', { name: /Approve/ }).isDisabled()).toBe(true); // the same moderator twice is not two
    await screenshot(owen, 'review-two-moderators-first-1366');
    expect((await revisionsOf(suite.server.t.db.dataSource, slug)).find((r) => r.id === id)!.state).toBe('in_review');

    await priya.goto(`${suite.server.baseUrl}/review/${id}`);
    await priya.getByRole('heading', { name: title, level: 1 }).waitFor();
    await priya.getByText(/^Approved by Owen Saltmarsh/).waitFor();
    await screenshot(priya, 'review-two-moderators-second-390');
    await confirmPublish(priya, 'Approve and publish (2 of 2)');
    await priya.waitForURL(`${suite.server.baseUrl}/review`);
    const after = (await revisionsOf(suite.server.t.db.dataSource, slug)).find((r) => r.id === id)!;
    expect(after.state).toBe('published');
    expect(errors.flat()).toEqual([]);
  }, 120_000);
});
