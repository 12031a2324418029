import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seed } from '../../../server/db/seed';
import { createDraftGuide, proposeEdit } from '../../factories/guide';
import { buildSetupRecord } from '../../factories/setup-record';
import { signedInClient } from '../../factories/user';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import type { SetupRecord } from '../../../shared/schemas/setup-record';
import { safetyRelevantChanges } from '../../../shared/content-checks/safety-changes';

let t: TestApp;
let author: TestClient; // a moderator writing their own guide: they never count as one of the two
let first: TestClient;
let second: TestClient;
let member: TestClient;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: false, bcryptCost: 4 });
  ({ client: author } = await signedInClient(t, 'moderator'));
  ({ client: first } = await signedInClient(t, 'moderator'));
  ({ client: second } = await signedInClient(t, 'moderator'));
  ({ client: member } = await signedInClient(t, 'member'));
});
afterAll(async () => {
  await t.close();
});

const baseline = buildSetupRecord();
const body = 'Drag brake 8 % for the hairpins. Low-voltage cutoff 3.2 V per cell on the stock settings.';

/** A live guide with the factory baseline, and a submitted proposal that changes its baseline to `proposed`. */
async function proposal(proposed: SetupRecord, proposedBody = body) {
  const { slug, revision } = await createDraftGuide(author, { body });
  expect((await author.put(`/api/revisions/${revision.id}/setup`, baseline)).status).toBe(200);
  expect((await author.post(`/api/revisions/${revision.id}/submit`, { note: 'First version' })).status).toBe(200);
  expect((await first.post(`/api/reviews/${revision.id}/publish`)).status).toBe(200); // nothing live before: one moderator
  const edit = await proposeEdit(author, slug, { body: proposedBody });
  expect((await author.put(`/api/revisions/${edit.id}/setup`, proposed)).status).toBe(200);
  const submitted = await author.post(`/api/revisions/${edit.id}/submit`, { note: 'Changed the baseline' });
  expect(submitted.status, JSON.stringify(submitted.body)).toBe(200);
  return { slug, id: edit.id };
}

const audit = async (id: string) =>
  (await t.db.dataSource.query(`SELECT action, actor_id FROM audit_log WHERE subject_id = $1 ORDER BY created_at, id`, [id])) as Array<{ action: string }>;

describe('safetyRelevantChanges', () => {
  it('names each rule: lower cutoff, thermal protection or current limit raised or removed, more timing, gearing over 5 % taller', () => {
    const withProtection = buildSetupRecord({
      escSettings: {
        ...baseline.escSettings,
        'thermal-protection': { value: 100, unit: '°C' },
        'current-limit': { value: 80, unit: 'A' },
        'static-timing': { value: 5, unit: 'deg' },
      },
    });
    const riskier = buildSetupRecord({
      escSettings: {
        'drag-brake': { value: 8, unit: '%' },
        'low-voltage-cutoff': { value: 3.0, unit: 'V' },
        'current-limit': { value: 120, unit: 'A' },
        'static-timing': { value: 10, unit: 'deg' },
      },
      gearing: { ...baseline.gearing, pinionTeeth: 34 }, // 32 → 34 teeth: rollout 6.25 % longer
    });
    expect(safetyRelevantChanges(withProtection, riskier).map((c) => c.rule)).toEqual([
      'lower-cutoff',
      'raise-thermal-protection',
      'raise-current-limit',
      'raise-timing',
      'taller-gearing',
    ]);
    // 32 → 33 teeth is 3.1 % taller: under the 5 % line. Safer changes never need two.
    expect(safetyRelevantChanges(baseline, buildSetupRecord({ gearing: { ...baseline.gearing, pinionTeeth: 33 } }))).toEqual([]);
    expect(safetyRelevantChanges(riskier, withProtection)).toEqual([]);
    expect(safetyRelevantChanges(null, riskier)).toEqual([]);
  });
});

