import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { createDraftGuide, createPublishedGuide, proposeEdit } from '../../factories/guide';
import { CLASSES, SURFACES } from '../../../shared/constants';

let t: TestApp;
let author: TestClient;
let mod: TestClient;
let visitor: TestClient;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  ({ client: author } = await signedInClient(t, 'member'));
  ({ client: mod } = await signedInClient(t, 'moderator'));
  visitor = createClient(t.app);
});
afterAll(async () => {
  await t.close();
});

describe('GET /api/taxonomy', () => {
  it('lists every class and surface by slug and name', async () => {
    const res = await visitor.get('/api/taxonomy').expect(200);
    expect(res.body.data.classes).toHaveLength(CLASSES.length);
    expect(res.body.data.classes).toContainEqual({ slug: 'buggy-2wd-stock', name: '1/10 2WD buggy, stock' });
    expect(res.body.data.surfaces.map((s: { slug: string }) => s.slug)).toEqual(SURFACES.map((s) => s.slug));
  });
});

describe('POST /api/guides', () => {
  it('creates revision 1 as a draft with a kebab-case slug from the title, unique per guide', async () => {
    const title = 'Crawler on the Saltings rock garden: slow & steady';
    const first = await author.post('/api/guides', {
      title,
      summary: 'Low speed control for the rock garden section.',
      class: 'crawler',
      surface: 'loose-dirt',
      tags: [],
      parameters: ['drag-brake'],
      body: '## Start',
    });
    expect(first.status).toBe(201);
    expect(first.body.data.guide).toEqual({ slug: 'crawler-on-the-saltings-rock-garden-slow-steady' });
    expect(first.body.data.revision).toMatchObject({ number: 1, state: 'draft', baseRevisionId: null, content: { conditions: '', title } });
    const second = await author.post('/api/guides', {
      title,
      summary: 'Same title, another author take.',
      class: 'crawler',
      surface: 'loose-dirt',
      tags: [],
      parameters: [],
      body: '',
    });
    expect(second.body.data.guide.slug).toBe('crawler-on-the-saltings-rock-garden-slow-steady-2');
  });

  it('names every bad field (400) and creates nothing', async () => {
    const before = Number((await t.db.dataSource.query('SELECT count(*) n FROM documents'))[0].n);
    // A draft needs only a title (#16); the length limits and the lists of classes and surfaces still hold.
    const res = await author.post('/api/guides', {
      title: '  ',
      summary: 'x'.repeat(501),
      class: 'monster',
      surface: 'ice',
      tags: 'x',
      parameters: ['Not A Slug'],
      body: 1,
    });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path).sort();
    expect(paths).toEqual(['body.body', 'body.class', 'body.parameters.0', 'body.summary', 'body.surface', 'body.tags', 'body.title']);
    expect(Number((await t.db.dataSource.query('SELECT count(*) n FROM documents'))[0].n)).toBe(before);
  });

  it('answers 401 to visitors', async () => {
    expect((await visitor.post('/api/guides', { title: 'Visitor guide title' })).status).toBe(401);
  });
});

describe('GET /api/guides', () => {
  it('lists live guides only, filtered by class, surface, parameter and q', async () => {
    const a = await createPublishedGuide(author, mod, {
      title: 'Oval pan car on carpet, long straights',
      class: 'oval',
      surface: 'carpet',
      parameters: ['ramped-advance'],
      summary: 'Gearing and timing for the long straights of the oval.',
    });
    const b = await createPublishedGuide(author, mod, {
      title: 'Drag car on car park asphalt',
      class: 'drag',
      surface: 'asphalt',
      parameters: ['throttle-punch', 'current-limit'],
      summary: 'Launch control for a short asphalt strip.',
      tags: ['launch', '17.5T'],
    });
    const draft = await createDraftGuide(author, { title: 'Drag car draft never published', class: 'drag', surface: 'asphalt' });

    const all = await visitor.get('/api/guides').expect(200);
    const slugs = all.body.data.map((g: { slug: string }) => g.slug);
    expect(slugs).toEqual(expect.arrayContaining([a.slug, b.slug]));
    expect(slugs).not.toContain(draft.slug);
    expect(all.body.meta.total).toBe(all.body.data.length);
    expect(all.body.data.find((g: { slug: string }) => g.slug === b.slug)).toMatchObject({
      title: 'Drag car on car park asphalt',
      class: 'drag',
      surface: 'asphalt',
      version: 1,
    });

    const bySlugs = async (qs: string) => (await visitor.get(`/api/guides?${qs}`).expect(200)).body.data.map((g: { slug: string }) => g.slug);
    expect(await bySlugs('class=oval')).toEqual([a.slug]);
    expect(await bySlugs('surface=asphalt')).toEqual([b.slug]);
    expect(await bySlugs('parameter=current-limit')).toEqual([b.slug]);
    expect(await bySlugs('q=LONG%20STRAIGHTS')).toEqual([a.slug]);
    expect(await bySlugs('q=short%20asphalt')).toEqual([b.slug]);
    expect(await bySlugs('q=100%25')).toEqual([]);
    // A tag matches as written on the guide, whole (not a part of another tag, not another case).
    expect(await bySlugs('tag=17.5T')).toEqual([b.slug]);
    expect(await bySlugs('tag=17.5')).toEqual([]);
    expect(await bySlugs('tag=LAUNCH')).toEqual([]);
    // The unfiltered first page is kept between changes; a tag filter must not be answered from it.
    expect((await bySlugs('')).length).toBeGreaterThan(1);
    expect(await bySlugs('tag=launch')).toEqual([b.slug]);
    expect((await visitor.get('/api/guides?class=monster')).status).toBe(400);
  });
});

