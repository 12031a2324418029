import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { routeTable } from '../../server/routes';
import { fieldNames } from '../setup/schema-examples';
import { createTestApp, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
});
afterAll(async () => {
  await t.close();
});

const openApiPath = (p: string) => p.replace(/:([A-Za-z0-9_]+)/g, '{$1}');
const unescape = (html: string) =>
  html
    .replace(/&#39;/g, "'")
    .replace(/&quot;/g, '"')
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');

describe('GET /api/docs', () => {
  it('lists every route of the table with method, path, summary, access and its fields', async () => {
    const res = await request(t.app).get('/api/docs');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/html/);
    const html = unescape(res.text);
    for (const route of routeTable) {
      const heading = `${route.method.toUpperCase()}</span> <code>${openApiPath(route.path)}</code>`;
      expect(html, `${route.method} ${route.path}`).toContain(heading);
      expect(html).toContain(route.summary);
      for (const field of [...fieldNames(route.body), ...fieldNames(route.query)])
        expect(html, `${route.path} field ${field}`).toContain(`<code>${field}</code>`);
    }
    expect(html).toContain('admin or above');
    expect(html).toContain('x-csrf-token');
  });

  it('runs no script: no script element, no event handler, and the CSP that forbids inline script', async () => {
    const res = await request(t.app).get('/api/docs');
    expect(res.text).not.toMatch(/<script/i);
    expect(res.text).not.toMatch(/\son[a-z]+\s*=/i);
    expect(String(res.headers['content-security-policy'])).toMatch(/script-src 'self'(;|$)/);
  });

  it('escapes what it prints from the schemas', async () => {
    const res = await request(t.app).get('/api/docs');
    // Summaries with apostrophes and the regex patterns of slugs and ids come through escaped.
    expect(res.text).toContain('&#39;');
    expect(res.text).not.toMatch(/<code>[^<]*[<>][^<]*<\/code>/);
  });
});
