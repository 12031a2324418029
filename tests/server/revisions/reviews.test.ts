import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { createDraftGuide, createPublishedGuide, proposeEdit } from '../../factories/guide';
import { seed } from '../../../server/db/seed';
import { readGuideDirs } from '../../../server/db/seed-content';
import { DEMO_ACCOUNTS } from '../../../server/db/demo-accounts';

let t: TestApp;
let owen: TestClient;
let priya: TestClient;
let member: TestClient;

async function signInDemo(key: string) {
  const account = DEMO_ACCOUNTS.find((a) => a.key === key)!;
  const client = createClient(t.app);
  const res = await client.post('/api/auth/sign-in', { email: account.email, password: account.password });
  expect(res.status).toBe(200);
  client.resetCsrf();
  return client;
}

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
  owen = await signInDemo('owen');
  priya = await signInDemo('priya');
  ({ client: member } = await signedInClient(t, 'member'));
});
afterAll(async () => {
  await t.close();
});

type Item = {
  revisionId: string;
  kind: string;
  slug: string;
  title: string;
  number: number;
  baseNumber: number | null;
  submittedAt: string;
  class: string | null;
  own: boolean;
  author: { displayName: string };
};

describe('GET /api/reviews', () => {
  it('lists the seeded proposals for the demo moderator, oldest first, with what the queue shows', async () => {
    const res = await owen.get('/api/reviews').expect(200);
    const items = res.body.data as Item[];
    const seededInReview = readGuideDirs().filter((g) => g.revisions.some((r) => r.state === 'in_review'));
    expect(items.length).toBe(seededInReview.length);
    expect(items.length).toBeGreaterThanOrEqual(2);
    const times = items.map((i) => Date.parse(i.submittedAt));
    expect([...times].sort((a, b) => a - b)).toEqual(times);
    expect(items.every((i) => !i.own)).toBe(true);
    expect(res.body.meta).toEqual({ total: items.length, reviewable: items.length });
    const stock = items.find((i) => i.slug === 'stock-2wd-buggy-harbour-flats-clay')!;
    expect(stock).toMatchObject({ kind: 'guide', class: 'buggy-2wd-stock', number: 4, baseNumber: 3, author: { displayName: 'Rosa Kittering' } });
    expect(stock.title).toMatch(/Stock 2WD buggy/);
  });

  it('filters by kind and class, and refuses members (403) and visitors (401)', async () => {
    const byClass = (await owen.get('/api/reviews?class=stadium-truck').expect(200)).body.data as Item[];
    expect(byClass.map((i) => i.slug)).toEqual(['stadium-truck-harbour-flats-clay']);
    expect((await owen.get('/api/reviews?kind=parameter').expect(200)).body.data).toEqual([]);
    expect((await owen.get('/api/reviews?kind=poem')).status).toBe(400);
    expect((await member.get('/api/reviews')).status).toBe(403);
    expect((await createClient(t.app).get('/api/reviews')).status).toBe(401);
  });
});

describe('GET /api/reviews/count', () => {
  it('counts what the moderator can review, leaving out their own proposals', async () => {
    const before = (await owen.get('/api/reviews/count').expect(200)).body.data.count as number;
    const { revision } = await createDraftGuide(priya, { title: 'Priya on short-course loose dirt' });
    await priya.post(`/api/revisions/${revision.id}/submit`, { note: 'New guide' });
    expect((await owen.get('/api/reviews/count')).body.data.count).toBe(before + 1);
    expect((await priya.get('/api/reviews/count')).body.data.count).toBe(before);
    const mine = ((await priya.get('/api/reviews')).body.data as Item[]).find((i) => i.revisionId === revision.id);
    expect(mine?.own).toBe(true);
    expect((await member.get('/api/reviews/count')).status).toBe(403);
  });
});

