import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import { strFromU8, unzipSync } from 'fflate';
import { ROLE_RANK, ROLES, type Role } from '../../shared/constants';
import { routeTable } from '../../server/routes';
import type { RouteDef } from '../../server/lib/route';
import type { Response } from 'supertest';
import { seedParameters } from '../../server/db/seed-content';
import { buildOpenApi } from '../../server/lib/openapi';
import { UserEntity } from '../../server/modules/auth/user.entity';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { createUser, signedInClient } from '../factories/user';
import { createDraftGuide, createPublishedGuide, proposeEdit } from '../factories/guide';
import { buildSetupRecord } from '../factories/setup-record';
import { motorScenarios } from './authorization-matrix-motors';
import { imageScenarios } from './authorization-matrix-images';
import { uploadRun } from '../factories/run';

// Generated from the route table: every guarded route × every role, then every route that declares an
// ownership rule × owner / another member / moderator / admin / visitor.
let t: TestApp;
const clients = {} as Record<'visitor' | Role, TestClient>;
const accounts = {} as Record<Role, UserEntity>;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  // The parameter library: setup records are checked against it, and parameter edits need live entries.
  await seedParameters(t.db.dataSource);
  clients.visitor = createClient(t.app);
  for (const role of ROLES) {
    const { client, user } = await signedInClient(t, role);
    clients[role] = client;
    accounts[role] = user;
  }
});
afterAll(async () => {
  await t.close();
});

/** A concrete URL for a route path: ids become random UUIDs, slugs a plausible slug. */
function concretePath(path: string) {
  return path.replace(/:([A-Za-z]+)/g, (_m, name: string) => {
    if (/id$/i.test(name)) return crypto.randomUUID();
    if (name === 'n' || name === 'number') return '1';
    if (name === 'name') return 'gearing';
    return 'drag-brake';
  });
}

async function call(client: TestClient, route: RouteDef) {
  const url = concretePath(route.path);
  if (route.method === 'get') return client.get(url);
  return client[route.method](url, {});
}

const guarded = routeTable.filter((r) => r.access !== 'public');

describe('authorization matrix (every guarded route × visitor/member/moderator/admin)', () => {
  it('covers the admin and account routes', () => {
    const paths = guarded.map((r) => `${r.method.toUpperCase()} ${r.path}`);
    expect(paths).toEqual(expect.arrayContaining(['GET /api/admin/users', 'PATCH /api/admin/users/:id', 'PATCH /api/account', 'POST /api/account/password']));
  });

  for (const route of guarded) {
    it(`${route.method.toUpperCase()} ${route.path} (${route.access})`, async () => {
      const visitor = await call(clients.visitor, route);
      expect(visitor.status, 'visitor').toBe(401);
      expect(visitor.body.error.code).toBe('unauthenticated');
      for (const role of ROLES) {
        const res = await call(clients[role], route);
        if (ROLE_RANK[role] < ROLE_RANK[route.access as Role]) {
          expect(res.status, role).toBe(403);
          expect(res.body.error.code, role).toBe('role_required');
        } else {
          // Past the gate: whatever the handler says (often 400 for the empty body), it is not an access refusal.
          expect(res.status, role).not.toBe(401);
          expect(res.body?.error?.code, role).not.toBe('role_required');
          expect(res.status, role).toBeLessThan(500);
        }
      }
    });
  }
});

// ---------------------------------------------------------------------------------------------------
// Owner vs not owner. Each route declares `owner: { resource, rule }` in the route table; the rule's
// refusals are written once below (the project's policy) and every declared route has scenarios that
// build real data with the factories, call the route as each kind of caller and check status, error
// shape and that a refused caller changed nothing.
// ---------------------------------------------------------------------------------------------------

type Who = 'visitor' | 'owner' | 'stranger' | 'moderator' | 'admin';
type World = {
  owner: { client: TestClient; user: UserEntity; password: string };
  stranger: { client: TestClient; user: UserEntity };
  moderator: TestClient;
  admin: TestClient;
  visitor: TestClient;
};
type Arranged = {
  method: RouteDef['method'];
  url: string;
  body?: unknown;
  /** The owned id in the URL: a refusal by 404 must read exactly like the answer for an id never used. */
  id?: string;
  /** For routes addressed by number: the same call aimed at a version that does not exist. */
  missingUrl?: string;
  /** The owner's view of the resource; it must read the same after every call by someone else that is refused. */
  snapshot?: () => Promise<unknown>; /** A multipart file upload instead of a JSON body. */
  upload?: { body: Buffer; name: string; type: string };
};
type Expect = { status: number; code?: string; check?: (res: Response, a: Arranged, w: World) => unknown };
type Scenario = {
  label: string;
  /** Role of the fresh account that owns the resource (a member unless the route is for moderators or admins). */
  ownerRole?: Role;
  arrange: (w: World) => Promise<Arranged>;
  /** The successes (at least the owner's) and, for list routes, what each caller sees instead of a refusal. */
  expect: Partial<Record<Who, Expect>>;
  /** Callers whose call must leave the owner's snapshot as it was even though it succeeds (self routes). */
  untouchedBy?: Who[];
};

const err = (status: number, code: string): Expect => ({ status, code });
const MISSING = '00000000-0000-4000-8000-000000000000';

