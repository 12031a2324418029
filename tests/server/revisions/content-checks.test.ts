import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seed } from '../../../server/db/seed';
import { createDraftGuide } from '../../factories/guide';
import { buildSetupRecord } from '../../factories/setup-record';
import { signedInClient } from '../../factories/user';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';

let t: TestApp;
let author: TestClient;
let other: TestClient;
let moderator: TestClient;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: false, bcryptCost: 4 });
  ({ client: author } = await signedInClient(t, 'member'));
  ({ client: other } = await signedInClient(t, 'member'));
  ({ client: moderator } = await signedInClient(t, 'moderator'));
});
afterAll(async () => {
  await t.close();
});

const gearingExample = ['```worked-example', 'calc: gearing', 'spur: 84', 'pinion: 34', 'internalRatio: 2.6', 'tyreDiameterMm: 62', '```'].join('\n');
/** A body whose text gives drag brake 4 % against the baseline's 8 % (an error) and whose example uses another pinion (a warning). */
const contradicting = `Drag brake 4 % for the hairpins.\n\nThe taller option:\n\n${gearingExample}\n`;
const warningOnly = `Drag brake 8 % for the hairpins.\n\nThe taller option, for a longer straight:\n\n${gearingExample}\n`;

async function draftWithBaseline(body: string) {
  const { revision } = await createDraftGuide(author, { body });
  const put = await author.put(`/api/revisions/${revision.id}/setup`, buildSetupRecord());
  expect(put.status, JSON.stringify(put.body)).toBe(200);
  return revision.id;
}

describe('GET /api/revisions/:id (content checks)', () => {
  it('carries the checks of the draft and its baseline: rule, severity, message, path', async () => {
    const id = await draftWithBaseline(contradicting);
    const res = await author.get(`/api/revisions/${id}`).expect(200);
    expect(res.body.data.checks).toEqual([
      expect.objectContaining({ rule: 'stated-value-matches-baseline', severity: 'error', path: 'escSettings.drag-brake' }),
      expect.objectContaining({ rule: 'example-matches-baseline', severity: 'warning', path: 'examples[0].pinion' }),
    ]);
    for (const c of res.body.data.checks) expect(Object.keys(c).sort()).toEqual(['message', 'path', 'rule', 'severity']);
  });

  it('answers 401 to visitors and 404 to another member, as for any draft', async () => {
    const id = await draftWithBaseline(contradicting);
    expect((await createClient(t.app).get(`/api/revisions/${id}`)).status).toBe(401);
    expect((await other.get(`/api/revisions/${id}`)).status).toBe(404);
  });
});

describe('PATCH /api/revisions/:id (content checks)', () => {
  it('runs the checks on every save and returns them', async () => {
    const id = await draftWithBaseline(contradicting);
    const fixed = await author.patch(`/api/revisions/${id}`, { body: warningOnly });
    expect(fixed.status).toBe(200);
    expect(fixed.body.data.checks.map((c: { severity: string }) => c.severity)).toEqual(['warning']);
    const broken = await author.patch(`/api/revisions/${id}`, { body: contradicting });
    expect(broken.body.data.checks[0]).toMatchObject({ severity: 'error', path: 'escSettings.drag-brake' });
  });
});

describe('POST /api/revisions/:id/submit (content checks)', () => {
  it('refuses a draft with errors with 422 listing them, and leaves it a draft', async () => {
    const id = await draftWithBaseline(contradicting);
    const res = await author.post(`/api/revisions/${id}/submit`, { note: 'Ready for review' });
    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({
      code: 'content_check_failed',
      details: [expect.objectContaining({ rule: 'stated-value-matches-baseline', severity: 'error', path: 'escSettings.drag-brake' })],
    });
    expect(res.body.error.message).toMatch(/drag brake as 4 %/);
    expect((await author.get(`/api/revisions/${id}`)).body.data.revision.state).toBe('draft');
  });

  it('lets a draft with warnings only go to review, and the review detail carries the same checks', async () => {
    const id = await draftWithBaseline(warningOnly);
    expect((await author.post(`/api/revisions/${id}/submit`, { note: 'Ready for review' })).status).toBe(200);
    const detail = await moderator.get(`/api/reviews/${id}`).expect(200);
    expect(detail.body.data.checks).toEqual([expect.objectContaining({ rule: 'example-matches-baseline', severity: 'warning', path: 'examples[0].pinion' })]);
  });
});