describe('GET /api/guides/:slug', () => {
  it('returns the guide record and its live revision; a draft-only guide is 404', async () => {
    const { slug, revisionId } = await createPublishedGuide(author, mod, { title: 'Stadium truck, spring layout', class: 'stadium-truck', tags: ['17.5T'] });
    const res = await visitor.get(`/api/guides/${slug}`).expect(200);
    expect(res.body.data.guide).toMatchObject({
      slug,
      title: 'Stadium truck, spring layout',
      class: 'stadium-truck',
      surface: 'clay',
      tags: ['17.5T'],
      version: 1,
      hidden: false,
      publishedRevisionId: revisionId,
    });
    expect(res.body.data.guide.publishedAt).toEqual(expect.any(String));
    expect(res.body.data.revision).toMatchObject({ id: revisionId, state: 'published', number: 1 });
    const draft = await createDraftGuide(author);
    expect((await visitor.get(`/api/guides/${draft.slug}`)).status).toBe(404);
    expect((await visitor.get('/api/guides/no-such-guide')).status).toBe(404);
  });

  it('serves the new version right after a publish (the reading cache is dropped)', async () => {
    const { slug } = await createPublishedGuide(author, mod, { summary: 'The first summary of this guide, version one.' });
    // Read twice so the first version is cached.
    await visitor.get(`/api/guides/${slug}`).expect(200);
    expect((await visitor.get(`/api/guides/${slug}`)).body.data.guide.summary).toBe('The first summary of this guide, version one.');
    const edit = await proposeEdit(author, slug, { summary: 'The second summary of this guide, version two.' });
    await author.post(`/api/revisions/${edit.id}/submit`, { note: 'New summary' });
    await mod.post(`/api/reviews/${edit.id}/publish`);
    const after = await visitor.get(`/api/guides/${slug}`).expect(200);
    expect(after.body.data.guide).toMatchObject({ version: 2, summary: 'The second summary of this guide, version two.' });
  });
});

describe('POST /api/guides/:slug/hide and /unhide', () => {
  it('hides a guide from the list and its page for readers (moderators still see it), with an audit row; unhide brings it back', async () => {
    const { slug } = await createPublishedGuide(author, mod, { title: 'Guide that will be hidden for abuse' });
    await visitor.get(`/api/guides/${slug}`).expect(200);

    expect((await author.post(`/api/guides/${slug}/hide`, { reason: 'Spam' })).status).toBe(403);
    expect((await visitor.post(`/api/guides/${slug}/hide`, { reason: 'Spam' })).status).toBe(401);
    const noReason = await mod.post(`/api/guides/${slug}/hide`, {});
    expect(noReason.status).toBe(400);

    const res = await mod.post(`/api/guides/${slug}/hide`, { reason: 'Copied text posted as a guide' });
    expect(res.status).toBe(200);
    expect(res.body.data.document).toMatchObject({ slug, hidden: true, hiddenReason: 'Copied text posted as a guide' });
    expect((await visitor.get(`/api/guides/${slug}`)).status).toBe(404);
    expect((await author.get(`/api/guides/${slug}`)).status).toBe(404);
    expect((await visitor.get(`/api/guides/${slug}/revisions`)).status).toBe(404);
    expect((await visitor.get('/api/guides')).body.data.map((g: { slug: string }) => g.slug)).not.toContain(slug);
    const asMod = await mod.get(`/api/guides/${slug}`).expect(200);
    expect(asMod.body.data.guide).toMatchObject({ hidden: true, hiddenReason: 'Copied text posted as a guide' });
    expect((await mod.post(`/api/guides/${slug}/hide`, { reason: 'Again' })).body.error.code).toBe('invalid_transition');

    const docId = asMod.body.data.revision.documentId;
    const rows = await t.db.dataSource.query('SELECT action, from_value, to_value, reason FROM audit_log WHERE subject_id = $1 ORDER BY created_at', [docId]);
    expect(rows.at(-1)).toEqual({ action: 'document.hide', from_value: 'visible', to_value: 'hidden', reason: 'Copied text posted as a guide' });

    expect((await mod.post(`/api/guides/${slug}/unhide`, {})).status).toBe(200);
    expect((await visitor.get(`/api/guides/${slug}`)).status).toBe(200);
    const rows2 = await t.db.dataSource.query('SELECT action, from_value, to_value FROM audit_log WHERE subject_id = $1 ORDER BY created_at', [docId]);
    expect(rows2.at(-1)).toEqual({ action: 'document.unhide', from_value: 'hidden', to_value: 'visible' });
  });
});

