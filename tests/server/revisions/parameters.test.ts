import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { proposeEdit } from '../../factories/guide';
import { seedParameters } from '../../../server/db/seed-content';
import type { UserEntity } from '../../../server/modules/auth/user.entity';

let t: TestApp;
let member: TestClient;
let memberUser: UserEntity;
let mod: TestClient;
let visitor: TestClient;

beforeAll(async () => {
  t = await createTestApp();
  await seedParameters(t.db.dataSource);
  ({ client: member, user: memberUser } = await signedInClient(t, 'member'));
  ({ client: mod } = await signedInClient(t, 'moderator'));
  visitor = createClient(t.app);
});
afterAll(async () => {
  await t.close();
});

describe('POST /api/parameters/:slug/revisions', () => {
  it('walks a parameter edit through draft → review → live, with history, compare, mail and audit', async () => {
    const history = (await visitor.get('/api/parameters/drag-brake/revisions').expect(200)).body.data;
    expect(history.map((r: { number: number; state: string }) => [r.number, r.state])).toEqual([[1, 'published']]);

    const draft = await proposeEdit(member, 'drag-brake', { aliases: ['neutral brake', 'automatic brake', 'coast brake'] }, 'parameters');
    expect(draft).toMatchObject({ number: 2, state: 'draft', baseRevisionId: history[0].id });
    expect(draft.content.name).toBe('Drag brake');

    // Content is checked against the parameter schema, not the guide one.
    const bad = await member.patch(`/api/revisions/${draft.id}`, { range: { min: 10, max: 0, step: 1 }, class: 'oval' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['body.class', 'body.range.max']);
    expect(
      (
        await member.patch(`/api/revisions/${draft.id}`, {
          summary: 'Braking applied automatically at neutral throttle; more of it tightens corner entry but costs coasting speed.',
        })
      ).status,
    ).toBe(200);

    expect((await member.post(`/api/revisions/${draft.id}/submit`, { note: 'Add a common alias and tighten the summary' })).status).toBe(200);
    const queue = (await mod.get('/api/reviews?kind=parameter').expect(200)).body.data;
    expect(queue).toEqual([
      expect.objectContaining({ revisionId: draft.id, kind: 'parameter', slug: 'drag-brake', title: 'Drag brake', class: null, baseNumber: 1 }),
    ]);
    const review = (await mod.get(`/api/reviews/${draft.id}`).expect(200)).body.data;
    expect(review.changedFields.map((f: { field: string }) => f.field).sort()).toEqual(['aliases', 'summary']);

    expect((await member.post(`/api/reviews/${draft.id}/publish`)).status).toBe(403);
    expect((await mod.post(`/api/reviews/${draft.id}/publish`)).status).toBe(200);
    await t.waitForMail(memberUser.email, /now live: drag brake/i);

    const after = (await visitor.get('/api/parameters/drag-brake/revisions').expect(200)).body.data;
    expect(after.map((r: { number: number; state: string }) => [r.number, r.state])).toEqual([
      [2, 'published'],
      [1, 'archived'],
    ]);
    const v2 = (await visitor.get('/api/parameters/drag-brake/revisions/2').expect(200)).body.data.revision;
    expect(v2.content.aliases).toContain('coast brake');
    const cmp = (await visitor.get('/api/parameters/drag-brake/compare?from=1&to=2').expect(200)).body.data;
    expect(cmp.changedFields.map((f: { field: string }) => f.field).sort()).toEqual(['aliases', 'summary']);
    const audit = await t.db.dataSource.query(`SELECT action, from_value, to_value FROM audit_log WHERE subject_id = $1 ORDER BY created_at, id`, [draft.id]);
    expect(audit.map((r: { action: string }) => r.action)).toEqual(['revision.create', 'revision.submit', 'revision.publish']);
  });

  it('answers 401 to visitors and 404 for an unknown parameter', async () => {
    const history = (await visitor.get('/api/parameters/rollout/revisions').expect(200)).body.data;
    expect((await visitor.post('/api/parameters/rollout/revisions', { baseRevisionId: history[0].id })).status).toBe(401);
    expect((await member.post('/api/parameters/no-such-setting/revisions', { baseRevisionId: history[0].id })).status).toBe(404);
  });
});

describe('POST /api/parameters/:slug/restore, /hide and /unhide', () => {
  it('restores an older version of a parameter and hides it from readers', async () => {
    const draft = await proposeEdit(member, 'soft-start', { summary: 'A changed summary that the moderator will later roll back again.' }, 'parameters');
    await member.post(`/api/revisions/${draft.id}/submit`, { note: 'Summary change' });
    await mod.post(`/api/reviews/${draft.id}/publish`);
    const restored = await mod.post('/api/parameters/soft-start/restore', {
      number: 1,
      reason: 'The newer summary dropped the caution',
      note: 'The earlier summary was clearer',
    });
    expect(restored.status).toBe(201);
    expect(restored.body.data.revision).toMatchObject({ number: 3, restoredFromNumber: 1, note: 'The earlier summary was clearer', state: 'published' });

    expect((await mod.post('/api/parameters/soft-start/hide', { reason: 'Vandalised entry under investigation' })).status).toBe(200);
    expect((await visitor.get('/api/parameters/soft-start/revisions')).status).toBe(404);
    expect((await mod.get('/api/parameters/soft-start/revisions')).status).toBe(200);
    expect((await mod.post('/api/parameters/soft-start/unhide', {})).status).toBe(200);
    expect((await visitor.get('/api/parameters/soft-start/revisions')).status).toBe(200);
  });
});
