import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';
import { createDraftGuide, createPublishedGuide, proposeEdit } from '../factories/guide';
import { uploadRun } from '../factories/run';

let t: TestApp;
let author: TestClient;
let other: TestClient;
let moderator: TestClient;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  author = (await signedInClient(t)).client;
  other = (await signedInClient(t)).client;
  moderator = (await signedInClient(t, 'moderator')).client;
});
afterAll(async () => {
  await t?.close();
});

const auditOf = async (id: string) =>
  (await t.db.dataSource.query(`SELECT action, from_value, meta FROM audit_log WHERE subject_id = $1 AND action = 'revision.discard'`, [id])) as Array<{
    action: string;
    from_value: string;
    meta: Record<string, unknown>;
  }>;

describe('DELETE /api/revisions/:id (discard a draft)', () => {
  it("discards a new guide's only draft, and the never-live guide goes with it", async () => {
    const title = `Discarded stock buggy notes ${Date.now()}`;
    const { slug, revision } = await createDraftGuide(author, { title });
    const res = await author.delete(`/api/revisions/${revision.id}`);
    expect(res.status, JSON.stringify(res.body)).toBe(204);
    expect((await author.get(`/api/revisions/${revision.id}`)).status).toBe(404);
    expect((await author.get(`/api/guides/${slug}/revisions`)).status).toBe(404);
    expect((await author.get('/api/me/revisions')).body.data.some((r: { id: string }) => r.id === revision.id)).toBe(false);
    expect(await auditOf(revision.id)).toEqual([
      expect.objectContaining({ from_value: 'draft', meta: expect.objectContaining({ documentRemoved: true, slug }) }),
    ]);
    // Its address is free again.
    expect((await createDraftGuide(author, { title })).slug).toBe(slug);
  });

  it('discards an edit of a live guide: the live version and the history stay, the run stays its owner’s', async () => {
    const { slug, revisionId: live } = await createPublishedGuide(author, moderator);
    const edit = await proposeEdit(author, slug, { summary: 'A change of mind about the punch, to be thrown away.' });
    const run = await uploadRun(author);
    expect((await author.put(`/api/revisions/${edit.id}/runs/${run}`)).status).toBe(200);
    expect((await author.delete(`/api/revisions/${edit.id}`)).status).toBe(204);
    const history = (await author.get(`/api/guides/${slug}/revisions`)).body.data as Array<{ id: string }>;
    expect(history.map((r) => r.id)).toEqual([live]);
    expect((await createClient(t.app).get(`/api/guides/${slug}`)).body.data.revision.id).toBe(live);
    expect((await author.get(`/api/runs/${run}`)).status).toBe(200);
    expect(await auditOf(edit.id)).toEqual([expect.objectContaining({ meta: expect.objectContaining({ documentRemoved: false }) })]);
  });

  it('discards a sent-back revision the author will not fix', async () => {
    const { revision } = await createDraftGuide(author);
    expect((await author.post(`/api/revisions/${revision.id}/submit`, { note: 'First go' })).status).toBe(200);
    expect((await moderator.post(`/api/reviews/${revision.id}/return`, { reason: 'Needs the tyre size in the gearing table' })).status).toBe(200);
    expect((await author.delete(`/api/revisions/${revision.id}`)).status).toBe(204);
    expect(await auditOf(revision.id)).toEqual([expect.objectContaining({ from_value: 'returned' })]);
  });

  it('409 for a submitted, a live and a superseded revision; nothing changes', async () => {
    const { slug, revisionId: first } = await createPublishedGuide(author, moderator);
    const waiting = await proposeEdit(author, slug, { summary: 'Waiting for a moderator, about the brake curve.' });
    expect((await author.post(`/api/revisions/${waiting.id}/submit`, { note: 'Brake curve' })).status).toBe(200);
    const inReview = await author.delete(`/api/revisions/${waiting.id}`);
    expect(inReview.status).toBe(409);
    expect(inReview.body.error.code).toBe('revision_in_review');
    expect((await moderator.post(`/api/reviews/${waiting.id}/publish`)).status).toBe(200);
    for (const id of [waiting.id, first]) {
      const res = await author.delete(`/api/revisions/${id}`);
      expect(res.status, id).toBe(409);
      expect(res.body.error.code).toBe('immutable_revision');
    }
    expect((await author.get(`/api/guides/${slug}/revisions`)).body.data).toHaveLength(2);
  });

  it('someone else’s draft: 404 for a member (as for an unused id), 403 for a moderator, 401 for a visitor', async () => {
    const { revision } = await createDraftGuide(author);
    const stranger = await other.delete(`/api/revisions/${revision.id}`);
    const unused = await other.delete('/api/revisions/00000000-0000-4000-8000-000000000000');
    expect(stranger.status).toBe(404);
    expect(stranger.body).toEqual(unused.body);
    const mod = await moderator.delete(`/api/revisions/${revision.id}`);
    expect(mod.status).toBe(403);
    expect(mod.body.error.code).toBe('not_own_revision');
    expect((await createClient(t.app).delete(`/api/revisions/${revision.id}`)).status).toBe(401);
    expect((await author.get(`/api/revisions/${revision.id}`)).body.data.revision.state).toBe('draft');
  });
});
