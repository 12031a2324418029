import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromHtml } from 'hast-util-from-html';
import type { Element, Root } from 'hast';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { createPublishedGuide, proposeEdit } from '../../factories/guide';
import { seedParameters } from '../../../server/db/seed-content';
import { dataBlock } from './page-html';

// Every pattern String.prototype.replace expands in a replacement string, with quotes and angle brackets:
// text like this must reach the page literally, in every field that the drawn page puts in its head or body.
const PATTERNS = '$& $` $\' $1 $2 $$ $<name> "><meta http-equiv="refresh" content="0;url=https://elsewhere.example/"> \'quoted\' <b>bold</b> &amp;';

let t: TestApp;
let author: TestClient;
let mod: TestClient;
let visitor: TestClient;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false, serveClient: true });
  await seedParameters(t.db.dataSource);
  ({ client: author } = await signedInClient(t, 'member'));
  ({ client: mod } = await signedInClient(t, 'moderator'));
  visitor = createClient(t.app);
});
afterAll(async () => {
  await t.close();
});

const elements = (tree: Root | Element, tag: string): Element[] => {
  const out: Element[] = [];
  const walk = (n: Root | Element) => {
    for (const c of n.children) {
      if (c.type !== 'element') continue;
      if (c.tagName === tag) out.push(c);
      walk(c);
    }
  };
  walk(tree);
  return out;
};
const textOf = (e: Element): string => e.children.map((c) => (c.type === 'text' ? c.value : c.type === 'element' ? textOf(c) : '')).join('');

/** The page's head as a browser parses it: one title, one description, no refresh, one document. */
function checkHead(html: string, title: string, description: string) {
  const tree = fromHtml(html);
  expect(elements(tree, 'html')).toHaveLength(1);
  expect(elements(tree, 'head')).toHaveLength(1);
  expect(elements(tree, 'body')).toHaveLength(1);
  const titles = elements(tree, 'title');
  expect(titles).toHaveLength(1);
  expect(textOf(titles[0])).toBe(`${title} · Tunewright`);
  const metas = elements(tree, 'meta');
  expect(metas.filter((m) => m.properties.httpEquiv !== undefined)).toEqual([]);
  const descriptions = metas.filter((m) => m.properties.name === 'description');
  expect(descriptions).toHaveLength(1);
  expect(descriptions[0].properties.content).toBe(description);
  // The shell's own three scripts (theme setter, module, data block) and nothing else; exactly one root.
  const scripts = elements(tree, 'script');
  expect(scripts).toHaveLength(3);
  expect(scripts.filter((s) => s.properties.src === '/theme-init.js')).toHaveLength(1);
  expect(elements(tree, 'div').filter((d) => d.properties.id === 'root')).toHaveLength(1);
}

describe('pages drawn on the server with text full of replacement patterns', () => {
  it('a live guide: title, summary and body reach the page literally', async () => {
    const title = `Clay ${PATTERNS}`.slice(0, 120);
    const summary = `Summary ${PATTERNS}`;
    const { slug } = await createPublishedGuide(author, mod, { title, summary, body: `Body ${PATTERNS}\n\nSecond paragraph ${PATTERNS}` });
    const html = (await visitor.get(`/guides/${slug}`).expect(200)).text;
    const api = (await visitor.get(`/api/guides/${slug}`).expect(200)).body.data;
    checkHead(html, api.revision.content.title, api.revision.content.summary);
    expect(dataBlock(html).guide.detail).toEqual(api);
    expect(html.split('<div id="root">')).toHaveLength(2);
  });

  it("a proposal's permalink, as the moderator opens it", async () => {
    const { slug } = await createPublishedGuide(author, mod, { title: 'Plain live title for a proposal' });
    const edit = await proposeEdit(author, slug, { summary: `Proposed ${PATTERNS}`, title: `Proposed ${PATTERNS}`.slice(0, 120) });
    const html = (await mod.get(`/guides/${slug}/v/${edit.number}`).expect(200)).text;
    const version = (await mod.get(`/api/guides/${slug}/revisions/${edit.number}`).expect(200)).body.data.revision;
    checkHead(html, version.content.title, version.content.summary);
  });

  it('a parameter entry', async () => {
    const { client: writer } = await signedInClient(t, 'member');
    const { id } = await proposeEdit(writer, 'drag-brake', { summary: `Brake at neutral ${PATTERNS}` }, 'parameters');
    expect((await writer.post(`/api/revisions/${id}/submit`, { note: 'Pattern check' })).status).toBe(200);
    expect((await mod.post(`/api/reviews/${id}/publish`)).status).toBe(200);
    const html = (await visitor.get('/parameters/drag-brake').expect(200)).text;
    const api = (await visitor.get('/api/parameters/drag-brake').expect(200)).body.data;
    checkHead(html, api.parameter.name, api.parameter.summary);
    expect(api.parameter.summary).toContain('$&');
  });
});