/**
 * The refusals each rule promises, per caller (the owner's own answer comes from the scenario). Revisions:
 * whoever cannot see the revision gets 404 (as for an id that does not exist), whoever can see it
 * (moderators) 403 `not_own_revision`. Uploads are private: 404 for everyone but the owner, moderators
 * and admins included. Member routes answer 401 to visitors before any ownership rule.
 */
function refusals(route: RouteDef): Partial<Record<Who, Expect>> {
  const rule = route.owner!;
  const signIn: Partial<Record<Who, Expect>> = route.access === 'public' ? {} : { visitor: err(401, 'unauthenticated') };
  const gate = (who: Role): Expect | undefined =>
    route.access !== 'public' && ROLE_RANK[who] < ROLE_RANK[route.access as Role] ? err(403, 'role_required') : undefined;
  const below = Object.fromEntries((['member', 'moderator'] as const).flatMap((r) => (gate(r) ? [[r === 'member' ? 'stranger' : 'moderator', gate(r)!]] : [])));
  const key = `${rule.resource}:${rule.rule}`;
  const byRule: Record<string, Partial<Record<Who, Expect>>> = {
    'revision:owner': { stranger: err(404, 'not_found'), moderator: err(403, 'not_own_revision'), admin: err(403, 'not_own_revision') },
    'revision:owner-or-moderator': { stranger: err(404, 'not_found'), ...(route.access === 'public' ? { visitor: err(404, 'not_found') } : {}) },
    'revision:not-owner': { owner: err(403, 'own_revision') },
    'setup-upload:owner': {
      stranger: err(404, 'not_found'),
      moderator: err(404, 'not_found'),
      admin: err(404, 'not_found'),
      ...(route.access === 'public' ? { visitor: err(404, 'not_found') } : {}),
    },
    'run:owner': {
      stranger: err(404, 'not_found'),
      moderator: err(404, 'not_found'),
      admin: err(404, 'not_found'),
      ...(route.access === 'public' ? { visitor: err(404, 'not_found') } : {}),
    },
    'account:not-owner': { owner: err(409, 'cannot_change_self') },
    'image:owner-or-moderator': { stranger: err(404, 'not_found'), visitor: err(404, 'not_found') },
    'motor:owner': { stranger: err(404, 'not_found'), moderator: err(404, 'not_found'), admin: err(404, 'not_found') },
  };
  return { ...signIn, ...(byRule[key] ?? {}), ...below };
}

const ownerRoutes = routeTable.filter((r) => r.owner);
const label = (r: RouteDef) => `${r.method.toUpperCase()} ${r.path}`;

