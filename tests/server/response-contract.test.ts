import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seed } from '../../server/db/seed';
import { routeTable } from '../../server/routes';
import type { RouteDef } from '../../server/lib/route';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { createPublishedGuide, proposeEdit } from '../factories/guide';
import { signedInClient } from '../factories/user';

// The one contract: what a route declares as its response (shared/schemas, shown in the OpenAPI
// document, read by the client's types) is what it really answers. Each request below is matched to
// its route in the route table and its `data` parsed with that route's declared schema.

let t: TestApp;
let author: TestClient;
let mod: TestClient;
let slug: string;
let proposalId: string;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: false, bcryptCost: 4 });
  author = (await signedInClient(t, 'member')).client;
  mod = (await signedInClient(t, 'moderator')).client;
  ({ slug } = await createPublishedGuide(author, mod, { title: 'Clay buggy drag brake baseline for the contract test' }));
  const edit = await proposeEdit(author, slug, { summary: 'A proposal whose review page the contract test reads.' });
  expect((await author.post(`/api/revisions/${edit.id}/submit`, { note: 'For review' })).status).toBe(200);
  proposalId = edit.id;
});
afterAll(async () => {
  await t?.close();
});

function routeFor(method: string, url: string): RouteDef {
  const path = url.split('?')[0];
  const matches = routeTable.filter(
    (r) =>
      r.method === method &&
      new RegExp(`^${r.path.replace(/:[A-Za-z]+/g, '[^/]+')}$`).test(path) &&
      !(r.path.includes(':') && routeTable.some((o) => o.method === method && o.path === path)),
  );
  if (matches.length !== 1) throw new Error(`${method} ${url}: ${matches.length} routes match`);
  return matches[0];
}

async function holds(client: TestClient, url: string) {
  const res = await client.get(url);
  expect(res.status, `${url}: ${JSON.stringify(res.body).slice(0, 300)}`).toBe(200);
  const route = routeFor('get', url);
  expect(route.response, `${route.path} declares no response`).toBeDefined();
  const parsed = route.response!.safeParse(res.body.data);
  expect(parsed.success ? [] : parsed.error.issues.slice(0, 5), `${url} against ${route.path}`).toEqual([]);
  return res.body.data;
}

describe('declared response schemas hold for real answers', () => {
  it('reading pages: guides, versions, history, compare, parameters, taxonomy, search', async () => {
    const visitor = createClient(t.app);
    await holds(visitor, '/api/taxonomy');
    expect((await holds(visitor, '/api/guides')).length).toBeGreaterThan(0);
    const detail = await holds(visitor, `/api/guides/${slug}`);
    expect(detail.revision.bodyHtml).toEqual(expect.any(String));
    await holds(visitor, `/api/guides/${slug}/revisions`);
    await holds(visitor, `/api/guides/${slug}/revisions/1`);
    await holds(mod, `/api/guides/${slug}/compare?from=1&to=2`);
    const params = await holds(visitor, '/api/parameters');
    expect(params.length).toBeGreaterThan(10);
    await holds(visitor, `/api/parameters/${params[0].slug}`);
    await holds(visitor, `/api/parameters/${params[0].slug}/revisions`);
    await holds(visitor, '/api/search?q=drag%20brake');
  });

  it('writing and reviewing: my revisions, one revision, the queue and a review', async () => {
    await holds(author, '/api/me/revisions');
    await holds(author, `/api/revisions/${proposalId}`);
    await holds(mod, '/api/reviews');
    await holds(mod, '/api/reviews/count');
    const review = await holds(mod, `/api/reviews/${proposalId}`);
    expect(review.changedFields.map((f: { field: string }) => f.field)).toContain('summary');
  });

  it('a schema that does not fit the answer is caught (the check can fail)', async () => {
    const res = await createClient(t.app).get(`/api/guides/${slug}`);
    const route = routeFor('get', '/api/parameters/x');
    expect(route.response!.safeParse(res.body.data).success).toBe(false);
  });
});
