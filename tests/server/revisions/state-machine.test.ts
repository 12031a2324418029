import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { createDraftGuide, createPublishedGuide, guideInput, proposeEdit } from '../../factories/guide';
import type { UserEntity } from '../../../server/modules/auth/user.entity';
import { buildSetupRecord } from '../../factories/setup-record';

let t: TestApp;
let author: TestClient;
let authorUser: UserEntity;
let other: TestClient;
let mod: TestClient;
let modUser: UserEntity;
let mod2: TestClient;
let visitor: TestClient;

beforeAll(async () => {
  t = await createTestApp();
  ({ client: author, user: authorUser } = await signedInClient(t, 'member'));
  ({ client: other } = await signedInClient(t, 'member'));
  ({ client: mod, user: modUser } = await signedInClient(t, 'moderator'));
  ({ client: mod2 } = await signedInClient(t, 'moderator'));
  visitor = createClient(t.app);
});
afterAll(async () => {
  await t.close();
});

type AuditRow = {
  actor_id: string | null;
  action: string;
  from_value: string | null;
  to_value: string | null;
  reason: string | null;
  meta: Record<string, unknown>;
};
const auditFor = (subjectId: string): Promise<AuditRow[]> =>
  t.db.dataSource.query('SELECT actor_id, action, from_value, to_value, reason, meta FROM audit_log WHERE subject_id = $1 ORDER BY created_at, id', [
    subjectId,
  ]);
const stateOf = async (id: string) => (await t.db.dataSource.query('SELECT state FROM revisions WHERE id = $1', [id]))[0]?.state as string;