/** A multipart upload on the client's session (the client helper only sends JSON); wrapped, since a supertest request is thenable. */
async function uploadSetup(client: TestClient, name: string) {
  const token = (await client.agent.get('/api/csrf')).body.data.token as string;
  const body = JSON.stringify(buildSetupRecord({ notes: `Uploaded as ${name}` }));
  const res = await client.agent
    .post('/api/setups')
    .set('x-csrf-token', token)
    .attach('file', Buffer.from(body), { filename: name, contentType: 'application/json' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { id: res.body.data.id as string, body };
}

const revisionOf = (w: World, id: string) => async () => (await w.owner.client.get(`/api/revisions/${id}`)).body;
const uploadOf = (w: World, id: string) => async () => (await w.owner.client.get(`/api/setups/${id}`)).body;
const userRow = (id: string) => async () => {
  const u = await t.db.dataSource.getRepository(UserEntity).findOneByOrFail({ id });
  return { displayName: u.displayName, role: u.role, passwordHash: u.passwordHash, disabledAt: u.disabledAt };
};
async function submitted(w: World) {
  const { revision } = await createDraftGuide(w.owner.client);
  const res = await w.owner.client.post(`/api/revisions/${revision.id}/submit`, { note: 'Ready for a second pair of eyes' });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return revision.id;
}
const isRevision = (state: string) => (res: Response, a: Arranged) => {
  expect(res.body.data.revision.id).toBe(a.id);
  expect(res.body.data.revision.state).toBe(state);
};
const ok = (check?: Expect['check']): Expect => ({ status: 200, check });
const NEW_SUMMARY = 'After the re-layout: less punch out of the hairpin, a touch more drag brake into it.';

/** Scenarios for the history, permalink and compare routes of one document kind. */
function documentScenarios(kind: 'guides' | 'parameters'): Record<string, Scenario[]> {
  /** The owner's draft of this kind: a new guide (no live version at all) or an edit of a live parameter entry. */
  const draft = async (w: World) => {
    if (kind === 'guides') {
      const { slug, revision } = await createDraftGuide(w.owner.client);
      return { slug, number: revision.number, id: revision.id };
    }
    const rev = await proposeEdit(w.owner.client, 'drag-brake', { note: 'Clearer words for the hairpin' }, 'parameters');
    return { slug: 'drag-brake', number: rev.number, id: rev.id };
  };
  const listed = (seen: boolean) => (res: Response, a: Arranged) =>
    expect(
      (res.body.data as Array<{ id: string }>).some((r) => r.id === a.id),
      seen ? 'listed' : 'left out',
    ).toBe(seen);
  const permalink = (res: Response, a: Arranged) => expect(res.body.data.revision.id).toBe(a.id);
  return {
    [`GET /api/${kind}/:slug/revisions`]: [
      {
        label: "the owner's unpublished draft in the history",
        arrange: async (w) => {
          const d = await draft(w);
          return { method: 'get', url: `/api/${kind}/${d.slug}/revisions`, id: d.id, missingUrl: `/api/${kind}/never-used-slug-${d.number}/revisions` };
        },
        // A list, so others get it without the draft rather than a refusal; but a guide that was never live
        // does not exist for them at all (the answer an unused slug gets).
        expect:
          kind === 'guides'
            ? { owner: ok(listed(true)), moderator: ok(listed(true)), admin: ok(listed(true)), stranger: err(404, 'not_found'), visitor: err(404, 'not_found') }
            : { owner: ok(listed(true)), moderator: ok(listed(true)), admin: ok(listed(true)), stranger: ok(listed(false)), visitor: ok(listed(false)) },
      },
    ],
    [`GET /api/${kind}/:slug/revisions/:n`]: [
      {
        label: "the owner's draft by number",
        arrange: async (w) => {
          const d = await draft(w);
          return { method: 'get', url: `/api/${kind}/${d.slug}/revisions/${d.number}`, id: d.id, missingUrl: `/api/${kind}/${d.slug}/revisions/9999` };
        },
        expect: { owner: ok(permalink), moderator: ok(permalink), admin: ok(permalink) },
      },
    ],
    [`GET /api/${kind}/:slug/compare`]: [
      {
        label: "the live version against the owner's draft",
        arrange: async (w) => {
          let slug = 'drag-brake';
          let draftNumber: number;
          let live: number;
          if (kind === 'guides') {
            slug = (await createPublishedGuide(w.owner.client, w.moderator)).slug;
            draftNumber = (await proposeEdit(w.owner.client, slug, { summary: NEW_SUMMARY })).number;
            live = 1;
          } else {
            const rev = await proposeEdit(w.owner.client, slug, { summary: NEW_SUMMARY }, 'parameters');
            draftNumber = rev.number;
            live = (await clients.visitor.get(`/api/parameters/${slug}/revisions`)).body.data.find((r: { state: string }) => r.state === 'published').number;
          }
          return {
            method: 'get',
            url: `/api/${kind}/${slug}/compare?from=${live}&to=${draftNumber}`,
            missingUrl: `/api/${kind}/${slug}/compare?from=${live}&to=9999`,
          };
        },
        expect: Object.fromEntries(
          (['owner', 'moderator', 'admin'] as const).map((who) => [
            who,
            ok((res) => expect(res.body.data.changedFields.map((f: { field: string }) => f.field)).toContain('summary')),
          ]),
        ),
      },
    ],
  };
}

const scenarios: Record<string, Scenario[]> = {
  ...motorScenarios,
  ...imageScenarios,
  ...documentScenarios('guides'),
  ...documentScenarios('parameters'),
  'GET /api/revisions/:id': [
    {
      label: "the owner's draft",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        return { method: 'get', url: `/api/revisions/${revision.id}`, id: revision.id };
      },
      expect: { owner: ok(isRevision('draft')), moderator: ok(isRevision('draft')), admin: ok(isRevision('draft')) },
    },
  ],
  'PATCH /api/revisions/:id': [
    {
      label: "autosave of the owner's draft",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        return { method: 'patch', url: `/api/revisions/${revision.id}`, body: { summary: NEW_SUMMARY }, id: revision.id, snapshot: revisionOf(w, revision.id) };
      },
      expect: { owner: ok((res) => expect(res.body.data.revision.content.summary).toBe(NEW_SUMMARY)) },
    },
    {
      // Anyone can see a live revision, so a member is told 403 (not 404): there is nothing to hide.
      label: 'a live revision (visible to all, changed by none)',
      arrange: async (w) => {
        const { revisionId } = await createPublishedGuide(w.owner.client, w.moderator);
        return { method: 'patch', url: `/api/revisions/${revisionId}`, body: { summary: NEW_SUMMARY }, id: revisionId, snapshot: revisionOf(w, revisionId) };
      },
      expect: { stranger: err(403, 'not_own_revision'), owner: err(409, 'immutable_revision') },
    },
  ],
  'DELETE /api/revisions/:id': [
    {
      label: "the owner's draft discarded",
      arrange: async (w) => {
        const { slug } = await createPublishedGuide(w.owner.client, w.moderator);
        const revision = await proposeEdit(w.owner.client, slug, { summary: NEW_SUMMARY });
        return { method: 'delete', url: `/api/revisions/${revision.id}`, id: revision.id, snapshot: revisionOf(w, revision.id) };
      },
      expect: { owner: { status: 204, check: async (_res, a, w) => expect((await w.owner.client.get(`/api/revisions/${a.id}`)).status).toBe(404) } },
    },
    {
      label: 'a live revision (visible to all, discarded by none)',
      arrange: async (w) => {
        const { revisionId } = await createPublishedGuide(w.owner.client, w.moderator);
        return { method: 'delete', url: `/api/revisions/${revisionId}`, id: revisionId, snapshot: revisionOf(w, revisionId) };
      },
      expect: { stranger: err(403, 'not_own_revision'), owner: err(409, 'immutable_revision') },
    },
  ],
  'POST /api/revisions/:id/submit': [
    {
      label: "the owner's draft sent for review",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        return {
          method: 'post',
          url: `/api/revisions/${revision.id}/submit`,
          body: { note: 'Ready for review' },
          id: revision.id,
          snapshot: revisionOf(w, revision.id),
        };
      },
      expect: { owner: ok(isRevision('in_review')) },
    },
  ],
  'POST /api/revisions/:id/withdraw': [
    {
      label: "the owner's proposal withdrawn",
      arrange: async (w) => {
        const id = await submitted(w);
        return { method: 'post', url: `/api/revisions/${id}/withdraw`, id, snapshot: revisionOf(w, id) };
      },
      expect: { owner: ok(isRevision('draft')) },
    },
  ],
  'POST /api/revisions/:id/rebase': [
    {
      label: "the owner's edit of a live guide merged with the live version",
      arrange: async (w) => {
        const { slug, revisionId: live } = await createPublishedGuide(w.owner.client, w.moderator);
        const edit = await proposeEdit(w.owner.client, slug, { summary: NEW_SUMMARY });
        return { method: 'post', url: `/api/revisions/${edit.id}/rebase`, id: edit.id, snapshot: revisionOf(w, edit.id), live } as Arranged & { live: string };
      },
      expect: { owner: ok((res, a) => expect(res.body.data.currentRevisionId).toBe((a as Arranged & { live: string }).live)) },
    },
  ],
  'PUT /api/revisions/:id/setup': [
    {
      label: "a baseline attached to the owner's draft",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        return {
          method: 'put',
          url: `/api/revisions/${revision.id}/setup`,
          body: buildSetupRecord({ notes: 'Owner baseline' }),
          id: revision.id,
          snapshot: revisionOf(w, revision.id),
        };
      },
      expect: { owner: ok((res) => expect(res.body.data.notes).toBe('Owner baseline')) },
    },
    {
      label: 'a live revision (visible to all, changed by none)',
      arrange: async (w) => {
        const { revisionId } = await createPublishedGuide(w.owner.client, w.moderator);
        return { method: 'put', url: `/api/revisions/${revisionId}/setup`, body: buildSetupRecord(), id: revisionId, snapshot: revisionOf(w, revisionId) };
      },
      expect: { stranger: err(403, 'not_own_revision'), owner: err(409, 'not_draft') },
    },
  ],
  'DELETE /api/revisions/:id/setup': [
    {
      label: "the baseline removed from the owner's draft",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        expect((await w.owner.client.put(`/api/revisions/${revision.id}/setup`, buildSetupRecord())).status).toBe(200);
        return { method: 'delete', url: `/api/revisions/${revision.id}/setup`, id: revision.id, snapshot: revisionOf(w, revision.id) };
      },
      expect: {
        owner: { status: 204, check: async (_res, a, w) => expect((await w.owner.client.get(`/api/revisions/${a.id}`)).body.data.revision.setup).toBeNull() },
      },
    },
  ],
  'GET /api/me/revisions': [
    {
      label: "each caller's own drafts only",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        return { method: 'get', url: '/api/me/revisions', id: revision.id };
      },
      expect: Object.fromEntries(
        (['owner', 'stranger', 'moderator', 'admin'] as const).map((who) => [
          who,
          ok((res, a) =>
            expect(
              (res.body.data as Array<{ id: string }>).some((r) => r.id === a.id),
              who,
            ).toBe(who === 'owner'),
          ),
        ]),
      ),
    },
  ],
  'GET /api/reviews/count': [
    {
      label: "the author's own proposal is not counted for them",
      ownerRole: 'moderator',
      arrange: async (w) => {
        const count = async (c: TestClient) => (await c.get('/api/reviews/count')).body.data.count as number;
        const before = { owner: await count(w.owner.client), moderator: await count(w.moderator) };
        await submitted(w);
        return { method: 'get', url: '/api/reviews/count', before } as Arranged & { before: typeof before };
      },
      expect: {
        owner: ok((res, a) => expect(res.body.data.count).toBe((a as Arranged & { before: { owner: number } }).before.owner)),
        moderator: ok((res, a) => expect(res.body.data.count).toBe((a as Arranged & { before: { moderator: number } }).before.moderator + 1)),
      },
    },
  ],
  'GET /api/reviews': [
    {
      label: 'the queue marks the caller’s own proposal',
      ownerRole: 'moderator',
      arrange: async (w) => ({ method: 'get', url: '/api/reviews', id: await submitted(w) }),
      expect: Object.fromEntries(
        (['owner', 'moderator', 'admin'] as const).map((who) => [
          who,
          ok((res, a) =>
            expect((res.body.data as Array<{ revisionId: string; own: boolean }>).find((i) => i.revisionId === a.id)?.own, who).toBe(who === 'owner'),
          ),
        ]),
      ),
    },
  ],
  'GET /api/reviews/:revisionId': [
    {
      label: 'a proposal read by its author and by other moderators',
      ownerRole: 'moderator',
      arrange: async (w) => {
        const id = await submitted(w);
        return { method: 'get', url: `/api/reviews/${id}`, id };
      },
      expect: Object.fromEntries(
        (['owner', 'moderator', 'admin'] as const).map((who) => [who, ok((res) => expect(res.body.data.own, who).toBe(who === 'owner'))]),
      ),
    },
  ],
  'POST /api/reviews/:revisionId/publish': [
    {
      label: "a moderator's own proposal",
      ownerRole: 'moderator',
      arrange: async (w) => {
        const id = await submitted(w);
        return { method: 'post', url: `/api/reviews/${id}/publish`, id, snapshot: revisionOf(w, id) };
      },
      expect: { moderator: ok(isRevision('published')) },
    },
  ],
  'POST /api/reviews/:revisionId/return': [
    {
      label: "a moderator's own proposal",
      ownerRole: 'moderator',
      arrange: async (w) => {
        const id = await submitted(w);
        return { method: 'post', url: `/api/reviews/${id}/return`, body: { reason: 'The gearing table needs the tyre size' }, id, snapshot: revisionOf(w, id) };
      },
      expect: { moderator: ok(isRevision('returned')) },
    },
  ],
  'GET /api/setups': [
    {
      label: "each caller's own uploads only",
      arrange: async (w) => ({ method: 'get', url: '/api/setups', id: (await uploadSetup(w.owner.client, 'owner-library.json')).id }),
      expect: Object.fromEntries(
        (['owner', 'stranger', 'moderator', 'admin', 'visitor'] as const).map((who) => [
          who,
          ok((res, a) =>
            expect(
              (res.body.data.uploads as Array<{ id: string }>).some((u) => u.id === a.id),
              who,
            ).toBe(who === 'owner'),
          ),
        ]),
      ),
    },
  ],
  'GET /api/setups/compare': [
    {
      label: "two of the owner's uploads",
      arrange: async (w) => {
        const [one, two] = [await uploadSetup(w.owner.client, 'owner-a.json'), await uploadSetup(w.owner.client, 'owner-b.json')];
        return { method: 'get', url: `/api/setups/compare?a=${one.id}&b=${two.id}`, id: one.id };
      },
      expect: { owner: ok((res, a) => expect(res.body.data.a.ref).toBe(a.id)) },
    },
  ],
  'GET /api/setups/:id': [
    {
      label: "the owner's upload",
      arrange: async (w) => {
        const { id } = await uploadSetup(w.owner.client, 'owner-read.json');
        return { method: 'get', url: `/api/setups/${id}`, id };
      },
      expect: { owner: ok((res, a) => expect(res.body.data.id).toBe(a.id)) },
    },
  ],
  'GET /api/setups/:id/download': [
    {
      label: "the owner's upload as it was sent",
      arrange: async (w) => {
        const { id, body } = await uploadSetup(w.owner.client, 'owner-download.json');
        return { method: 'get', url: `/api/setups/${id}/download`, id, sent: body } as Arranged & { sent: string };
      },
      expect: { owner: ok((res, a) => expect(res.text).toBe((a as Arranged & { sent: string }).sent)) },
    },
  ],
  'DELETE /api/setups/:id': [
    {
      label: "the owner's upload deleted",
      arrange: async (w) => {
        const { id } = await uploadSetup(w.owner.client, 'owner-delete.json');
        return { method: 'delete', url: `/api/setups/${id}`, id, snapshot: uploadOf(w, id) };
      },
      expect: { owner: { status: 204, check: async (_res, a, w) => expect((await w.owner.client.get(`/api/setups/${a.id}`)).status).toBe(404) } },
    },
  ],
  'GET /api/runs': [
    {
      label: "each caller's own runs only",
      arrange: async (w) => ({ method: 'get', url: '/api/runs', id: await uploadRun(w.owner.client, { name: 'owner-list.csv' }) }),
      expect: {
        ...Object.fromEntries(
          (['owner', 'stranger', 'moderator', 'admin'] as const).map((who) => [
            who,
            ok((res, a) =>
              expect(
                (res.body.data as Array<{ id: string }>).some((r) => r.id === a.id),
                who,
              ).toBe(who === 'owner'),
            ),
          ]),
        ),
        visitor: err(401, 'unauthenticated'),
      },
    },
  ],
  'GET /api/runs/compare': [
    {
      label: "two of the owner's runs",
      arrange: async (w) => {
        const [one, two] = [await uploadRun(w.owner.client), await uploadRun(w.owner.client)];
        return { method: 'get', url: `/api/runs/compare?a=${one}&b=${two}`, id: one };
      },
      expect: { owner: ok((res, a) => expect(res.body.data.a.id).toBe(a.id)) },
    },
  ],
  'GET /api/runs/:id': [
    {
      label: "the owner's private run",
      arrange: async (w) => {
        const id = await uploadRun(w.owner.client);
        return { method: 'get', url: `/api/runs/${id}`, id };
      },
      expect: { owner: ok((res, a) => expect(res.body.data).toMatchObject({ id: a.id, isOwn: true })) },
    },
  ],
  'GET /api/runs/:id/series': [
    {
      label: "the owner's private run's chart data",
      arrange: async (w) => {
        const id = await uploadRun(w.owner.client);
        return { method: 'get', url: `/api/runs/${id}/series?points=50`, id };
      },
      expect: { owner: ok((res) => expect(res.body.data.t.length).toBeGreaterThan(0)) },
    },
  ],
  'PATCH /api/runs/:id': [
    {
      label: "the owner's run attached to the owner's setup",
      arrange: async (w) => {
        const id = await uploadRun(w.owner.client);
        const setup = await uploadSetup(w.owner.client, 'owner-run-setup.json');
        return {
          method: 'patch',
          url: `/api/runs/${id}`,
          body: { setupId: setup.id },
          id,
          snapshot: async () => (await w.owner.client.get(`/api/runs/${id}`)).body,
        };
      },
      expect: { owner: ok((res, a) => expect(res.body.data).toMatchObject({ id: a.id, setupLabel: 'owner-run-setup.json' })) },
    },
  ],
  'DELETE /api/runs/:id': [
    {
      label: "the owner's run deleted",
      arrange: async (w) => {
        const id = await uploadRun(w.owner.client);
        return { method: 'delete', url: `/api/runs/${id}`, id, snapshot: async () => (await w.owner.client.get(`/api/runs/${id}`)).body };
      },
      expect: { owner: { status: 204, check: async (_res, a, w) => expect((await w.owner.client.get(`/api/runs/${a.id}`)).status).toBe(404) } },
    },
  ],
  'GET /api/revisions/:id/runs': [
    {
      label: "runs on the owner's draft",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        const run = await uploadRun(w.owner.client);
        expect((await w.owner.client.put(`/api/revisions/${revision.id}/runs/${run}`)).status).toBe(200);
        return { method: 'get', url: `/api/revisions/${revision.id}/runs`, id: revision.id };
      },
      expect: Object.fromEntries((['owner', 'moderator', 'admin'] as const).map((who) => [who, ok((res) => expect(res.body.data.length, who).toBe(1))])),
    },
  ],
  'PUT /api/revisions/:id/runs/:runId': [
    {
      label: "the owner's run offered on the owner's draft",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        const run = await uploadRun(w.owner.client);
        return {
          method: 'put',
          url: `/api/revisions/${revision.id}/runs/${run}`,
          id: revision.id,
          snapshot: async () => (await w.owner.client.get(`/api/revisions/${revision.id}/runs`)).body,
        };
      },
      expect: { owner: ok((res) => expect(res.body.data.length).toBe(1)) },
    },
  ],
  'DELETE /api/revisions/:id/runs/:runId': [
    {
      label: "a run taken off the owner's draft",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        const run = await uploadRun(w.owner.client);
        expect((await w.owner.client.put(`/api/revisions/${revision.id}/runs/${run}`)).status).toBe(200);
        return {
          method: 'delete',
          url: `/api/revisions/${revision.id}/runs/${run}`,
          id: revision.id,
          snapshot: async () => (await w.owner.client.get(`/api/revisions/${revision.id}/runs`)).body,
        };
      },
      expect: { owner: { status: 204, check: async (_res, a, w) => expect((await w.owner.client.get(`/api/revisions/${a.id}/runs`)).body.data).toEqual([]) } },
    },
  ],
  'GET /api/auth/me': [
    {
      label: 'each caller sees their own account',
      arrange: async () => ({ method: 'get', url: '/api/auth/me' }),
      expect: {
        ...Object.fromEntries(
          (['owner', 'stranger'] as const).map((who) => [who, ok((res, _a, w) => expect(res.body.data.user.id, who).toBe(w[who].user.id))]),
        ),
        moderator: ok((res) => expect(res.body.data.user.id).toBe(accounts.moderator.id)),
        visitor: ok((res) => expect(res.body.data.user).toBeNull()),
      },
    },
  ],
  'POST /api/auth/sign-out': [
    {
      label: "another member's sign-out leaves the owner's session alone",
      arrange: async (w) => ({ method: 'post', url: '/api/auth/sign-out', snapshot: async () => (await w.owner.client.get('/api/auth/me')).body }),
      expect: {
        visitor: { status: 204 },
        stranger: { status: 204, check: async (_res, _a, w) => expect((await w.stranger.client.get('/api/auth/me')).body.data.user).toBeNull() },
        owner: { status: 204, check: async (_res, _a, w) => expect((await w.owner.client.get('/api/auth/me')).body.data.user).toBeNull() },
      },
      untouchedBy: ['stranger', 'visitor'],
    },
  ],
  'PATCH /api/account': [
    {
      // No id in the route; naming the owner's id in the body changes nothing but the caller's own name.
      label: "a body naming the owner's id changes only the caller",
      arrange: async (w) => ({
        method: 'patch',
        url: '/api/account',
        body: { displayName: 'Renamed Racer', id: w.owner.user.id },
        snapshot: userRow(w.owner.user.id),
      }),
      expect: {
        stranger: ok((res, _a, w) => expect(res.body.data.user).toMatchObject({ id: w.stranger.user.id, displayName: 'Renamed Racer' })),
        owner: ok((res, _a, w) => expect(res.body.data.user).toMatchObject({ id: w.owner.user.id, displayName: 'Renamed Racer' })),
      },
      untouchedBy: ['stranger'],
    },
  ],
  'POST /api/account/password': [
    {
      label: "the owner's current password is no key to anyone else's account",
      arrange: async (w) => ({
        method: 'post',
        url: '/api/account/password',
        body: { currentPassword: w.owner.password, newPassword: 'harbour-lantern-pinion-93' },
        snapshot: userRow(w.owner.user.id),
      }),
      expect: {
        stranger: {
          status: 400,
          code: 'validation_failed',
          check: (res) => expect(res.body.error.details).toEqual([{ path: 'body.currentPassword', message: 'That is not your current password' }]),
        },
        moderator: { status: 400, code: 'validation_failed' },
        owner: ok(async (res, _a, w) => {
          expect(res.body.data.user.id).toBe(w.owner.user.id);
          const again = await createClient(t.app).post('/api/auth/sign-in', { email: w.owner.user.email, password: 'harbour-lantern-pinion-93' });
          expect(again.status).toBe(200);
        }),
      },
    },
  ],
  'GET /api/account/export': [
    {
      label: "each caller's archive holds only their own data",
      arrange: async (w) => {
        const title = `Owner's private draft ${crypto.randomBytes(3).toString('hex')}`;
        await createDraftGuide(w.owner.client, { title });
        return { method: 'get', url: '/api/account/export', title } as Arranged & { title: string };
      },
      expect: Object.fromEntries(
        (['owner', 'stranger', 'moderator', 'admin'] as const).map((who) => [
          who,
          {
            status: 200,
            check: async (res: Response, a: Arranged, w: World) => {
              expect(res.headers['content-type'], who).toBe('application/zip');
              // Read the archive again as bytes and look inside: the caller's own profile, the owner's draft only for the owner.
              const files = await exportedFiles(clientOf(w, who));
              const profile = JSON.parse(strFromU8(files['tunewright-data/profile.json'])) as { id: string };
              expect(profile.id, who).toBe(who === 'owner' || who === 'stranger' ? w[who].user.id : accounts[who].id);
              const all = Object.values(files)
                .map((f) => strFromU8(f))
                .join('\n');
              expect(all.includes((a as Arranged & { title: string }).title), who).toBe(who === 'owner');
            },
          },
        ]),
      ),
    },
  ],
  'DELETE /api/account': [
    {
      label: "the owner's password is no key to anyone else's account",
      arrange: async (w) => ({
        method: 'delete',
        url: '/api/account',
        body: { currentPassword: w.owner.password },
        snapshot: userRow(w.owner.user.id),
      }),
      expect: {
        stranger: { status: 400, code: 'validation_failed' },
        moderator: { status: 400, code: 'validation_failed' },
        admin: { status: 400, code: 'validation_failed' },
        owner: {
          status: 204,
          check: async (_res, _a, w) => {
            const row = await t.db.dataSource.getRepository(UserEntity).findOneByOrFail({ id: w.owner.user.id });
            expect(row.deletedAt).not.toBeNull();
          },
        },
      },
    },
  ],
  'GET /api/watches': [
    {
      label: 'each person sees only their own watch list',
      arrange: async (w) => {
        // Its author watches it by default.
        await createPublishedGuide(w.owner.client, w.moderator, { title: `Owner's watched guide ${crypto.randomBytes(3).toString('hex')}` });
        return { method: 'get', url: '/api/watches', snapshot: async () => (await w.owner.client.get('/api/watches')).body };
      },
      expect: {
        owner: ok((res) => expect(res.body.data.map((x: { title: string }) => x.title)).toEqual([expect.stringMatching(/^Owner's watched guide/)])),
        stranger: ok((res) => expect(res.body.data).toEqual([])),
        moderator: ok((res) =>
          expect(res.body.data.map((x: { title: string }) => x.title)).not.toContainEqual(expect.stringMatching(/^Owner's watched guide/)),
        ),
      },
    },
  ],
  'GET /api/watches/settings': [
    {
      label: 'each person reads only their own mail setting',
      arrange: async (w) => {
        expect((await w.owner.client.put('/api/watches/settings', { delivery: 'daily' })).status).toBe(200);
        return { method: 'get', url: '/api/watches/settings', snapshot: async () => (await w.owner.client.get('/api/watches/settings')).body };
      },
      expect: {
        owner: ok((res) => expect(res.body.data).toEqual({ delivery: 'daily' })),
        stranger: ok((res) => expect(res.body.data).toEqual({ delivery: 'immediate' })),
      },
    },
  ],
  'PUT /api/watches/settings': [
    {
      label: "setting one's own delivery never changes the owner's",
      arrange: async (w) => {
        expect((await w.owner.client.put('/api/watches/settings', { delivery: 'off' })).status).toBe(200);
        return {
          method: 'put',
          url: '/api/watches/settings',
          body: { delivery: 'daily' },
          snapshot: async () => (await w.owner.client.get('/api/watches/settings')).body,
        };
      },
      // The owner goes last (successes keep this order), after the others' calls were checked against the snapshot.
      expect: { stranger: ok(), moderator: ok(), owner: ok((res) => expect(res.body.data).toEqual({ delivery: 'daily' })) },
      untouchedBy: ['stranger', 'moderator'],
    },
  ],
  'PATCH /api/admin/users/:id': [
    {
      label: 'an administrator changing their own role',
      ownerRole: 'admin',
      arrange: async (w) => ({
        method: 'patch',
        url: `/api/admin/users/${w.owner.user.id}`,
        body: { role: 'moderator', reason: 'Covers the spring series reviews' },
        snapshot: userRow(w.owner.user.id),
      }),
      // Another administrator may; the account holder may not (an admin can never lock the last admin out).
      expect: { admin: ok((res, _a, w) => expect(res.body.data.user).toMatchObject({ id: w.owner.user.id, role: 'moderator' })) },
    },
  ],
};

function expectError(res: Response, status: number, code: string, who: string) {
  expect(res.status, `${who}: ${JSON.stringify(res.body)}`).toBe(status);
  const { details, ...rest } = res.body.error ?? {};
  expect(rest, who).toEqual({ code, message: expect.any(String) });
  expect(rest.message.length, who).toBeGreaterThan(0);
  if (code === 'validation_failed')
    expect(details, who).toEqual(expect.arrayContaining([expect.objectContaining({ path: expect.any(String), message: expect.any(String) })]));
  else expect(details, who).toBeUndefined();
  expect(Object.keys(res.body), who).toEqual(['error']);
}

const clientOf = (w: World, who: Who): TestClient => (who === 'owner' || who === 'stranger' ? w[who].client : w[who]);

/** GET /api/account/export as bytes, unzipped. */
async function exportedFiles(client: TestClient) {
  const res = await client.agent
    .get('/api/account/export')
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
  expect(res.status).toBe(200);
  return unzipSync(new Uint8Array(res.body as Buffer));
}

async function send(client: TestClient, a: Arranged, url = a.url) {
  if (a.upload) {
    const token = (await client.agent.get('/api/csrf')).body.data.token as string;
    return client.agent.post(url).set('x-csrf-token', token).attach('file', a.upload.body, { filename: a.upload.name, contentType: a.upload.type });
  }
  if (a.method === 'get') return client.get(url);
  return client[a.method](url, a.body);
}

async function world(ownerRole: Role = 'member'): Promise<World> {
  // A password of its own: the factory's default is shared by every other test account.
  const { user, password } = await createUser(t, { role: ownerRole, password: `owner-${crypto.randomBytes(4).toString('hex')}-spur-lantern` });
  const owner = createClient(t.app);
  const signedIn = await owner.post('/api/auth/sign-in', { email: user.email, password });
  expect(signedIn.status).toBe(200);
  owner.resetCsrf();
  // A fresh visitor too: signing out as one would drop the shared visitor's CSRF token.
  return {
    owner: { client: owner, user, password },
    stranger: await signedInClient(t, 'member'),
    moderator: clients.moderator,
    admin: clients.admin,
    visitor: createClient(t.app),
  };
}

describe('authorization matrix: owner vs not owner (every route with an ownership rule)', () => {
  it('every route that takes an owned id, or works on /api/me or /api/account, declares its ownership rule', () => {
    const needs = routeTable.filter((r) => /:(id|[A-Za-z]+Id)\b/.test(r.path) || /^\/api\/(me|account)(\/|$)/.test(r.path));
    expect(needs.length).toBeGreaterThan(10);
    expect(needs.filter((r) => !r.owner).map(label)).toEqual([]);
    // `self` means there is no id to point at someone else's.
    expect(ownerRoutes.filter((r) => r.owner!.rule === 'self' && /:[A-Za-z]/.test(r.path)).map(label)).toEqual([]);
  });

  it('declares the known owner routes, and each declared route has scenarios here (and no scenario lacks its route)', () => {
    const declared = ownerRoutes.map(label);
    expect(declared).toEqual(
      expect.arrayContaining([
        'GET /api/revisions/:id',
        'PATCH /api/revisions/:id',
        'POST /api/revisions/:id/submit',
        'POST /api/revisions/:id/withdraw',
        'PUT /api/revisions/:id/setup',
        'GET /api/me/revisions',
        'GET /api/setups/:id/download',
        'GET /api/setups/compare',
        'POST /api/account/password',
        'POST /api/auth/sign-out',
        'POST /api/reviews/:revisionId/publish',
      ]),
    );
    expect(declared.filter((l) => !scenarios[l]?.length)).toEqual([]);
    expect(Object.keys(scenarios).filter((l) => !declared.includes(l))).toEqual([]);
  });

  it('the API document states each rule', () => {
    const doc = buildOpenApi(routeTable, { devTools: true }) as unknown as { paths: Record<string, Record<string, { description: string }>> };
    expect(doc.paths['/api/revisions/{id}'].patch.description).toContain("ownership: the revision's author only");
    expect(doc.paths['/api/setups/{id}'].get.description).toContain("ownership: the upload's owner only");
    expect(doc.paths['/api/reviews/{revisionId}/publish'].post.description).toContain("anyone allowed except the revision's author");
  });

  for (const route of ownerRoutes) {
    for (const scenario of scenarios[label(route)] ?? []) {
      const outcomes = { ...refusals(route), ...scenario.expect };
      const summary = (Object.entries(outcomes) as Array<[Who, Expect]>).map(([who, o]) => `${who} ${o.status}${o.code ? ` ${o.code}` : ''}`).join(', ');
      it(`${label(route)} [${route.owner!.resource}: ${route.owner!.rule}] ${scenario.label}: ${summary}`, async () => {
        const w = await world(scenario.ownerRole);
        const a = await scenario.arrange(w);
        const before = a.snapshot ? await a.snapshot() : undefined;
        // Refusals first, then successes, so a success that changes the resource (submit, delete) comes last.
        const order = (Object.keys(outcomes) as Who[]).sort((x, y) => Number(outcomes[x]!.status < 400) - Number(outcomes[y]!.status < 400));
        for (const who of order) {
          const o = outcomes[who]!;
          const res = await send(clientOf(w, who), a);
          if (o.code) {
            expectError(res, o.status, o.code, who);
            if (o.status === 404 && a.id && a.url.includes(a.id)) {
              // Told nothing: the same answer, word for word, as for an id no one ever used.
              const missing = await send(clientOf(w, who), a, a.url.replaceAll(a.id, MISSING));
              expect({ status: missing.status, body: missing.body }, `${who}: same as a missing id`).toEqual({ status: res.status, body: res.body });
            }
            if (o.status === 404 && a.missingUrl) {
              // The message names the version asked for; status and code are those of a version that never existed.
              const missing = await send(clientOf(w, who), a, a.missingUrl);
              expect({ status: missing.status, code: missing.body.error?.code }, `${who}: same as a missing version`).toEqual({ status: 404, code: o.code });
            }
          } else {
            expect(res.status, `${who}: ${JSON.stringify(res.body).slice(0, 400)}`).toBe(o.status);
          }
          await o.check?.(res, a, w);
          if (before !== undefined && who !== 'owner' && (o.status >= 400 || scenario.untouchedBy?.includes(who))) {
            expect(await a.snapshot!(), `${who} changed nothing of the owner's`).toEqual(before);
          }
        }
      });
    }
  }
});
