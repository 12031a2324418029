import fs from 'node:fs';
import path from 'node:path';
import escapeHtml from 'escape-html';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { createPublishedGuide } from '../../factories/guide';
import { seedParameters } from '../../../server/db/seed-content';
import { dataBlock, rootOf } from './page-html';

let t: TestApp;
let author: TestClient;
let mod: TestClient;
let visitor: TestClient;

beforeAll(async () => {
  // npm test builds dist/ first; each page is the built shell with the page drawn in.
  t = await createTestApp({}, { catcher: false, serveClient: true });
  await seedParameters(t.db.dataSource);
  ({ client: author } = await signedInClient(t, 'member'));
  ({ client: mod } = await signedInClient(t, 'moderator'));
  visitor = createClient(t.app);
  await createPublishedGuide(author, mod, {
    title: 'Stock short course on the Harbour Flats clay',
    summary: 'A forgiving baseline for the long sweeper.',
    class: 'short-course',
  });
  await createPublishedGuide(author, mod, { title: 'Modified buggy on the winter carpet', summary: 'Punchy but tidy on the carpet layout.' });
});
afterAll(async () => {
  await t.close();
});

/** Text as React writes it into HTML (quotes and ampersands escaped). */
const inHtml = (text: string) => escapeHtml(text).replace(/&#39;/g, '&#x27;');

const preloads = (html: string) => [...html.matchAll(/<link rel="modulepreload" crossorigin href="\/([^"]+)">/g)].map((m) => m[1]);

function expectPreloaded(html: string, chunk: RegExp) {
  const files = preloads(html);
  expect(
    files.some((f) => chunk.test(f)),
    `${chunk} among ${files.join(', ')}`,
  ).toBe(true);
  for (const f of files) expect(fs.existsSync(path.resolve('dist', f)), f).toBe(true);
}

describe('pages drawn on the server: home, parameter library, guides list, search results', () => {
  it('draws the home page with its journeys and the safety notice', async () => {
    const html = (await visitor.get('/').expect(200).expect('content-type', /html/)).text;
    const root = rootOf(html);
    expect(root).toMatch(/<h1[^>]*>The tuning notebook for speed controllers, motors and gearing.<\/h1>/);
    for (const journey of ['Look up a setting', 'Read a tuner’s guide', 'Download a baseline', 'Work the numbers']) expect(root).toContain(journey);
    expect(root).toContain('Heat and lithium packs deserve respect');
    expect(dataBlock(html)).toEqual({ me: null });
    expectPreloaded(html, /^assets\/home-[\w-]+\.js$/);
  });

  it('draws the parameter library from what GET /api/parameters answers', async () => {
    const html = (await visitor.get('/parameters').expect(200)).text;
    const api = (await visitor.get('/api/parameters').expect(200)).body.data as Array<{ slug: string; name: string; summary: string }>;
    expect(api.length).toBeGreaterThan(10);
    expect(html).toContain('<title>Parameter library · Tunewright</title>');
    const root = rootOf(html);
    for (const p of api) {
      expect(root, p.slug).toContain(`href="/parameters/${p.slug}"`);
      expect(root, p.slug).toContain(inHtml(p.name));
    }
    expect(dataBlock(html).library).toEqual(api);
    expectPreloaded(html, /^assets\/parameters-[\w-]+\.js$/);
  });

  it('draws the guides list from what GET /api/guides answers, filters included', async () => {
    const html = (await visitor.get('/guides').expect(200)).text;
    const api = (await visitor.get('/api/guides').expect(200)).body.data as Array<{ slug: string; title: string; summary: string }>;
    expect(api.length).toBe(2);
    const root = rootOf(html);
    for (const g of api) {
      expect(root).toContain(`href="/guides/${g.slug}"`);
      expect(root).toContain(inHtml(g.title));
      expect(root).toContain(inHtml(g.summary));
    }
    expect(root).toContain('2 guides');
    const data = dataBlock(html);
    expect(data.guides.list).toEqual(api);
    expect(data.guides.filters).toEqual({});
    expect(data.guides.parameters).toEqual((await visitor.get('/api/parameters').expect(200)).body.data);
    expect(html).toContain('<title>Guides · Tunewright</title>');
    expectPreloaded(html, /^assets\/guides-[\w-]+\.js$/);

    const filtered = (await visitor.get('/guides?class=short-course').expect(200)).text;
    const apiFiltered = (await visitor.get('/api/guides?class=short-course').expect(200)).body.data as Array<{ title: string }>;
    expect(apiFiltered.map((g) => g.title)).toEqual(['Stock short course on the Harbour Flats clay']);
    expect(dataBlock(filtered).guides).toMatchObject({ filters: { class: 'short-course' }, list: apiFiltered });
    expect(rootOf(filtered)).toContain('1 guide');
    expect(rootOf(filtered)).not.toContain('Modified buggy on the winter carpet');

    // A filter the API refuses: the plain shell, the browser shows the API's message.
    const bad = await visitor.get('/guides?class=monster-truck-on-ice').expect(200);
    expect(bad.text).toContain('<div id="root"></div>');
    expect(bad.text).not.toContain('tw-initial-data');
  });

  it('draws a new guide into the list once it is live (a visitor never gets the old drawing)', async () => {
    const before = rootOf((await visitor.get('/guides').expect(200)).text);
    expect(before).not.toContain('Touring car on the club carpet');
    await createPublishedGuide(author, mod, { title: 'Touring car on the club carpet', summary: 'Smooth and flat through the chicane.' });
    const after = (await visitor.get('/guides').expect(200)).text;
    expect(rootOf(after)).toContain('Touring car on the club carpet');
    expect(dataBlock(after).guides.list).toEqual((await visitor.get('/api/guides').expect(200)).body.data);
  });

  it('draws search results from the query in the URL, as GET /api/search answers it', async () => {
    // The index follows publications through the change listener; wait until it has the guides.
    await expect.poll(async () => (await visitor.get('/api/search?q=carpet').expect(200)).body.meta.total, { timeout: 10_000 }).toBeGreaterThanOrEqual(2);
    const html = (await visitor.get('/search?q=drag+brake').expect(200)).text;
    const api = (await visitor.get('/api/search?q=drag%20brake&limit=20').expect(200)).body;
    expect(api.data.hits.length).toBeGreaterThan(0);
    const root = rootOf(html);
    for (const hit of api.data.hits as Array<{ title: string; url: string }>) {
      expect(root).toContain(`href="${hit.url}"`);
      expect(root).toContain(inHtml(hit.title));
    }
    expect(root).toContain(`${api.meta.total} result`);
    const data = dataBlock(html);
    expect(data.search.params).toEqual({ q: 'drag brake' });
    // Only the time the search took differs between the two answers.
    const { tookMs: _a, ...pageMeta } = data.search.page.meta;
    const { tookMs: _b, ...apiMeta } = api.meta;
    expect(pageMeta).toEqual(apiMeta);
    expect(data.search.page.data).toEqual(api.data);
    expect(html).toContain('<title>Search: drag brake · Tunewright</title>');
    expectPreloaded(html, /^assets\/search-[\w-]+\.js$/);

    // Filters in the URL narrow the drawn results as they narrow the API's.
    const filtered = dataBlock((await visitor.get('/search?q=carpet&type=guide').expect(200)).text);
    const apiFiltered = (await visitor.get('/api/search?q=carpet&type=guide&limit=20').expect(200)).body;
    expect(filtered.search.page.data).toEqual(apiFiltered.data);
    expect((apiFiltered.data.hits as Array<{ type: string }>).every((h) => h.type === 'guide')).toBe(true);

    // No query: the page's own starter card, no results to send.
    const empty = (await visitor.get('/search').expect(200)).text;
    expect(rootOf(empty)).toContain('Misspellings are fine');
    expect(dataBlock(empty).search).toBeUndefined();
    // A query the API refuses (too long): the plain shell.
    const long = await visitor.get(`/search?q=${'a'.repeat(500)}`).expect(200);
    expect(long.text).toContain('<div id="root"></div>');
  });

  it('keeps member text inert on the search page: the query is text in the page and in the data block', async () => {
    const q = '</script><script>alert(1)</script> $& "x"';
    const html = (await visitor.get(`/search?q=${encodeURIComponent(q)}`).expect(200)).text;
    expect(html.match(/<script/g)?.length).toBe((await visitor.get('/parameters').expect(200)).text.match(/<script/g)?.length);
    expect(dataBlock(html).search.params.q).toBe(q);
    expect(html).toContain(`<title>Search: ${escapeHtml(q)} · Tunewright</title>`);
  });

  it('gives a signed-in reader their own page (their account in the data block, nothing kept for visitors)', async () => {
    const html = (await author.get('/guides').expect(200)).text;
    expect(dataBlock(html).me).toEqual((await author.get('/api/auth/me').expect(200)).body.data.user);
    expect(rootOf(html)).toContain('Write a guide');
    expect(rootOf((await visitor.get('/guides').expect(200)).text)).not.toContain('Write a guide');
  });
});
