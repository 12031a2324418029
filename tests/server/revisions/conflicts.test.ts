import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { createPublishedGuide, proposeEdit } from '../../factories/guide';

let t: TestApp;
let alice: TestClient;
let bram: TestClient;
let mod: TestClient;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  ({ client: alice } = await signedInClient(t, 'member'));
  ({ client: bram } = await signedInClient(t, 'member'));
  ({ client: mod } = await signedInClient(t, 'moderator'));
});
afterAll(async () => {
  await t.close();
});

const BASE_BODY = ['## Gearing', 'Spur 78, pinion 34.', '', '## Brake', 'Drag brake at 10 %.', '', '## Punch', 'Punch at level 3.'].join('\n');

/** A live guide plus two drafts started from the same live revision; the first one gets published. */
async function twoEditors(aliceBody: string, bramBody: string, extra: { alice?: Record<string, unknown>; bram?: Record<string, unknown> } = {}) {
  const { slug, revisionId: v1 } = await createPublishedGuide(alice, mod, { body: BASE_BODY, tags: ['stock'] });
  const a = await proposeEdit(alice, slug, { body: aliceBody, ...extra.alice });
  const b = await proposeEdit(bram, slug, { body: bramBody, ...extra.bram });
  await alice.post(`/api/revisions/${a.id}/submit`, { note: 'Alice edit' });
  expect((await mod.post(`/api/reviews/${a.id}/publish`)).status).toBe(200);
  return { slug, v1, a, b };
}