describe('POST /api/reviews/:revisionId/publish (two moderators)', () => {
  it('one approval is not enough: 202, still in review, and why; a second, different moderator publishes', async () => {
    const lower = buildSetupRecord({ escSettings: { ...baseline.escSettings, 'low-voltage-cutoff': { value: 3.0, unit: 'V' } } });
    const { slug, id } = await proposal(lower, body.replace('3.2 V', '3.0 V'));
    const once = await first.post(`/api/reviews/${id}/publish`);
    expect(once.status).toBe(202);
    expect(once.body.data.revision.state).toBe('in_review');
    expect(once.body.data.approval).toMatchObject({
      needed: 2,
      rules: [{ rule: 'lower-cutoff', path: 'escSettings.low-voltage-cutoff' }],
      approvals: [{ moderator: { displayName: expect.any(String) } }],
    });
    expect(once.body.data.approval.rules[0].message).toMatch(/from 3\.2 to 3 V per cell/);
    expect((await createClient(t.app).get(`/api/guides/${slug}`)).body.data.guide.version).toBe(1);
    // The review screen shows the rule and who approved.
    const detail = (await second.get(`/api/reviews/${id}`).expect(200)).body.data;
    expect(detail.approval.approvals).toHaveLength(1);
    const published = await second.post(`/api/reviews/${id}/publish`);
    expect(published.status).toBe(200);
    expect(published.body.data.revision.state).toBe('published');
    expect((await createClient(t.app).get(`/api/guides/${slug}`)).body.data.guide.version).toBe(2);
    expect((await audit(id)).map((a) => a.action)).toEqual([
      'revision.create',
      // The baseline change goes through the revision commands: it has its own audit row.
      'revision.baseline',
      'revision.submit',
      'revision.approve',
      'revision.publish',
    ]);
  });

  it('the same moderator twice is not two (409), and the author never counts (403)', async () => {
    const taller = buildSetupRecord({ gearing: { ...baseline.gearing, pinionTeeth: 35 } });
    const { id } = await proposal(taller);
    expect((await first.post(`/api/reviews/${id}/publish`)).status).toBe(202);
    const again = await first.post(`/api/reviews/${id}/publish`);
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: 'already_approved', details: { rules: [{ rule: 'taller-gearing' }] } });
    const byAuthor = await author.post(`/api/reviews/${id}/publish`);
    expect(byAuthor.status).toBe(403);
    expect((await second.get(`/api/reviews/${id}`)).body.data.revision.state).toBe('in_review');
    expect((await second.post(`/api/reviews/${id}/publish`)).status).toBe(200);
  });

  it('an approval does not survive the proposal going back to its author', async () => {
    const hotter = buildSetupRecord({ escSettings: { ...baseline.escSettings, 'static-timing': { value: 10, unit: 'deg' } } });
    const { id } = await proposal(hotter);
    expect((await first.post(`/api/reviews/${id}/publish`)).status).toBe(202);
    expect((await author.post(`/api/revisions/${id}/withdraw`)).status).toBe(200);
    expect((await author.post(`/api/revisions/${id}/submit`, { note: 'Resubmitted' })).status).toBe(200);
    expect((await second.post(`/api/reviews/${id}/publish`)).status).toBe(202); // counts as the first again
    expect((await first.post(`/api/reviews/${id}/publish`)).status).toBe(200);
  });

  it('a change that touches no safety rule needs one moderator; members and visitors are refused', async () => {
    const calmer = buildSetupRecord({ escSettings: { ...baseline.escSettings, 'low-voltage-cutoff': { value: 3.4, unit: 'V' } } });
    const { id } = await proposal(calmer, body.replace('3.2 V', '3.4 V'));
    expect((await member.post(`/api/reviews/${id}/publish`)).status).toBe(403);
    expect((await createClient(t.app).post(`/api/reviews/${id}/publish`)).status).toBe(401);
    expect((await second.get(`/api/reviews/${id}`)).body.data.approval).toEqual({ needed: 1, rules: [], approvals: [] });
    expect((await second.post(`/api/reviews/${id}/publish`)).status).toBe(200);
  });
});