describe('GET /api/guides/:slug/revisions', () => {
  it('shows readers live and superseded versions, authors also their drafts, moderators everything', async () => {
    const { slug } = await createPublishedGuide(author, mod);
    const v2 = await proposeEdit(author, slug, { body: 'Version two body' });
    await author.post(`/api/revisions/${v2.id}/submit`, { note: 'Second' });
    await mod.post(`/api/reviews/${v2.id}/publish`);
    const { client: third } = await signedInClient(t, 'member');
    const draft = await proposeEdit(third, slug, { body: 'Somebody’s draft' });

    const numbers = async (c: TestClient) =>
      (await c.get(`/api/guides/${slug}/revisions`).expect(200)).body.data.map((r: { number: number; state: string }) => `${r.number}:${r.state}`);
    expect(await numbers(visitor)).toEqual(['2:published', '1:archived']);
    expect(await numbers(author)).toEqual(['2:published', '1:archived']);
    expect(await numbers(third)).toEqual([`${draft.number}:draft`, '2:published', '1:archived']);
    expect(await numbers(mod)).toEqual([`${draft.number}:draft`, '2:published', '1:archived']);
    const row = (await visitor.get(`/api/guides/${slug}/revisions`)).body.data[0];
    expect(row).toMatchObject({ number: 2, note: 'Second', baseNumber: 1, author: { displayName: expect.any(String) } });
  });
});

describe('GET /api/guides/:slug/revisions (a guide that was never live)', () => {
  it('answers strangers and visitors exactly as for a slug nobody used; its author and moderators see the draft', async () => {
    const { slug, revision } = await createDraftGuide(author);
    const { client: stranger } = await signedInClient(t, 'member');
    const unused = `never-used-${Date.now()}`;
    for (const [who, c] of [
      ['visitor', visitor],
      ['stranger', stranger],
    ] as const) {
      for (const suffix of ['/revisions', '/revisions/1', '']) {
        const real = await c.get(`/api/guides/${slug}${suffix}`);
        const none = await c.get(`/api/guides/${unused}${suffix}`);
        expect(real.status, `${who} ${suffix}`).toBe(404);
        expect(real.body, `${who} ${suffix}`).toEqual(none.body);
      }
    }
    expect((await author.get(`/api/guides/${slug}/revisions`).expect(200)).body.data.map((r: { id: string }) => r.id)).toEqual([revision.id]);
    expect((await mod.get(`/api/guides/${slug}/revisions`).expect(200)).body.data).toHaveLength(1);
  });
});

describe('GET /api/guides/:slug/revisions/:n', () => {
  it('returns a version by number for its permalink; drafts only to their author and moderators', async () => {
    const { slug } = await createPublishedGuide(author, mod, { body: 'The first body' });
    const res = await visitor.get(`/api/guides/${slug}/revisions/1`).expect(200);
    expect(res.body.data.revision).toMatchObject({ number: 1, state: 'published', content: { body: 'The first body' } });
    const draft = await proposeEdit(author, slug, { body: 'Draft body' });
    expect((await visitor.get(`/api/guides/${slug}/revisions/${draft.number}`)).status).toBe(404);
    expect((await author.get(`/api/guides/${slug}/revisions/${draft.number}`)).status).toBe(200);
    expect((await mod.get(`/api/guides/${slug}/revisions/${draft.number}`)).status).toBe(200);
    expect((await visitor.get(`/api/guides/${slug}/revisions/abc`)).status).toBe(400);
  });
});

describe('GET /api/guides/:slug/compare', () => {
  it('returns both revisions, the changed metadata fields and a word-level diff of the body', async () => {
    const { slug } = await createPublishedGuide(author, mod, { body: 'Run the drag brake at ten percent on the clay.', tags: ['stock'] });
    const v2 = await proposeEdit(author, slug, { body: 'Run the drag brake at five percent on the clay.', tags: ['stock', 'spring'] });
    await author.post(`/api/revisions/${v2.id}/submit`, { note: 'Less drag brake' });
    await mod.post(`/api/reviews/${v2.id}/publish`);

    const res = await visitor.get(`/api/guides/${slug}/compare?from=1&to=2`).expect(200);
    expect(res.body.data.from.number).toBe(1);
    expect(res.body.data.to.number).toBe(2);
    expect(res.body.data.changedFields).toEqual([{ field: 'tags', from: ['stock'], to: ['stock', 'spring'] }]);
    const diff = res.body.data.bodyDiff as Array<{ value: string; added?: boolean; removed?: boolean }>;
    expect(diff.filter((p) => p.removed).map((p) => p.value)).toEqual(['ten']);
    expect(diff.filter((p) => p.added).map((p) => p.value)).toEqual(['five']);
    expect(
      diff
        .filter((p) => !p.removed)
        .map((p) => p.value)
        .join(''),
    ).toBe('Run the drag brake at five percent on the clay.');
    expect((await visitor.get(`/api/guides/${slug}/compare?from=1`)).status).toBe(400);
    expect((await visitor.get(`/api/guides/${slug}/compare?from=1&to=9`)).status).toBe(404);
  });
});
