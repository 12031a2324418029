import request from 'supertest';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';
import { createPublishedGuide, proposeEdit } from '../factories/guide';
import type { UserEntity } from '../../server/modules/auth/user.entity';

/** Titles and summaries are type="html" (RFC 4287 3.1.1.2): the text is what HTML-decoding their content gives. */
const htmlText = (v: unknown) =>
  String((v as { '#text'?: string })?.['#text'] ?? v).replace(
    /&(amp|lt|gt|quot|#39);/g,
    (_m, e: string) => ({ amp: '&', lt: '<', gt: '>', quot: '"', '#39': "'" })[e]!,
  );

describe('GET /api/changes and GET /changes.atom', () => {
  let t: TestApp;
  let author: TestClient;
  let authorUser: UserEntity;
  let other: TestClient;
  let mod: TestClient;
  let visitor: TestClient;
  let slugA: string;
  let slugB: string;
  let hiddenSlug: string;

  beforeAll(async () => {
    t = await createTestApp();
    ({ client: author, user: authorUser } = await signedInClient(t, 'member'));
    ({ client: other } = await signedInClient(t, 'member'));
    ({ client: mod } = await signedInClient(t, 'moderator'));
    visitor = createClient(t.app);
    ({ slug: slugA } = await createPublishedGuide(author, mod, { title: 'Stock buggy & "clay" <baseline>', class: 'buggy-2wd-stock' }));
    ({ slug: slugB } = await createPublishedGuide(other, mod, { title: 'Touring carpet guide', class: 'touring-mod', surface: 'carpet' }));
    const edit = await proposeEdit(author, slugA, { summary: 'Softer punch for the second heat, with a little more drag brake.' });
    expect((await author.post(`/api/revisions/${edit.id}/submit`, { note: 'Punch down a step for heat two' })).status).toBe(200);
    expect((await mod.post(`/api/reviews/${edit.id}/publish`)).status).toBe(200);
    expect((await mod.post(`/api/guides/${slugA}/restore`, { number: 1, reason: 'The edit lost the clay notes', note: 'Back to the first text' })).status).toBe(
      201,
    );
    ({ slug: hiddenSlug } = await createPublishedGuide(other, mod, { title: 'Guide with copied text' }));
    expect((await mod.post(`/api/guides/${hiddenSlug}/hide`, { reason: 'Copied from a printed manual' })).status).toBe(200);
  });
  afterAll(async () => {
    await t.close();
  });

  it('lists live changes newest first with the contract fields; a hidden guide only for moderators', async () => {
    const res = await visitor.get('/api/changes');
    expect(res.status).toBe(200);
    const rows = res.body.data as Array<Record<string, unknown>>;
    for (const r of rows) expect(Object.keys(r)).toEqual(expect.arrayContaining(['kind', 'slug', 'title', 'number', 'action', 'at', 'note']));
    const ats = rows.map((r) => Date.parse(r.at as string));
    expect([...ats].sort((a, b) => b - a)).toEqual(ats);
    expect(rows.filter((r) => r.slug === slugA).map((r) => [r.action, r.number, r.note])).toEqual([
      ['restored', 3, 'Back to the first text'],
      ['published', 2, 'Punch down a step for heat two'],
      ['published', 1, 'First version of the guide'],
    ]);
    expect(rows.some((r) => r.slug === hiddenSlug)).toBe(false);
    const asMod = (await mod.get('/api/changes')).body.data as Array<Record<string, unknown>>;
    expect(asMod[0]).toMatchObject({ slug: hiddenSlug, action: 'hidden', note: 'Copied from a printed manual', title: 'Guide with copied text' });
  });

  it('filters by kind, class and author, and limits', async () => {
    const byClass = (await visitor.get('/api/changes?class=touring-mod')).body.data as Array<{ slug: string }>;
    expect(byClass.map((r) => r.slug)).toEqual([slugB]);
    const byAuthor = (await visitor.get(`/api/changes?author=${authorUser.id}`)).body.data as Array<{ slug: string; author: { id: string } }>;
    expect(byAuthor.length).toBeGreaterThanOrEqual(2);
    expect(new Set(byAuthor.map((r) => r.slug))).toEqual(new Set([slugA]));
    expect((await visitor.get('/api/changes?kind=parameter')).body.data).toEqual([]);
    expect((await visitor.get('/api/changes?limit=1')).body.data).toHaveLength(1);
    const bad = await visitor.get('/api/changes?limit=0&kind=setup&class=nope&author=x');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['query.author', 'query.class', 'query.kind', 'query.limit']);
  });

  it('serves the same list as a valid Atom 1.0 feed (RFC 4287 required elements), checked by an independent XML parser', async () => {
    const res = await request(t.app).get('/changes.atom');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/atom\+xml/);
    const xml = res.text;
    expect(XMLValidator.validate(xml)).toBe(true);
    const doc = new XMLParser({
      ignoreAttributes: false,
      attributeNamePrefix: '@',
      isArray: (name) => name === 'entry' || name === 'link' || name === 'author',
    }).parse(xml);
    const feed = doc.feed;
    expect(feed['@xmlns']).toBe('http://www.w3.org/2005/Atom');
    // RFC 4287 4.1.1: atom:feed MUST contain exactly one id, title and updated, and an author unless every entry has one.
    expect(typeof feed.id).toBe('string');
    expect(feed.title).toBeTruthy();
    expect(Number.isNaN(Date.parse(feed.updated))).toBe(false);
    expect(feed.author[0].name).toBeTruthy();
    expect(feed.link.some((l: Record<string, string>) => l['@rel'] === 'self' && l['@href'].endsWith('/changes.atom'))).toBe(true);
    const api = (await visitor.get('/api/changes')).body.data as Array<{ title: string; note: string; at: string }>;
    expect(feed.entry).toHaveLength(api.length);
    for (const [i, e] of (feed.entry as Array<Record<string, unknown>>).entries()) {
      // 4.1.2: each entry MUST have id, title, updated; a link (rel alternate) since it has no content.
      expect(typeof e.id).toBe('string');
      expect(String(e.id)).toMatch(/^tag:/);
      expect(htmlText(e.title)).toContain(api[i].title);
      expect(Date.parse(e.updated as string)).toBe(Date.parse(api[i].at));
      expect((e.link as Array<Record<string, string>>)[0]['@href']).toMatch(/^http:\/\/127\.0\.0\.1:3000\//);
      expect((e.author as Array<{ name: string }>)[0].name).toBeTruthy();
    }
    // Ids are unique and the feed's updated is the newest entry's.
    expect(new Set(feed.entry.map((e: { id: string }) => e.id)).size).toBe(feed.entry.length);
    expect(Date.parse(feed.updated)).toBe(Date.parse(api[0].at));
    // Text with markup characters is escaped, not markup: it parses back to the same characters.
    expect(xml).not.toContain('<baseline>');
    expect(feed.entry.map((e: { title: unknown }) => htmlText(e.title)).join('\n')).toContain('Stock buggy & "clay" <baseline>');
    // Never the hidden guide, even for a moderator's cookie.
    expect(xml).not.toContain('Guide with copied text');
  });

  it('the feed takes the same filters and refuses bad ones with the error shape', async () => {
    const res = await request(t.app).get('/changes.atom?class=touring-mod');
    const feed = new XMLParser({ isArray: (n) => n === 'entry' }).parse(res.text).feed;
    expect(feed.entry).toHaveLength(1);
    const bad = await request(t.app).get('/changes.atom?limit=9999');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
  });
});
