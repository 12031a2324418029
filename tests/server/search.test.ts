import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seed } from '../../server/db/seed';
import { LIMITS } from '../../shared/constants';
import { SEARCH_MAX_OFFSET, searchMetaSchema, searchResponseSchema, searchSuggestionSchema, snippetSegments } from '../../shared/schemas/search';
import { publishRevision } from '../factories/revision';
import { within } from '../search/wait';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';

let t: TestApp;
let client: TestClient;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
  await t.ctx.search.build();
  client = createClient(t.app);
});
afterAll(async () => {
  await t.close();
});

describe('GET /api/search', () => {
  it('returns hits, facets and meta in the contract shape', async () => {
    const res = await client.get('/api/search?q=drag%20brake');
    expect(res.status).toBe(200);
    expect(searchResponseSchema.strict().parse(res.body.data)).toBeTruthy();
    expect(Object.keys(res.body).sort()).toEqual(['data', 'meta']);
    expect(res.body.meta.total).toBeGreaterThan(5);
    expect(typeof res.body.meta.tookMs).toBe('number');
    const first = res.body.data.hits[0];
    expect(first).toMatchObject({ type: 'parameter', slug: 'drag-brake', title: 'Drag brake', url: '/parameters/drag-brake' });
    expect(first.snippet).toMatch(/<mark>drag<\/mark> <mark>brake<\/mark>/i);
    expect(first.snippet.replace(/<\/?mark>/g, '')).not.toMatch(/[<>]/);
    // Guides' baseline setup records are indexed too (as type 'setup').
    expect(res.body.data.facets.type.map((f: { value: string }) => f.value).sort()).toEqual(['guide', 'parameter', 'setup']);
  });

  it('puts the drag-brake parameter first for q=dragbreak', async () => {
    const res = await client.get('/api/search?q=dragbreak');
    expect(res.status).toBe(200);
    expect(res.body.data.hits[0]).toMatchObject({ type: 'parameter', slug: 'drag-brake' });
  });

  it('filters by type, class, surface and parameter, with facet counts that add up', async () => {
    const all = (await client.get('/api/search?q=drag%20brake&limit=50')).body;
    const guideCount = all.data.facets.type.find((f: { value: string }) => f.value === 'guide').count;
    const guides = (await client.get('/api/search?q=drag%20brake&type=guide&limit=50')).body;
    expect(guides.meta.total).toBe(guideCount);
    expect(guides.data.hits.every((h: { type: string }) => h.type === 'guide')).toBe(true);
    const clay = all.data.facets.surface.find((f: { value: string }) => f.value === 'clay');
    const onClay = (await client.get('/api/search?q=drag%20brake&surface=clay')).body;
    expect(onClay.meta.total).toBe(clay.count);
    const stock = (await client.get('/api/search?q=punch&class=buggy-2wd-stock')).body;
    expect(stock.data.hits.map((h: { type: string; slug: string }) => `${h.type}:${h.slug}`)).toEqual([
      'guide:stock-2wd-buggy-harbour-flats-clay',
      'setup:stock-2wd-buggy-harbour-flats-clay',
    ]);
    const withRollout = (await client.get('/api/search?q=clay&parameter=rollout')).body;
    expect(withRollout.meta.total).toBeGreaterThan(0);
    const limited = (await client.get('/api/search?q=brake&limit=2')).body;
    expect(limited.data.hits).toHaveLength(2);
    expect(limited.meta.total).toBeGreaterThan(2);
  });

  it('offers "did you mean" when nothing matches as typed', async () => {
    const res = await client.get('/api/search?q=drgabrkae');
    expect(res.status).toBe(200);
    expect(res.body.data.hits).toEqual([]);
    expect(res.body.meta.total).toBe(0);
    expect(res.body.data.didYouMean).toBe('Drag brake');
  });

  it('never shows proposals: a guide that only has a revision awaiting review is not found', async () => {
    const res = await client.get('/api/search?q=Brackwater%20Barn%20astroturf&limit=50');
    expect(res.body.data.hits.map((h: { slug: string }) => h.slug)).not.toContain('mod-2wd-buggy-brackwater-astroturf');
  });

  it('rejects an empty, missing or over-long query with the error shape', async () => {
    for (const path of ['/api/search?q=', '/api/search?q=%20%20', '/api/search', `/api/search?q=${'a'.repeat(LIMITS.searchQueryMax + 1)}`]) {
      const res = await client.get(path);
      expect(res.status, path).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details[0].path).toBe('query.q');
    }
    expect((await client.get(`/api/search?q=${'a'.repeat(LIMITS.searchQueryMax)}`)).status).toBe(200);
  });

  it('rejects unknown filters and limits', async () => {
    for (const path of [
      '/api/search?q=brake&type=page',
      '/api/search?q=brake&class=monster',
      '/api/search?q=brake&surface=ice',
      '/api/search?q=brake&limit=0',
      '/api/search?q=brake&limit=500',
      '/api/search?q=brake&parameter=Drag%20Brake',
    ]) {
      const res = await client.get(path);
      expect(res.status, path).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
    }
  });
});

