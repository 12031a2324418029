import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { proposeEdit } from '../../factories/guide';
import { seedParameters } from '../../../server/db/seed-content';
import { dataBlock, rootOf } from './page-html';

let t: TestApp;
let member: TestClient;
let mod: TestClient;
let visitor: TestClient;

beforeAll(async () => {
  // npm test builds dist/ first; the pre-rendered page is the built shell with the entry drawn in.
  t = await createTestApp({}, { catcher: false, serveClient: true });
  await seedParameters(t.db.dataSource);
  ({ client: member } = await signedInClient(t, 'member'));
  ({ client: mod } = await signedInClient(t, 'moderator'));
  visitor = createClient(t.app);
});
afterAll(async () => {
  await t.close();
});

describe('GET /parameters/:slug (the page, drawn on the server)', () => {
  it('draws the live entry into the shell, with its title, description, the same data as the API and the route chunk preloaded', async () => {
    const res = await visitor.get('/parameters/drag-brake').expect(200).expect('content-type', /html/);
    const api = (await visitor.get('/api/parameters/drag-brake').expect(200)).body.data;
    expect(res.text).toContain('<title>Drag brake · Tunewright</title>');
    expect(res.text).toContain(`<meta name="description" content="${api.parameter.summary.replace(/"/g, '&quot;')}"`);
    const root = rootOf(res.text);
    expect(root).toMatch(/<h1[^>]*>Drag brake<\/h1>/);
    // The body as the API renders it, and the cautions box, are in the page itself.
    const firstParagraph = /<p>([^<]{20,})/.exec(api.parameter.bodyHtml)![1];
    expect(root).toContain(firstParagraph);
    const data = dataBlock(res.text);
    expect(data.parameter).toEqual({ slug: 'drag-brake', detail: api });
    expect(data.me).toBeNull();
    expect(data.guide).toBeUndefined();
    const preloads = [...res.text.matchAll(/<link rel="modulepreload" crossorigin href="\/([^"]+)">/g)].map((m) => m[1]);
    // The entry page's own chunk (src/app/routes/parameter.tsx), not the library list's with its table code.
    expect(preloads.some((f) => /^assets\/parameter-[\w-]+\.js$/.test(f))).toBe(true);
    expect(preloads.some((f) => /^assets\/parameters-[\w-]+\.js$/.test(f))).toBe(false);
    for (const f of preloads) expect(fs.existsSync(path.resolve('dist', f)), f).toBe(true);
  });

  it('gives signed-in readers their account in the data block', async () => {
    const html = (await member.get('/parameters/low-voltage-cutoff').expect(200)).text;
    const me = (await member.get('/api/auth/me').expect(200)).body.data.user;
    expect(dataBlock(html).me).toEqual(me);
    expect(rootOf(html)).toContain('Sign out');
  });

  it('answers 404 with the plain shell for an unknown entry, and leaves odd addresses to the browser', async () => {
    const unknown = await visitor.get('/parameters/no-such-setting-anywhere').expect(404).expect('content-type', /html/);
    expect(unknown.text).toContain('<div id="root"></div>');
    expect(unknown.text).not.toContain('tw-initial-data');
    for (const p of ['/parameters/Not_A_Slug', '/parameters/drag-brake/edit']) {
      const res = await visitor.get(p).expect(200);
      expect(res.text, p).toContain('<div id="root"></div>');
    }
  });

  it('draws the page again once the entry changes (a visitor never gets the old drawing)', async () => {
    const before = rootOf((await visitor.get('/parameters/throttle-punch').expect(200)).text);
    expect(before).not.toContain('Checked on the new hall carpet.');
    const draft = await proposeEdit(
      member,
      'throttle-punch',
      { summary: 'How hard the motor is driven off the line. Checked on the new hall carpet.' },
      'parameters',
    );
    expect((await member.post(`/api/revisions/${draft.id}/submit`, { note: 'Summary from the carpet test day' })).status).toBe(200);
    expect((await mod.post(`/api/reviews/${draft.id}/publish`)).status).toBe(200);
    const after = (await visitor.get('/parameters/throttle-punch').expect(200)).text;
    expect(after).toContain('Checked on the new hall carpet.');
    expect(dataBlock(after).parameter.detail.parameter.summary).toContain('Checked on the new hall carpet.');
  });
});
