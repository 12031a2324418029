import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import { ROLE_RANK, ROLES, type Role } from '../../shared/constants';
import { routeTable } from '../../server/routes';
import type { RouteDef } from '../../server/lib/route';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';

// Generated from the route table: every guarded route × every role.
let t: TestApp;
const clients = {} as Record<'visitor' | Role, TestClient>;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  clients.visitor = createClient(t.app);
  for (const role of ROLES) clients[role] = (await signedInClient(t, role)).client;
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
