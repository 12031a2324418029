import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { routeTable } from '../../server/routes';
import { isMutating, type RouteDef } from '../../server/lib/route';
import { createClient, createTestApp, type TestApp, type TestClient } from '../setup/test-app';
import { signedInClient } from '../factories/user';

// Generated from the route table: every state-changing route refuses a request without the
// synchronizer token, or with someone else's or a made-up one, before access checks or handlers run.
let t: TestApp;
let visitor: TestClient;
let otherToken: string;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  visitor = createClient(t.app);
  await visitor.get('/api/csrf').expect(200); // a visitor with a session (and so a token of its own)
  const other = createClient(t.app);
  otherToken = (await other.get('/api/csrf').expect(200)).body.data.token;
});
afterAll(async () => {
  await t.close();
});

const mutating = routeTable.filter((r) => isMutating(r.method));
const concrete = (path: string) =>
  path.replace(/:([A-Za-z0-9_]+)/g, (_m, name: string) => (/id$/i.test(name) ? '00000000-0000-4000-8000-000000000000' : name === 'n' ? '1' : 'drag-brake'));

function send(client: TestClient | null, route: RouteDef, token?: string) {
  const agent = client ? client.agent : request(t.app);
  let req = agent[route.method](concrete(route.path));
  if (token !== undefined) req = req.set('x-csrf-token', token);
  return route.multipart ? req : req.send({});
}

function expectRefused(res: request.Response, who: string) {
  expect(res.status, who).toBe(403);
  expect(res.body.error.code, who).toBe('csrf_invalid');
}

describe('CSRF on every state-changing route', () => {
  it('protects every state-changing route (all live under /api, where the check is mounted)', () => {
    expect(mutating.length).toBeGreaterThan(5);
    for (const r of mutating) expect(r.path.startsWith('/api/'), r.path).toBe(true);
  });

  for (const route of mutating) {
    it(`${route.method.toUpperCase()} ${route.path} needs the x-csrf-token header`, async () => {
      // A member of its own per route: the control call below may sign it out.
      const { client: member } = await signedInClient(t, 'member');
      expectRefused(await send(member, route), 'member without token');
      expectRefused(await send(visitor, route), 'visitor without token');
      expectRefused(await send(null, route), 'no session at all');
      expectRefused(await send(member, route, 'not-the-token'), 'member with a made-up token');
      expectRefused(await send(member, route, otherToken), "member with another session's token");
      expectRefused(await send(member, route, ''), 'member with an empty token');
      // Control: with the right token the request gets past the check (whatever the handler then says).
      const ok = await (route.multipart
        ? member.agent[route.method](concrete(route.path)).set('x-csrf-token', await member.get('/api/csrf').then((r) => r.body.data.token))
        : member[route.method](concrete(route.path), {}));
      expect(ok.body?.error?.code, 'member with the token').not.toBe('csrf_invalid');
    });
  }

  it('does not accept the token from a query string or a form field instead of the header', async () => {
    const { client: member } = await signedInClient(t, 'member');
    const token = (await member.get('/api/csrf')).body.data.token as string;
    const viaQuery = await member.agent.patch(`/api/account?_csrf=${token}&csrfToken=${token}`).send({ displayName: 'Query Token' });
    expectRefused(viaQuery, 'token in the query');
    const viaBody = await member.agent.patch('/api/account').send({ displayName: 'Body Token', _csrf: token, csrfToken: token });
    expectRefused(viaBody, 'token in the body');
  });
});