describe('POST /api/revisions/:id/submit', () => {
  it('moves the author’s draft to in_review with the note, and writes an audit row', async () => {
    const { revision } = await createDraftGuide(author);
    const res = await author.post(`/api/revisions/${revision.id}/submit`, { note: 'First write-up of the clay baseline' });
    expect(res.status).toBe(200);
    expect(res.body.data.revision).toMatchObject({ state: 'in_review', note: 'First write-up of the clay baseline' });
    expect(res.body.data.revision.submittedAt).toEqual(expect.any(String));
    const rows = await auditFor(revision.id);
    expect(rows.map((r) => [r.action, r.from_value, r.to_value, r.actor_id])).toEqual([
      ['revision.create', null, 'draft', authorUser.id],
      ['revision.submit', 'draft', 'in_review', authorUser.id],
    ]);
  });

  it('requires an edit note (400) and leaves the draft as it was', async () => {
    const { revision } = await createDraftGuide(author);
    const res = await author.post(`/api/revisions/${revision.id}/submit`, { note: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('body.note');
    expect(await stateOf(revision.id)).toBe('draft');
  });

  it("refuses someone else's draft: 404 for another member, 403 not_own_revision for a moderator", async () => {
    const { revision } = await createDraftGuide(author);
    const byMember = await other.post(`/api/revisions/${revision.id}/submit`, { note: 'Not mine to send' });
    expect(byMember.status).toBe(404);
    const byModerator = await mod.post(`/api/revisions/${revision.id}/submit`, { note: 'Not mine to send' });
    expect(byModerator.status).toBe(403);
    expect(byModerator.body.error.code).toBe('not_own_revision');
    expect(await stateOf(revision.id)).toBe('draft');
  });

  it('refuses a revision that is already waiting (409 invalid_transition)', async () => {
    const { revision } = await createDraftGuide(author);
    await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready for a look' });
    const again = await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready for a look' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('invalid_transition');
  });

  it('answers 401 to visitors', async () => {
    const { revision } = await createDraftGuide(author);
    const res = await visitor.post(`/api/revisions/${revision.id}/submit`, { note: 'Anonymous' });
    expect(res.status).toBe(401);
  });
});

describe('POST /api/revisions/:id/withdraw', () => {
  it('moves a proposal back to draft for its author, with an audit row', async () => {
    const { revision } = await createDraftGuide(author);
    await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready' });
    const res = await author.post(`/api/revisions/${revision.id}/withdraw`);
    expect(res.status).toBe(200);
    expect(res.body.data.revision).toMatchObject({ state: 'draft', submittedAt: null });
    const last = (await auditFor(revision.id)).at(-1)!;
    expect([last.action, last.from_value, last.to_value, last.actor_id]).toEqual(['revision.withdraw', 'in_review', 'draft', authorUser.id]);
  });

  it('refuses anyone but the author, and a draft that is not waiting', async () => {
    const { revision } = await createDraftGuide(author);
    expect((await author.post(`/api/revisions/${revision.id}/withdraw`)).body.error.code).toBe('invalid_transition');
    await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready' });
    expect((await other.post(`/api/revisions/${revision.id}/withdraw`)).status).toBe(404);
    const byMod = await mod.post(`/api/revisions/${revision.id}/withdraw`);
    expect(byMod.status).toBe(403);
    expect(byMod.body.error.code).toBe('not_own_revision');
    expect((await visitor.post(`/api/revisions/${revision.id}/withdraw`)).status).toBe(401);
    expect(await stateOf(revision.id)).toBe('in_review');
  });
});

describe('PATCH /api/revisions/:id', () => {
  it('autosaves only the fields sent and keeps the others', async () => {
    const { revision } = await createDraftGuide(author, { tags: ['stock', '2S'] });
    const res = await author.patch(`/api/revisions/${revision.id}`, { body: 'A new body, saved while typing.', note: 'Working note' });
    expect(res.status).toBe(200);
    expect(res.body.data.revision.content).toMatchObject({ body: 'A new body, saved while typing.', tags: ['stock', '2S'] });
    expect(res.body.data.revision.note).toBe('Working note');
    expect(res.body.data.revision.state).toBe('draft');
  });

  it('names bad and unknown fields (400) and stores nothing', async () => {
    const { revision } = await createDraftGuide(author);
    const res = await author.patch(`/api/revisions/${revision.id}`, { class: 'monster-truck', titel: 'typo', body: 'lost?' });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path).sort();
    expect(paths).toEqual(['body.class', 'body.titel']);
    const saved = await author.get(`/api/revisions/${revision.id}`);
    expect(saved.body.data.revision.content.body).not.toBe('lost?');
  });

  it('refuses edits to a published or archived revision (409 immutable_revision) and to one in review', async () => {
    const { slug, revisionId } = await createPublishedGuide(author, mod);
    const published = await author.patch(`/api/revisions/${revisionId}`, { body: 'Sneaky change to the live text' });
    expect(published.status).toBe(409);
    expect(published.body.error.code).toBe('immutable_revision');

    const edit = await proposeEdit(author, slug, { body: 'Second version' });
    await author.post(`/api/revisions/${edit.id}/submit`, { note: 'Second version' });
    const inReview = await author.patch(`/api/revisions/${edit.id}`, { body: 'Changed while waiting' });
    expect(inReview.status).toBe(409);
    expect(inReview.body.error.code).toBe('revision_in_review');
    await mod.post(`/api/reviews/${edit.id}/publish`);
    expect(await stateOf(revisionId)).toBe('archived');
    const archived = await author.patch(`/api/revisions/${revisionId}`, { body: 'Rewriting history' });
    expect(archived.status).toBe(409);
    expect(archived.body.error.code).toBe('immutable_revision');
  });

  it("refuses another member's draft (404) and visitors (401)", async () => {
    const { revision } = await createDraftGuide(author);
    expect((await other.patch(`/api/revisions/${revision.id}`, { body: 'x' })).status).toBe(404);
    expect((await visitor.patch(`/api/revisions/${revision.id}`, { body: 'x' })).status).toBe(401);
  });
});

describe('POST /api/reviews/:revisionId/publish', () => {
  it('publishes, archives the previous live revision, moves the pointer, and audits both', async () => {
    const { slug, revisionId: v1 } = await createPublishedGuide(author, mod);
    const edit = await proposeEdit(other, slug, { summary: 'A calmer baseline after the spring re-layout of the track.' });
    await other.post(`/api/revisions/${edit.id}/submit`, { note: 'Re-layout' });
    const res = await mod.post(`/api/reviews/${edit.id}/publish`);
    expect(res.status).toBe(200);
    expect(res.body.data.revision).toMatchObject({ state: 'published', number: 2, baseNumber: 1, reviewedBy: { id: modUser.id } });
    expect(await stateOf(v1)).toBe('archived');
    const live = await visitor.get(`/api/guides/${slug}`);
    expect(live.body.data.guide).toMatchObject({ version: 2, summary: 'A calmer baseline after the spring re-layout of the track.' });
    expect(live.body.data.revision.id).toBe(edit.id);
    const pub = (await auditFor(edit.id)).at(-1)!;
    expect([pub.action, pub.from_value, pub.to_value, pub.actor_id]).toEqual(['revision.publish', 'in_review', 'published', modUser.id]);
    const arch = (await auditFor(v1)).at(-1)!;
    expect([arch.action, arch.from_value, arch.to_value, arch.actor_id]).toEqual(['revision.archive', 'published', 'archived', modUser.id]);
  });

  it('refuses members (403), visitors (401), the author as moderator (403 own_revision) and a draft (409)', async () => {
    const { client: writingMod } = await signedInClient(t, 'moderator');
    const { revision } = await createDraftGuide(writingMod);
    expect((await writingMod.post(`/api/reviews/${revision.id}/publish`)).body.error.code).toBe('own_revision');
    expect((await mod.post(`/api/reviews/${revision.id}/publish`)).body.error.code).toBe('invalid_transition');
    await writingMod.post(`/api/revisions/${revision.id}/submit`, { note: 'Moderator writing a guide' });
    const own = await writingMod.post(`/api/reviews/${revision.id}/publish`);
    expect(own.status).toBe(403);
    expect(own.body.error.code).toBe('own_revision');
    const member = await author.post(`/api/reviews/${revision.id}/publish`);
    expect(member.status).toBe(403);
    expect((await visitor.post(`/api/reviews/${revision.id}/publish`)).status).toBe(401);
    expect(await stateOf(revision.id)).toBe('in_review');
    // Another moderator may.
    expect((await mod2.post(`/api/reviews/${revision.id}/publish`)).status).toBe(200);
  });
});

describe('POST /api/reviews/:revisionId/return', () => {
  it('requires a reason (400), then returns with it; the author edits and resubmits the returned revision', async () => {
    const { revision } = await createDraftGuide(author);
    await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready' });
    const noReason = await mod.post(`/api/reviews/${revision.id}/return`, {});
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.details[0].path).toBe('body.reason');
    expect((await mod.post(`/api/reviews/${revision.id}/return`, { reason: '   ' })).status).toBe(400);
    expect(await stateOf(revision.id)).toBe('in_review');

    const res = await mod.post(`/api/reviews/${revision.id}/return`, { reason: 'Add the pinion you ran, and a heat check after five minutes.' });
    expect(res.status).toBe(200);
    expect(res.body.data.revision).toMatchObject({ state: 'returned', reason: 'Add the pinion you ran, and a heat check after five minutes.' });
    const row = (await auditFor(revision.id)).at(-1)!;
    expect([row.action, row.from_value, row.to_value, row.reason, row.actor_id]).toEqual([
      'revision.return',
      'in_review',
      'returned',
      'Add the pinion you ran, and a heat check after five minutes.',
      modUser.id,
    ]);

    // The author sees the reason on their revision.
    const seen = await author.get(`/api/revisions/${revision.id}`);
    expect(seen.body.data.revision.reason).toMatch(/pinion/);
    // Returned is editable by its author: the first change makes it a draft again (audited), the reason stays with it.
    expect((await other.patch(`/api/revisions/${revision.id}`, { body: 'x' })).status).toBe(404);
    const fixed = await author.patch(`/api/revisions/${revision.id}`, { body: 'Now with the 34-tooth pinion and a heat check.' });
    expect(fixed.status).toBe(200);
    expect(fixed.body.data.revision).toMatchObject({ state: 'draft', reason: 'Add the pinion you ran, and a heat check after five minutes.' });
    const reopened = (await auditFor(revision.id)).at(-1)!;
    expect([reopened.action, reopened.from_value, reopened.to_value, reopened.actor_id]).toEqual(['revision.reopen', 'returned', 'draft', authorUser.id]);
    const again = await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Added pinion and heat check' });
    expect(again.status).toBe(200);
    expect(again.body.data.revision).toMatchObject({ state: 'in_review', reason: null });
    const resubmit = (await auditFor(revision.id)).at(-1)!;
    expect([resubmit.action, resubmit.from_value, resubmit.to_value]).toEqual(['revision.submit', 'draft', 'in_review']);
  });

  it("lets the author change a sent-back revision's baseline (PUT and DELETE …/setup), reopening it as a draft", async () => {
    for (const method of ['put', 'delete'] as const) {
      const { revision } = await createDraftGuide(author);
      // This file's database has no parameter library, so the baseline carries no ESC settings.
      expect((await author.put(`/api/revisions/${revision.id}/setup`, buildSetupRecord({ escSettings: {} }))).status).toBe(200);
      await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready' });
      expect((await mod.post(`/api/reviews/${revision.id}/return`, { reason: 'The baseline still runs the old pinion.' })).status).toBe(200);
      const res =
        method === 'put'
          ? await author.put(
              `/api/revisions/${revision.id}/setup`,
              buildSetupRecord({ escSettings: {}, gearing: { spurTeeth: 84, pinionTeeth: 30, internalRatio: 2.6, tyreDiameterMm: 62 } }),
            )
          : await author.delete(`/api/revisions/${revision.id}/setup`);
      expect(res.status, `${method}: ${JSON.stringify(res.body)}`).toBe(method === 'put' ? 200 : 204);
      expect(await stateOf(revision.id)).toBe('draft');
      // One transaction writes both rows (same created_at): the reopening and the baseline change itself.
      const rows = (await auditFor(revision.id)).slice(-2);
      const row = rows.find((r) => r.action === 'revision.reopen')!;
      expect([row?.action, row?.from_value, row?.to_value]).toEqual(['revision.reopen', 'returned', 'draft']);
      expect(rows.map((r) => r.action)).toContain(method === 'put' ? 'revision.baseline' : 'revision.baseline_removed');
      const stored = (await t.db.dataSource.query('SELECT setup FROM revisions WHERE id = $1', [revision.id]))[0].setup;
      if (method === 'put') expect(stored.gearing.pinionTeeth).toBe(30);
      else expect(stored).toBeNull();
      // And it goes back to review from there.
      expect((await author.post(`/api/revisions/${revision.id}/submit`, { note: 'Baseline fixed' })).status).toBe(200);
      expect(await stateOf(revision.id)).toBe('in_review');
    }
  });

  it('refuses members and own revisions', async () => {
    const { client: writingMod } = await signedInClient(t, 'moderator');
    const { revision } = await createDraftGuide(writingMod);
    await writingMod.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready' });
    expect((await writingMod.post(`/api/reviews/${revision.id}/return`, { reason: 'My own, returning it' })).body.error.code).toBe('own_revision');
    expect((await author.post(`/api/reviews/${revision.id}/return`, { reason: 'Member trying' })).status).toBe(403);
    expect(await stateOf(revision.id)).toBe('in_review');
  });
});