describe('GET /api/reviews/:revisionId', () => {
  it('shows a seeded proposal against the live revision with its diff', async () => {
    const items = (await owen.get('/api/reviews')).body.data as Item[];
    const stock = items.find((i) => i.slug === 'stock-2wd-buggy-harbour-flats-clay')!;
    const res = await owen.get(`/api/reviews/${stock.revisionId}`).expect(200);
    const d = res.body.data;
    expect(d.revision).toMatchObject({ id: stock.revisionId, state: 'in_review', number: 4 });
    expect(d.live).toMatchObject({ state: 'published', number: 3 });
    expect(d.bodyDiff.some((p: { added?: boolean }) => p.added)).toBe(true);
    expect(d.own).toBe(false);
    expect(d.stale).toBe(false);
    expect(Array.isArray(d.workedExamples)).toBe(true);
    expect(d.workedExamples.length).toBeGreaterThan(0);
  });

  it('runs the calculators on every worked example of the proposal: input problems and cautions', async () => {
    const { client: writer } = await signedInClient(t, 'member');
    const { slug } = await createPublishedGuide(writer, owen, { body: 'Version one.' });
    const body = [
      // The caution beside the example: without one the content checks refuse the submission (caution-near-example).
      'Check the motor after five minutes; past 82 °C, stop and let it cool.',
      '',
      '```worked-example',
      'calc: temperature',
      'value: 95',
      'unit: C',
      '```',
      '',
      '```worked-example',
      'calc: gearing',
      'spur: -3',
      'pinion: 34',
      'internalRatio: 2.6',
      'tyreDiameterMm: 62',
      '```',
      '',
      '```js',
      'not: an example',
      '```',
    ].join('\n');
    const edit = await proposeEdit(writer, slug, { body, class: 'buggy-2wd-mod' });
    await writer.post(`/api/revisions/${edit.id}/submit`, { note: 'Heat check and gearing' });
    const d = (await owen.get(`/api/reviews/${edit.id}`).expect(200)).body.data;
    expect(d.changedFields).toEqual([{ field: 'class', from: 'buggy-2wd-stock', to: 'buggy-2wd-mod' }]);
    expect(d.workedExamples).toHaveLength(2);
    expect(d.workedExamples[0]).toMatchObject({ index: 0, calc: 'temperature', ok: true });
    // 95 °C on a motor is past the "too hot" line of the temperature calculator's bands.
    expect(d.workedExamples[0].warnings).toContainEqual(expect.objectContaining({ level: 'danger', code: 'too-hot' }));
    expect(d.workedExamples[1]).toMatchObject({ index: 1, calc: 'gearing', ok: false, warnings: [] });
    expect(d.workedExamples[1].issues[0].path).toBe('spur');
  });

  it('is for moderators only; a draft is not a proposal (404)', async () => {
    const { revision } = await createDraftGuide(member);
    expect((await owen.get(`/api/reviews/${revision.id}`)).status).toBe(404);
    expect((await member.get(`/api/reviews/${revision.id}`)).status).toBe(403);
  });
});

describe('POST /api/reviews/:revisionId/publish (seeded)', () => {
  it('lets the demo moderator publish a seeded proposal; the guide page shows the new version', async () => {
    const items = (await owen.get('/api/reviews')).body.data as Item[];
    const truck = items.find((i) => i.slug === 'stadium-truck-harbour-flats-clay')!;
    const res = await owen.post(`/api/reviews/${truck.revisionId}/publish`);
    expect(res.status).toBe(200);
    const page = await createClient(t.app).get('/api/guides/stadium-truck-harbour-flats-clay').expect(200);
    expect(page.body.data.guide.version).toBe(truck.number);
    // Opened again after publishing (e.g. from the mail), the review page still shows what it changed.
    const decided = (await owen.get(`/api/reviews/${truck.revisionId}`).expect(200)).body.data;
    expect(decided.revision.state).toBe('published');
    expect(decided.bodyDiff.some((p: { removed?: boolean }) => p.removed)).toBe(true);
    expect(decided.bodyDiff.some((p: { added?: boolean }) => p.added)).toBe(true);
    // A brand-new guide (no live version yet) goes live with its first publish.
    const fresh = items.find((i) => i.baseNumber === null)!;
    expect((await createClient(t.app).get(`/api/guides/${fresh.slug}`)).status).toBe(404);
    expect((await owen.post(`/api/reviews/${fresh.revisionId}/publish`)).status).toBe(200);
    expect((await createClient(t.app).get(`/api/guides/${fresh.slug}`)).status).toBe(200);
  });
});
