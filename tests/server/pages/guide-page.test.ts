import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { createPublishedGuide, proposeEdit } from '../../factories/guide';
import { dataBlock, rootOf } from './page-html';

let t: TestApp;
let author: TestClient;
let mod: TestClient;
let visitor: TestClient;

beforeAll(async () => {
  // npm test builds dist/ first; the pre-rendered page is the built shell with the guide drawn in.
  t = await createTestApp({}, { catcher: false, serveClient: true });
  ({ client: author } = await signedInClient(t, 'member'));
  ({ client: mod } = await signedInClient(t, 'moderator'));
  visitor = createClient(t.app);
});
afterAll(async () => {
  await t.close();
});

describe('GET /guides/:slug (the page, drawn on the server)', () => {
  it('draws the live guide into the shell, with its title, description, data and the route chunk preloaded', async () => {
    const { slug } = await createPublishedGuide(author, mod, {
      title: 'Modified buggy on the Harbour Flats carpet',
      summary: 'Punchy but tidy on the winter carpet layout.',
      body: '## Gearing\n\nStart **here**.\n\n```worked-example\ncalc: gearing\nspur: 84\npinion: 32\ninternalRatio: 2.6\ntyreDiameterMm: 62\n```\n',
    });
    const res = await visitor.get(`/guides/${slug}`).expect(200).expect('content-type', /html/);
    const html = res.text;
    expect(html).toContain('<title>Modified buggy on the Harbour Flats carpet · Tunewright</title>');
    expect(html).toContain('<meta name="description" content="Punchy but tidy on the winter carpet layout."');
    const root = rootOf(html);
    expect(root).toMatch(/<h1 id="guide-title"[^>]*>Modified buggy on the Harbour Flats carpet<\/h1>/);
    // Headings carry the ids the contents list links to.
    expect(root).toMatch(/<h2 id="section-gearing"[^>]*>Gearing<\/h2>/);
    expect(root).toContain('<strong>here</strong>');
    expect(root).toContain('data-example-slot="0"');
    expect(root).toMatch(/Version 1, published on/);
    // The same reads the API answers with, so the browser's first render draws the same page.
    const data = dataBlock(html);
    const api = await visitor.get(`/api/guides/${slug}`).expect(200);
    expect(data.guide.detail).toEqual(api.body.data);
    expect(data.me).toBeNull();
    expect(data.guide.parameters).toEqual((await visitor.get('/api/parameters').expect(200)).body.data);
    // Every preloaded chunk exists in the build.
    const preloads = [...html.matchAll(/<link rel="modulepreload" crossorigin href="\/([^"]+)">/g)].map((m) => m[1]);
    expect(preloads.some((f) => /^assets\/guide-[\w-]+\.js$/.test(f))).toBe(true);
    for (const f of preloads) expect(fs.existsSync(path.resolve('dist', f)), f).toBe(true);
  });

  it('draws a permalink with that version and says it is not the live one', async () => {
    const { slug } = await createPublishedGuide(author, mod, { title: 'Stadium truck permalink check' });
    const edit = await proposeEdit(author, slug, { title: 'Stadium truck permalink check, take two' });
    expect((await author.post(`/api/revisions/${edit.id}/submit`, { note: 'Second take' })).status).toBe(200);
    expect((await mod.post(`/api/reviews/${edit.id}/publish`)).status).toBe(200);
    const html = (await visitor.get(`/guides/${slug}/v/1`).expect(200)).text;
    expect(rootOf(html)).toMatch(/<h1 id="guide-title"[^>]*>Stadium truck permalink check<\/h1>/);
    expect(rootOf(html)).toContain('You are reading version 1, not the live guide');
    const data = dataBlock(html);
    expect(data.guide.version.number).toBe(1);
    expect(data.guide.version.revision).toEqual((await visitor.get(`/api/guides/${slug}/revisions/1`).expect(200)).body.data.revision);
    expect(data.guide.detail.revision.number).toBe(2);
  });

  it('keeps text that looks like markup inert in the markup, the title and the data block', async () => {
    const hostile = '</script><script>window.__xss=1</script><img src=x onerror=alert(1)>';
    const { slug } = await createPublishedGuide(author, mod, {
      title: `Crawler ${hostile}`,
      summary: `Summary ${hostile} & "quotes"`,
      body: `Body ${hostile}\n\n<script>alert(2)</script>`,
    });
    const html = (await visitor.get(`/guides/${slug}`).expect(200)).text;
    // Only the shell's own scripts (the theme setter and the module) and the one data block are script elements.
    const scripts = [...html.matchAll(/<script\b[^>]*>/gi)].map((m) => m[0]);
    expect(scripts).toHaveLength(3);
    expect(scripts.filter((s) => s === '<script src="/theme-init.js">')).toHaveLength(1);
    expect(scripts.filter((s) => /type="module"/.test(s))).toHaveLength(1);
    expect(html).not.toMatch(/<img[^>]*onerror/i);
    expect(html).toContain('<title>Crawler &lt;/script&gt;&lt;script&gt;window.__xss=1&lt;/script&gt;');
    expect(dataBlock(html).guide.detail.guide.title).toBe(`Crawler ${hostile}`);
  });

  it('signed-in readers get their account in the data block (and the page drawn for them)', async () => {
    const { slug } = await createPublishedGuide(author, mod);
    const html = (await author.get(`/guides/${slug}`).expect(200)).text;
    expect(dataBlock(html).me).toMatchObject({ role: 'member' });
    expect(rootOf(html)).toContain('Propose an edit');
    expect(rootOf((await visitor.get(`/guides/${slug}`).expect(200)).text)).not.toContain('Propose an edit');
  });

  it('answers 404 with the plain shell for an unknown or hidden guide (moderators still get it drawn)', async () => {
    const unknown = await visitor.get('/guides/no-such-guide-anywhere').expect(404).expect('content-type', /html/);
    expect(unknown.text).toContain('<div id="root"></div>');
    expect(unknown.text).not.toContain('tw-initial-data');

    const { slug } = await createPublishedGuide(author, mod, { title: 'A guide a moderator hides' });
    expect((await visitor.get(`/guides/${slug}`).expect(200)).text).toContain('A guide a moderator hides');
    expect((await mod.post(`/api/guides/${slug}/hide`, { reason: 'Spam links in the body' })).status).toBe(200);
    const hidden = await visitor.get(`/guides/${slug}`).expect(404);
    expect(hidden.text).not.toContain('A guide a moderator hides');
    const forMod = (await mod.get(`/guides/${slug}`).expect(200)).text;
    expect(rootOf(forMod)).toContain('Hidden from readers');
    expect(dataBlock(forMod).guide.detail.guide.hiddenReason).toBe('Spam links in the body');
  });

  it('leaves other addresses under /guides to the browser (new guide, odd version numbers)', async () => {
    for (const p of ['/guides/new', '/guides/some-guide/v/0', '/guides/some-guide/v/abc', '/guides/Not_A_Slug']) {
      const res = await visitor.get(p).expect(200);
      expect(res.text, p).toContain('<div id="root"></div>');
    }
  });

  it('draws the page again once the guide changes (a visitor never gets the old drawing)', async () => {
    const { slug } = await createPublishedGuide(author, mod, { body: 'Old paragraph about punch.' });
    expect(rootOf((await visitor.get(`/guides/${slug}`).expect(200)).text)).toContain('Old paragraph about punch.');
    const edit = await proposeEdit(author, slug, { body: 'New paragraph about punch.' });
    expect((await author.post(`/api/revisions/${edit.id}/submit`, { note: 'Rewrite' })).status).toBe(200);
    expect((await mod.post(`/api/reviews/${edit.id}/publish`)).status).toBe(200);
    const root = rootOf((await visitor.get(`/guides/${slug}`).expect(200)).text);
    expect(root).toContain('New paragraph about punch.');
    expect(root).not.toContain('Old paragraph about punch.');
  });
});