describe('POST /api/guides/:slug/restore', () => {
  const why = 'The new layout dropped the clay notes';
  it('creates a new live revision copying an older one, noting which, and archives the current', async () => {
    const { slug, revisionId: v1 } = await createPublishedGuide(author, mod, { body: 'Original body from the first layout.' });
    // The version that gets superseded is someone else's, so the credit is seen to follow the restored text.
    const edit = await proposeEdit(other, slug, { body: 'Body for the new layout.' });
    await other.post(`/api/revisions/${edit.id}/submit`, { note: 'New layout' });
    await mod.post(`/api/reviews/${edit.id}/publish`);

    expect((await author.post(`/api/guides/${slug}/restore`, { number: 1, reason: why })).status).toBe(403);
    expect((await mod.post(`/api/guides/${slug}/restore`, { number: 2, reason: why })).body.error.code).toBe('already_live');
    expect((await mod.post(`/api/guides/${slug}/restore`, { number: 99, reason: why })).status).toBe(404);
    // A restore needs a reason: none, or one too short to say anything, is refused and changes nothing.
    for (const body of [{ number: 1 }, { number: 1, reason: '   short ' }]) {
      const refused = await mod.post(`/api/guides/${slug}/restore`, body);
      expect(refused.status).toBe(400);
      expect(refused.body.error.details.map((d: { path: string }) => d.path)).toEqual(['body.reason']);
    }
    expect(await stateOf(edit.id)).toBe('published');

    const res = await mod.post(`/api/guides/${slug}/restore`, { number: 1, reason: why });
    expect(res.status).toBe(201);
    expect(res.body.data.revision).toMatchObject({ number: 3, state: 'published', restoredFromNumber: 1, note: 'Restored version 1', baseNumber: 2 });
    expect(res.body.data.revision.content.body).toBe('Original body from the first layout.');
    // Credited to whoever wrote version 1; the moderator who brought it back is its reviewer.
    expect(res.body.data.revision.author).toEqual({ id: authorUser.id, displayName: authorUser.displayName });
    expect(res.body.data.revision.reviewedBy).toEqual({ id: modUser.id, displayName: modUser.displayName });
    expect(await stateOf(edit.id)).toBe('archived');
    expect(await stateOf(v1)).toBe('archived');
    const live = await visitor.get(`/api/guides/${slug}`);
    expect(live.body.data.guide.version).toBe(3);
    expect(live.body.data.revision.content.body).toBe('Original body from the first layout.');
    const history = (await visitor.get(`/api/guides/${slug}/revisions`)).body.data as Array<{ number: number; author: { id: string }; restoredBy: unknown }>;
    expect(history.find((h) => h.number === 3)).toMatchObject({
      author: { id: authorUser.id },
      restoredBy: { id: modUser.id, displayName: modUser.displayName },
    });
    expect(history.find((h) => h.number === 2)?.restoredBy).toBeNull();
    const row = (await auditFor(res.body.data.revision.id))[0];
    expect([row.action, row.to_value, row.actor_id, row.reason, row.meta.restoredFromNumber, row.meta.authorId]).toEqual([
      'revision.restore',
      'published',
      modUser.id,
      why,
      1,
      authorUser.id,
    ]);
    // The author of version 1 is told, with the reason and who restored it.
    const mail = await t.waitForMail(authorUser.email, /live again/);
    expect(mail.text).toContain(`${modUser.displayName} restored your version 1`);
    expect(mail.text).toContain(why);
    expect(mail.text).toContain(`/guides/${slug}/v/3`);
  });
});