describe('GET /api/search setup snippets', () => {
  it('write a baseline setup record in words, not as a run of raw values', async () => {
    const res = await client.get('/api/search?q=17.5T%20stock%20buggy%20drag%20brake&type=setup');
    const hit = res.body.data.hits.find((h: { slug: string }) => h.slug === 'stock-2wd-buggy-harbour-flats-clay');
    expect(hit).toBeTruthy();
    const text = hit.snippet.replace(/<\/?mark>/g, '');
    expect(text).toMatch(/^17\.5T sensored, 2S LiPo, 84\/3\d × 2\.6, /);
    expect(text).toMatch(/drag brake \d+ %/);
    expect(text).toMatch(/low voltage cutoff 3\.\d V per cell/);
    // No bare values strung together (the record's numbers, classes and flags one after another).
    expect(text).not.toMatch(/· \d|\btrue\b|buggy-2wd-stock|\blipo\b/);
    expect(hit.snippet).toMatch(/<mark>drag<\/mark> <mark>brake<\/mark>/);
  });
});

describe('GET /api/search paging', () => {
  it('pages through every match with offset: meta.total is the true count, no item twice, none skipped', async () => {
    for (const [q, filter] of [
      ['brake', ''],
      ['harbour flats', '&type=guide'],
      ['drag brake', '&surface=clay'],
    ]) {
      const whole = (await client.get(`/api/search?q=${encodeURIComponent(q)}${filter}&limit=50`)).body;
      const total = whole.meta.total;
      expect(total, q).toBeGreaterThan(3);
      const seen: string[] = [];
      for (let offset = 0; offset < total + 3; offset += 3) {
        const res = await client.get(`/api/search?q=${encodeURIComponent(q)}${filter}&limit=3&offset=${offset}`);
        expect(res.status).toBe(200);
        expect(searchMetaSchema.strict().parse(res.body.meta)).toMatchObject({ total, offset, limit: 3 });
        expect(res.body.data.hits.length, `${q} @${offset}`).toBe(Math.max(0, Math.min(3, total - offset)));
        // Facets count every match, whichever page is asked for.
        expect(res.body.data.facets, `${q} @${offset}`).toEqual(whole.data.facets);
        seen.push(...res.body.data.hits.map((h: { type: string; slug: string }) => `${h.type}:${h.slug}`));
      }
      expect(seen.length, q).toBe(total);
      expect(new Set(seen).size, q).toBe(total);
      if (total <= 50) expect(seen, q).toEqual(whole.data.hits.map((h: { type: string; slug: string }) => `${h.type}:${h.slug}`));
    }
  });

  it('answers an offset past the last match with no hits and the same total', async () => {
    const res = await client.get('/api/search?q=brake&offset=9000');
    expect(res.status).toBe(200);
    expect(res.body.data.hits).toEqual([]);
    expect(res.body.meta.total).toBeGreaterThan(5);
  });

  it('rejects a negative, fractional, non-numeric or too deep offset', async () => {
    for (const offset of ['-1', '1.5', 'ten', String(SEARCH_MAX_OFFSET + 1)]) {
      const res = await client.get(`/api/search?q=brake&offset=${offset}`);
      expect(res.status, offset).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details[0].path).toBe('query.offset');
    }
  });
});

