import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PARAMETER_CATEGORIES } from '../../shared/constants';
import { parameterDetailSchema, parameterLiveRevisionSchema, parameterSummarySchema } from '../../shared/schemas/parameter';
import { seed } from '../../server/db/seed';
import { readGuideDirs, readParameterFiles } from '../../server/db/seed-content';
import { signedInClient } from '../factories/user';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';

let t: TestApp;
let client: TestClient;
beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
  client = createClient(t.app);
});
afterAll(async () => {
  await t.close();
});

/** Slugs of guides whose live (last published) file lists the parameter, straight from the content files. */
function guidesDiscussing(slug: string) {
  return readGuideDirs()
    .flatMap((g) => {
      const live = g.revisions.filter((r) => r.state === 'published').at(-1);
      return live && live.content.parameters.includes(slug) ? [g.slug] : [];
    })
    .sort();
}

describe('GET /api/parameters', () => {
  it('lists every seeded entry (at least 24) in the summary shape, by category order then name', async () => {
    const res = await client.get('/api/parameters');
    expect(res.status).toBe(200);
    const list = res.body.data as { slug: string; name: string; category: (typeof PARAMETER_CATEGORIES)[number] }[];
    expect(list.length).toBeGreaterThanOrEqual(24);
    expect(list.length).toBe(readParameterFiles().length);
    for (const row of list) {
      expect(parameterSummarySchema.strict().safeParse(row).success, JSON.stringify(row)).toBe(true);
    }
    const order = list.map((p) => [PARAMETER_CATEGORIES.indexOf(p.category), p.name.toLowerCase()] as const);
    const sorted = [...order].sort((a, b) => a[0] - b[0] || a[1].localeCompare(b[1]));
    expect(order).toEqual(sorted);
    expect(list[0].category).toBe('throttle');
    const drag = list.find((p) => p.slug === 'drag-brake') as unknown as { aliases: string[]; unit: string; range: unknown };
    expect(drag.aliases).toContain('dragbreak');
    expect(drag.unit).toBe('%');
    expect(drag.range).toEqual({ min: 0, max: 100, step: 1 });
  });

  it('leaves out hidden entries', async () => {
    const { client: moderator } = await signedInClient(t, 'moderator');
    // Through the hide route, as a moderator would: it also tells the caches and the index.
    expect((await moderator.post('/api/parameters/soft-start/hide', { reason: 'Checking the hidden path' })).status).toBe(200);
    try {
      const res = await client.get('/api/parameters');
      expect(res.body.data.map((p: { slug: string }) => p.slug)).not.toContain('soft-start');
      expect((await client.get('/api/parameters/soft-start')).status).toBe(404);
    } finally {
      expect((await moderator.post('/api/parameters/soft-start/unhide', {})).status).toBe(200);
    }
  });
});

describe('GET /api/parameters/:slug', () => {
  it('returns the entry with body, related entries, calculator and its live revision', async () => {
    const res = await client.get('/api/parameters/ramped-advance');
    expect(res.status).toBe(200);
    const { parameter, revision } = res.body.data;
    expect(parameterDetailSchema.strict().safeParse(parameter).success).toBe(true);
    expect(parameterLiveRevisionSchema.safeParse(revision).success).toBe(true);
    expect(parameter.name).toBe('Ramped advance');
    expect(parameter.calculator).toBe('timing-curve');
    expect(parameter.body).toMatch(/## Cautions/);
    expect(parameter.body).toMatch(/```worked-example/);
    expect(parameter.related).toContain('ramp-start-rpm');
    expect(parameter.relatedParameters.map((r: { slug: string }) => r.slug)).toEqual(parameter.related);
    expect(parameter.relatedParameters[0].name).toBe('Ramp start rpm');
    expect(revision.number).toBe(1);
    expect(revision.author.displayName).toBe('Tunewright library');
    expect(Number.isNaN(Date.parse(revision.publishedAt))).toBe(false);
  });

  it('lists the published guides whose live version discusses the entry', async () => {
    const expected = guidesDiscussing('drag-brake');
    expect(expected.length).toBeGreaterThan(1);
    const res = await client.get('/api/parameters/drag-brake');
    const guides = res.body.data.parameter.guides as { slug: string; title: string; class: string; surface: string }[];
    expect(guides.map((g) => g.slug).sort()).toEqual(expected);
    // A guide that only exists as a proposal awaiting review is not shown.
    expect(guides.map((g) => g.slug)).not.toContain('mod-2wd-buggy-brackwater-astroturf');
    for (const g of guides) {
      expect(g.title.length).toBeGreaterThan(4);
      expect(g.class).toMatch(/^[a-z0-9-]+$/);
      expect(g.surface).toMatch(/^[a-z-]+$/);
    }
  });

  it('drops a guide once it is hidden', async () => {
    const [first] = guidesDiscussing('final-drive-ratio');
    await t.db.dataSource.query(`UPDATE documents SET hidden_at = now() WHERE kind = 'guide' AND slug = $1`, [first]);
    try {
      const res = await client.get('/api/parameters/final-drive-ratio');
      expect(res.body.data.parameter.guides.map((g: { slug: string }) => g.slug)).not.toContain(first);
    } finally {
      await t.db.dataSource.query(`UPDATE documents SET hidden_at = NULL WHERE slug = $1`, [first]);
    }
  });

  it('answers 404 in the error shape for an unknown slug, and 400 for a malformed one', async () => {
    const res = await client.get('/api/parameters/flux-capacitance');
    expect(res.status).toBe(404);
    expect(res.body.error).toMatchObject({ code: 'not_found' });
    expect(typeof res.body.error.message).toBe('string');
    const bad = await client.get('/api/parameters/Not_A_Slug');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('params.slug');
  });
});