describe('GET /api/revisions/:id', () => {
  it('shows a draft to its author and moderators only', async () => {
    const { revision } = await createDraftGuide(author);
    const mine = await author.get(`/api/revisions/${revision.id}`);
    expect(mine.status).toBe(200);
    expect(mine.body.data.revision).toMatchObject({ id: revision.id, state: 'draft', reason: null });
    expect(mine.body.data.document).toMatchObject({ kind: 'guide', publishedRevisionId: null, hidden: false });
    expect((await mod.get(`/api/revisions/${revision.id}`)).status).toBe(200);
    expect((await other.get(`/api/revisions/${revision.id}`)).status).toBe(404);
    expect((await visitor.get(`/api/revisions/${revision.id}`)).status).toBe(401);
    expect((await author.get('/api/revisions/not-a-uuid')).status).toBe(400);
  });
});

describe('GET /api/me/revisions', () => {
  it("lists the member's own drafts and proposals with their states, and nobody else's", async () => {
    const { client: writer } = await signedInClient(t, 'member');
    const a = await createDraftGuide(writer, { title: 'Touring car on carpet, zero timing notes' });
    const b = await createDraftGuide(writer);
    await writer.post(`/api/revisions/${b.revision.id}/submit`, { note: 'Ready' });
    await createDraftGuide(other);
    const res = await writer.get('/api/me/revisions');
    expect(res.status).toBe(200);
    const rows = res.body.data as Array<{ id: string; state: string; title: string; stale: boolean }>;
    expect(rows.map((r) => r.id).sort()).toEqual([a.revision.id, b.revision.id].sort());
    expect(rows.find((r) => r.id === a.revision.id)).toMatchObject({ state: 'draft', title: 'Touring car on carpet, zero timing notes', stale: false });
    expect(rows.find((r) => r.id === b.revision.id)?.state).toBe('in_review');
    expect((await writer.get('/api/me/revisions?state=draft')).body.data).toHaveLength(1);
    expect((await visitor.get('/api/me/revisions')).status).toBe(401);
  });
});