describe('POST /api/revisions/:id/submit (stale base)', () => {
  it('answers 409 stale_base with the current live revision, and keeps the draft untouched', async () => {
    const bramBody = BASE_BODY.replace('Punch at level 3.', 'Punch at level 2 for the slick morning.');
    const { b, a } = await twoEditors(BASE_BODY.replace('Spur 78', 'Spur 81'), bramBody);
    const res = await bram.post(`/api/revisions/${b.id}/submit`, { note: 'Less punch' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale_base');
    expect(res.body.error.details.current).toMatchObject({ id: a.id, state: 'published', number: a.number });
    const kept = await bram.get(`/api/revisions/${b.id}`);
    expect(kept.body.data.revision).toMatchObject({ state: 'draft', content: { body: bramBody } });
    expect(kept.body.data.document.publishedRevisionId).toBe(a.id);
    const mine = (await bram.get('/api/me/revisions')).body.data.find((r: { id: string }) => r.id === b.id);
    expect(mine.stale).toBe(true);
  });
});

describe('POST /api/reviews/:revisionId/publish (stale base)', () => {
  it('answers 409 stale_base when another proposal went live first', async () => {
    const { slug } = await createPublishedGuide(alice, mod, { body: BASE_BODY });
    const a = await proposeEdit(alice, slug, { body: BASE_BODY + '\nAlice line.' });
    const b = await proposeEdit(bram, slug, { body: BASE_BODY + '\nBram line.' });
    await alice.post(`/api/revisions/${a.id}/submit`, { note: 'Alice' });
    await bram.post(`/api/revisions/${b.id}/submit`, { note: 'Bram' });
    expect((await mod.post(`/api/reviews/${a.id}/publish`)).status).toBe(200);
    const res = await mod.post(`/api/reviews/${b.id}/publish`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale_base');
    expect(res.body.error.details.current.id).toBe(a.id);
    expect((await t.db.dataSource.query('SELECT state FROM revisions WHERE id = $1', [b.id]))[0].state).toBe('in_review');
    // And the queue marks it.
    const queued = (await mod.get('/api/reviews')).body.data.find((r: { revisionId: string }) => r.revisionId === b.id);
    expect(queued.stale).toBe(true);
  });
});

describe('POST /api/guides/:slug/revisions (stale base)', () => {
  it('refuses to start an edit from a revision that is no longer live', async () => {
    const { slug, v1, a } = await twoEditors(BASE_BODY + '\nA.', BASE_BODY + '\nB.');
    const res = await bram.post(`/api/guides/${slug}/revisions`, { baseRevisionId: v1 });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale_base');
    expect(res.body.error.details.current.id).toBe(a.id);
  });
});

describe('POST /api/revisions/:id/rebase', () => {
  it('merges non-overlapping changes automatically (body by lines, metadata by field)', async () => {
    const aliceBody = BASE_BODY.replace('Spur 78, pinion 34.', 'Spur 81, pinion 34.');
    const bramBody = BASE_BODY.replace('Punch at level 3.', 'Punch at level 2 for the slick morning.');
    const { b, a } = await twoEditors(aliceBody, bramBody, {
      alice: { tags: ['stock', 'spring'] },
      bram: { summary: 'A calmer baseline for slick mornings on the tight indoor layout.' },
    });
    const res = await bram.post(`/api/revisions/${b.id}/rebase`);
    expect(res.status).toBe(200);
    const data = res.body.data;
    expect(data.conflicts).toEqual([]);
    expect(data.currentRevisionId).toBe(a.id);
    expect(data.stale).toBe(true);
    expect(data.merged.body).toBe(
      BASE_BODY.replace('Spur 78, pinion 34.', 'Spur 81, pinion 34.').replace('Punch at level 3.', 'Punch at level 2 for the slick morning.'),
    );
    expect(data.merged.tags).toEqual(['stock', 'spring']);
    expect(data.merged.summary).toBe('A calmer baseline for slick mornings on the tight indoor layout.');
    // What the merge brings into Bram's draft: Alice's tags and her gearing words, nothing of his own.
    expect(data.incoming.changedFields).toEqual([{ field: 'tags', from: ['stock'], to: ['stock', 'spring'] }]);
    expect(data.incoming.bodyDiff.filter((w: { added?: boolean; removed?: boolean }) => w.added || w.removed)).toEqual([
      { value: '78', removed: true },
      { value: '81', added: true },
    ]);
    // Rebase changes nothing by itself.
    expect((await bram.get(`/api/revisions/${b.id}`)).body.data.revision.content.body).toBe(bramBody);

    // The client saves the merge and moves the base to the live revision; then submit works.
    const saved = await bram.patch(`/api/revisions/${b.id}`, { ...data.merged, baseRevisionId: data.currentRevisionId });
    expect(saved.status).toBe(200);
    expect(saved.body.data.revision.baseRevisionId).toBe(a.id);
    const submitted = await bram.post(`/api/revisions/${b.id}/submit`, { note: 'Less punch, merged with the new gearing' });
    expect(submitted.status).toBe(200);
    const audit = await t.db.dataSource.query(`SELECT from_value, to_value FROM audit_log WHERE subject_id = $1 AND action = 'revision.rebase'`, [b.id]);
    expect(audit).toEqual([{ from_value: b.baseRevisionId, to_value: a.id }]);
  });

  it('reports overlapping changes as conflicts (body hunk and metadata field), keeping our text in the merge', async () => {
    const aliceBody = BASE_BODY.replace('Drag brake at 10 %.', 'Drag brake at 5 %.');
    const bramBody = BASE_BODY.replace('Drag brake at 10 %.', 'Drag brake at 15 % for the hairpin.');
    const { b } = await twoEditors(aliceBody, bramBody, {
      alice: { title: 'Stock buggy, Harbour Flats spring layout' },
      bram: { title: 'Stock buggy, Harbour Flats with the new hairpin' },
    });
    const data = (await bram.post(`/api/revisions/${b.id}/rebase`)).body.data;
    expect(data.conflicts).toEqual([
      {
        field: 'title',
        base: expect.stringMatching(/^Stock buggy on Harbour Flats clay/),
        ours: 'Stock buggy, Harbour Flats with the new hairpin',
        theirs: 'Stock buggy, Harbour Flats spring layout',
      },
      { field: 'body', hunk: 0, base: 'Drag brake at 10 %.', ours: 'Drag brake at 15 % for the hairpin.', theirs: 'Drag brake at 5 %.' },
    ]);
    expect(data.merged.title).toBe('Stock buggy, Harbour Flats with the new hairpin');
    expect(data.merged.body).toBe(bramBody);
    const conflictRegion = data.bodyRegions.find((r: { kind: string }) => r.kind === 'conflict');
    expect(conflictRegion).toMatchObject({
      kind: 'conflict',
      hunk: 0,
      base: ['Drag brake at 10 %.'],
      ours: ['Drag brake at 15 % for the hairpin.'],
      theirs: ['Drag brake at 5 %.'],
    });
    expect(conflictRegion.words.filter((w: { added?: boolean; removed?: boolean }) => w.added || w.removed).map((w: { value: string }) => w.value)).toEqual([
      '5',
      '15',
      ' for the hairpin',
    ]);
    // Joining the regions with "theirs" chosen gives their body back.
    const theirs = data.bodyRegions.flatMap((r: { kind: string; lines?: string[]; theirs?: string[] }) => (r.kind === 'ok' ? r.lines! : r.theirs!)).join('\n');
    expect(theirs).toBe(aliceBody);
  });

  it('refuses another member’s draft and a base that is not the live revision on PATCH', async () => {
    const { b, v1 } = await twoEditors(BASE_BODY + '\nA.', BASE_BODY + '\nB.');
    expect((await alice.post(`/api/revisions/${b.id}/rebase`)).status).toBe(404);
    // Sending the draft's own (stale) base again is a no-op, so an autosave of the whole form never fails on it.
    const sameBase = await bram.patch(`/api/revisions/${b.id}`, { baseRevisionId: v1 });
    expect(sameBase.status).toBe(200);
    expect(sameBase.body.data.revision.baseRevisionId).toBe(v1);
    const other = await bram.patch(`/api/revisions/${b.id}`, { baseRevisionId: b.id });
    expect(other.status).toBe(409);
    expect(other.body.error.code).toBe('stale_base');
  });
});