describe('GET /api/search corrections', () => {
  it('says what it searched for when the query was read differently from how it was typed', async () => {
    for (const [q, searchedFor] of [
      ['dragbreak', 'drag brake'],
      ['Drag break on clay', 'drag brake on clay'],
      ['low voltage cuttoff', 'low voltage cutoff'],
    ]) {
      const res = await client.get(`/api/search?q=${encodeURIComponent(q)}`);
      expect(res.body.data.searchedFor, q).toBe(searchedFor);
      expect(res.body.data.hits.length, q).toBeGreaterThan(0);
    }
  });

  it('says nothing extra when the words were found as typed, by another name, or not at all', async () => {
    for (const q of ['drag brake', 'drag brakes', 'boost', 'LVC', 'drgabrkae']) {
      const res = await client.get(`/api/search?q=${encodeURIComponent(q)}`);
      expect(res.body.data, q).not.toHaveProperty('searchedFor');
    }
  });
});

describe('GET /api/search/suggest', () => {
  it('suggests pages for a half-typed query', async () => {
    const res = await client.get('/api/search/suggest?q=drag%20br');
    expect(res.status).toBe(200);
    expect(res.body.data.length).toBeGreaterThan(0);
    expect(res.body.data.length).toBeLessThanOrEqual(8);
    for (const s of res.body.data) expect(searchSuggestionSchema.strict().parse(s)).toBeTruthy();
    expect(res.body.data[0]).toEqual({ type: 'parameter', slug: 'drag-brake', title: 'Drag brake', url: '/parameters/drag-brake' });
  });

  it('suggests guides by class words', async () => {
    const res = await client.get('/api/search/suggest?q=stadium');
    expect(res.body.data[0]).toMatchObject({ type: 'guide', slug: 'stadium-truck-harbour-flats-clay' });
  });

  it('rejects an empty or over-long query', async () => {
    expect((await client.get('/api/search/suggest?q=')).status).toBe(400);
    expect((await client.get(`/api/search/suggest?q=${'b'.repeat(LIMITS.searchQueryMax + 1)}`)).body.error.code).toBe('validation_failed');
  });
});

describe('GET /api/search snippets', () => {
  it('are plain text: markup a writer typed into a summary, conditions or body never reaches a snippet', async () => {
    await publishRevision(t.db.dataSource, 'guide', 'drag-car-park-asphalt', (c) => ({
      ...c,
      summary: 'Gentle <b>drag</b> launch for the <img src=x onerror=alert(1)> wrenshaw night <!-- hidden --> <script>alert(2)</script>',
      conditions: 'Dusty <a href="javascript:alert(3)">wrenshaw</a> evening',
      body: `${c.body as string}\n\nWrenshaw notes <img\nsrc=x onerror=alert(4)\n> and the end <svg onload=alert(5)\n`,
    }));
    await within(2000, async () => (await client.get('/api/search?q=wrenshaw')).body.meta.total > 0, 'edited guide indexed');
    for (const q of ['wrenshaw', 'wrenshaw notes', 'gentle launch']) {
      const res = await client.get(`/api/search?q=${encodeURIComponent(q)}`);
      const hit = res.body.data.hits.find((h: { slug: string }) => h.slug === 'drag-car-park-asphalt');
      expect(hit, q).toBeTruthy();
      const text = hit.snippet.replace(/<\/?mark>/g, '');
      // Nothing left that a browser would read as the start of a tag, a comment or an attribute.
      expect(text, q).not.toMatch(/<[a-z/!?]/i);
      expect(text, q).not.toMatch(/onerror|onload|javascript:|<|>/i);
      expect(
        snippetSegments(hit.snippet).every((s) => !/[<>]/.test(s.text)),
        q,
      ).toBe(true);
    }
    const summary = (await client.get('/api/search?q=gentle%20launch')).body.data.hits.find((h: { slug: string }) => h.slug === 'drag-car-park-asphalt');
    expect(summary.snippet.replace(/<\/?mark>/g, '')).toContain('drag launch for the wrenshaw night');
  });
});
