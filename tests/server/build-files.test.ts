import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/test-app';

// npm test builds dist/ before the suites. A page opened before a deployment asks for chunks of its own
// build; once they are gone it must get a clean 404, never the app's HTML (which it would try to run as a script).
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false, serveClient: true });
});
afterAll(() => t.close());

const aScript = () => fs.readdirSync(path.resolve('dist', 'assets')).find((f) => f.endsWith('.js'))!;

describe('files of the build that are not there', () => {
  it.each([
    ['an old build’s chunk', '/assets/start-0ldHa5h1.js'],
    ['an old build’s stylesheet', '/assets/index-0ldHa5h1.css'],
    ['anything else under /assets', '/assets/whatever'],
    ['a missing file at the top', '/registerSW.js'],
    ['a missing source map', '/assets/start-0ldHa5h1.js.map'],
    ['a missing icon', '/icons/icon-1024.png'],
  ])('%s (%s) answers 404 in the error shape, not the page', async (_what, url) => {
    const res = await request(t.app).get(url).set('Accept', '*/*');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.body).toEqual({ error: { code: 'not_found', message: expect.stringContaining(url) } });
    expect(res.text).not.toMatch(/<html|<!doctype/i);
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('still serves the files that are there, and the page for every page address', async () => {
    const script = await request(t.app).get(`/assets/${aScript()}`);
    expect(script.status).toBe(200);
    expect(script.headers['content-type']).toMatch(/javascript/);
    for (const url of ['/calculators', '/guides/no-such-guide/edit', '/some/unknown/page']) {
      const page = await request(t.app).get(url);
      expect(page.status, url).toBe(200);
      expect(page.headers['content-type'], url).toMatch(/^text\/html/);
    }
    // API answers with file-like names are routes, not build files.
    expect((await request(t.app).get('/api/openapi.json')).status).toBe(200);
  });

  it('a HEAD for a missing chunk is a 404 too', async () => {
    const res = await request(t.app).head('/assets/start-0ldHa5h1.js');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
  });
});
