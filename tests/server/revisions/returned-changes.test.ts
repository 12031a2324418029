import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { createDraftGuide, createPublishedGuide, proposeEdit } from '../../factories/guide';

let t: TestApp;
let author: TestClient;
let moderator: TestClient;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  author = (await signedInClient(t)).client;
  moderator = (await signedInClient(t, 'moderator')).client;
});
afterAll(async () => {
  await t?.close();
});

async function sentBack(reason = 'Name the tyres the afternoon numbers were run on') {
  const { slug, revision } = await createDraftGuide(author);
  expect((await author.post(`/api/revisions/${revision.id}/submit`, { note: 'First go' })).status).toBe(200);
  expect((await moderator.post(`/api/reviews/${revision.id}/return`, { reason })).status).toBe(200);
  return { slug, id: revision.id, reason };
}

describe('a proposal sent back and submitted again: the review shows what changed since', () => {
  it('lists the changed fields and body words since the return, with the reason', async () => {
    const { id, reason } = await sentBack();
    const detail = (await moderator.get(`/api/reviews/${id}`)).body.data;
    expect(detail.sinceReturn).toBeNull(); // returned, not waiting: nothing to compare yet
    expect(
      (await author.patch(`/api/revisions/${id}`, { summary: 'A calm baseline for the tight indoor layout, run on worn pin tyres in the afternoon.' })).status,
    ).toBe(200);
    const body = (await author.get(`/api/revisions/${id}`)).body.data.revision.content.body as string;
    expect((await author.patch(`/api/revisions/${id}`, { body: `${body}\n\nAfternoon numbers on worn pin tyres.` })).status).toBe(200);
    expect((await author.post(`/api/revisions/${id}/submit`, { note: 'Tyres named' })).status).toBe(200);

    const again = (await moderator.get(`/api/reviews/${id}`)).body.data;
    expect(again.sinceReturn).toMatchObject({ reason, changed: true, setupChanged: false });
    expect(again.sinceReturn.changedFields.map((f: { field: string }) => f.field)).toEqual(['summary']);
    const added = again.sinceReturn.bodyDiff
      .filter((p: { added?: boolean }) => p.added)
      .map((p: { value: string }) => p.value)
      .join('');
    expect(added).toContain('worn pin tyres');
    expect(new Date(again.sinceReturn.returnedAt).getTime()).toBeLessThanOrEqual(Date.now());
  });

  it('says nothing changed when the author resubmits as it was', async () => {
    const { id } = await sentBack('Check the gearing table once more');
    expect((await author.post(`/api/revisions/${id}/submit`, { note: 'Checked, it stands' })).status).toBe(200);
    const detail = (await moderator.get(`/api/reviews/${id}`)).body.data;
    expect(detail.sinceReturn).toMatchObject({ changed: false, changedFields: [], bodyDiff: [], setupChanged: false });
  });
});

describe('drafts hold a title alone; submitting asks for the rest', () => {
  it('a new guide starts from a title; the summary, class and surface may wait; submit names what is missing', async () => {
    const res = await author.post('/api/guides', { title: 'Sta' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const id = res.body.data.revision.id as string;
    expect(res.body.data.revision.content).toMatchObject({ title: 'Sta', summary: '', class: '', surface: '' });
    const submit = await author.post(`/api/revisions/${id}/submit`, { note: 'Too early' });
    expect(submit.status).toBe(400);
    expect(submit.body.error.details.map((d: { path: string }) => d.path)).toEqual(
      expect.arrayContaining(['content.title', 'content.summary', 'content.class', 'content.surface']),
    );
    // An empty title, an unknown class, and the length limits still hold while drafting.
    expect((await author.post('/api/guides', { title: '   ' })).body.error.details[0].path).toBe('body.title');
    expect((await author.patch(`/api/revisions/${id}`, { class: 'monster-truck' })).status).toBe(400);
    const long = await author.patch(`/api/revisions/${id}`, { title: 'x'.repeat(141) });
    expect(long.status).toBe(400);
    expect(long.body.error.details[0]).toEqual({ path: 'body.title', message: 'Keep the title to 140 characters' });
  });

  it('a never-live guide’s address follows its title as it grows; a live one keeps its address', async () => {
    const res = await author.post('/api/guides', { title: 'Stock' });
    const id = res.body.data.revision.id as string;
    expect(res.body.data.guide.slug).toMatch(/^stock(-\d+)?$/);
    const unique = `Stock buggy ${Date.now()}`;
    const renamed = await author.patch(`/api/revisions/${id}`, { title: unique });
    expect(renamed.status).toBe(200);
    expect(renamed.body.data.revision.slug).toBe(unique.toLowerCase().replace(/ /g, '-'));
    // A second guide with the same title gets the next free address.
    const twin = await createDraftGuide(author, { title: 'Stock' });
    const second = await author.patch(`/api/revisions/${twin.revision.id}`, { title: unique });
    expect(second.body.data.revision.slug).toBe(`${renamed.body.data.revision.slug}-2`);
    // Once live, links to it exist: a retitled edit keeps the address.
    const { slug } = await createPublishedGuide(author, moderator);
    const edit = await proposeEdit(author, slug);
    const retitled = await author.patch(`/api/revisions/${edit.id}`, { title: `A new title altogether ${Date.now()}` });
    expect(retitled.status).toBe(200);
    expect(retitled.body.data.revision.slug).toBe(slug);
  });
});