describe('POST /api/guides/:slug/revisions', () => {
  it('starts a draft based on the live revision, copying fields not sent', async () => {
    const { slug, revisionId } = await createPublishedGuide(author, mod, guideInput({ tags: ['stock', 'tight'] }));
    const res = await other.post(`/api/guides/${slug}/revisions`, { baseRevisionId: revisionId, title: 'Stock buggy, tight layout, second take' });
    expect(res.status).toBe(201);
    expect(res.body.data.revision).toMatchObject({ state: 'draft', number: 2, baseRevisionId: revisionId, baseNumber: 1 });
    expect(res.body.data.revision.content).toMatchObject({ title: 'Stock buggy, tight layout, second take', tags: ['stock', 'tight'] });
    expect((await visitor.post(`/api/guides/${slug}/revisions`, { baseRevisionId: revisionId })).status).toBe(401);
    expect((await other.post(`/api/guides/no-such-guide/revisions`, { baseRevisionId: revisionId })).status).toBe(404);
  });

  it('refuses an edit of a guide that has no live version yet: 409 to its author, and to anyone else the answer an unused slug gets', async () => {
    const { slug, revision } = await createDraftGuide(author);
    const own = await author.post(`/api/guides/${slug}/revisions`, { baseRevisionId: revision.id });
    expect(own.status).toBe(409);
    expect(own.body.error.code).toBe('no_published_revision');
    const stranger = await other.post(`/api/guides/${slug}/revisions`, { baseRevisionId: revision.id });
    const unused = await other.post(`/api/guides/never-used-slug-${Date.now()}/revisions`, { baseRevisionId: revision.id });
    expect(stranger.status).toBe(404);
    expect(stranger.body).toEqual(unused.body);
  });
});
