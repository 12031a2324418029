import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { routeTable } from '../../server/routes';
import { isMutating, type RouteDef } from '../../server/lib/route';
import { apiErrorSchema } from '../../shared/schemas/common';
import { LIMITS } from '../../shared/constants';
import { calculatorNames } from '../../shared/calc/registry';
import { seed } from '../../server/db/seed';
import { createTestApp, type TestApp } from '../setup/test-app';
import { createUser } from '../factories/user';
import { fieldNames, validExample } from '../setup/schema-examples';
import { httpClient } from '../setup/http-client';

// Property-based bad input over the whole route table: whatever arrives, the answer is never a 5xx,
// and every refusal carries the one error shape. New routes are covered as soon as they are registered.
const RUNS = Number(process.env.FUZZ_RUNS ?? 25);
const VISITOR_RUNS = Math.max(3, Math.ceil(RUNS / 4));
const SEED = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : undefined;

let t: TestApp;
let admin: FuzzClient;
let visitor: FuzzClient;
let server: http.Server;
let cases = 0;
const known = { slugs: [] as string[], ids: [] as string[] };

type RawBody = { raw: string; type: string };
type Sent = { status: number; body: unknown; text: string };

/** An HTTP client that keeps its session and CSRF token, and signs back in when a case ended the session. */
function fuzzClient(baseUrl: string, creds: { email: string; password: string } | null) {
  let client = httpClient(baseUrl);
  let userId: string | null = null;
  async function ensure(renewToken = false) {
    if (!creds) {
      await client.csrf(true);
      return;
    }
    const me = await client.get('/api/auth/me');
    if ((me.body as { data?: { user?: { id?: string } } })?.data?.user?.id === userId && userId) {
      if (renewToken) await client.csrf(true);
      return;
    }
    client = httpClient(baseUrl);
    userId = (await client.signIn(creds.email, creds.password)).id;
    await client.csrf(true);
  }
  const once = async (method: RouteDef['method'], url: string, body?: RawBody): Promise<Sent> => {
    const res = await client.request(method, url, { ...(body ? { raw: body.raw, type: body.type } : {}), timeoutMs: 20_000 });
    return { status: res.status, body: res.body, text: res.text };
  };
  return {
    ensure,
    async send(method: RouteDef['method'], url: string, body?: RawBody) {
      let res = await once(method, url, body);
      // A previous case may have ended or rotated the session (sign-out): renew the token and retry once.
      if (res.status === 403 && (res.body as { error?: { code?: string } })?.error?.code === 'csrf_invalid') {
        await ensure(true);
        res = await once(method, url, body);
      }
      // Only a call that succeeded can have ended or rotated the session (sign-out, password change).
      if (method !== 'get' && res.status < 300) await ensure(true);
      return res;
    },
  };
}
type FuzzClient = ReturnType<typeof fuzzClient>;

beforeAll(async () => {
  t = await createTestApp({}, { catcher: false });
  await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
  known.slugs = (await t.db.dataSource.query(`SELECT slug FROM documents ORDER BY slug LIMIT 20`)).map((r: { slug: string }) => r.slug);
  known.ids = [
    ...(await t.db.dataSource.query(`SELECT id FROM revisions ORDER BY created_at LIMIT 10`)),
    ...(await t.db.dataSource.query(`SELECT id FROM documents ORDER BY created_at LIMIT 5`)),
    ...(await t.db.dataSource.query(`SELECT id FROM users WHERE role <> 'admin' ORDER BY created_at LIMIT 5`)),
  ].map((r: { id: string }) => r.id);
  // The seeded tables exist today; later tables (setups) join through the generic UUID pool once their rows exist.
  // Not the factories' default password, which the schema examples use: no fuzz case may guess it.
  const { user, password } = await createUser(t, { role: 'admin', password: 'fuzz-admin-harbour-lantern-93' });
  // One listening server for every case (supertest would otherwise open one per request).
  server = await new Promise<http.Server>((resolve) => {
    const s = http.createServer(t.app).listen(0, '127.0.0.1', () => resolve(s));
  });
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  admin = fuzzClient(baseUrl, { email: user.email, password });
  await admin.ensure();
  visitor = fuzzClient(baseUrl, null);
  await visitor.ensure();
}, 120_000);

afterAll(async () => {
  console.log(`fuzz: ${cases} cases over ${routeTable.length} routes (admin ${RUNS} and visitor ${VISITOR_RUNS} runs per route)`);
  server?.closeAllConnections();
  await new Promise((resolve) => (server ? server.close(resolve) : resolve(undefined)));
  await t?.close();
});

// ---- arbitraries -------------------------------------------------------------------------------

const ODD_SEGMENTS = [
  '..%2F..%2F..%2Fetc%2Fpasswd',
  '..%2f..%2f.data%2Fruntime.json',
  '%2e%2e%2f%2e%2e%2f',
  '..%5C..%5Cwindows',
  '%00',
  '%00.json',
  '%ff%fe',
  '%C0%AF',
  '%ZZ',
  '%',
  '%E2%80%AE',
  'CON',
  '-1',
  '0',
  '1e309',
  'NaN',
  '99999999999999999999999',
  encodeURIComponent('<script>alert(1)</script>'),
  encodeURIComponent("' OR 1=1 --"),
  'a'.repeat(6000),
];

const paramValue = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...ODD_SEGMENTS) },
  { weight: 2, arbitrary: fc.uuid() },
  { weight: 1, arbitrary: fc.uuid().map((u) => u.toUpperCase()) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', minLength: 1, maxLength: 40 }).map(encodeURIComponent) },
  { weight: 1, arbitrary: fc.string({ unit: 'grapheme', minLength: 1, maxLength: 30 }).map(encodeURIComponent) },
  { weight: 3, arbitrary: fc.constant(null) }, // replaced by a known slug/id/name, so handlers run past "not found"
);

/** Seeded values a path parameter of this name can take, so handlers get past "not found". */
function knownFor(name: string) {
  const pool = /id$/i.test(name) ? known.ids : name === 'name' ? [...calculatorNames] : /^(n|number)$/.test(name) ? ['1', '2', '3'] : known.slugs;
  return pool.length ? pool : ['drag-brake'];
}

const knownPath = (route: RouteDef) => route.path.replace(/:([A-Za-z0-9_]+)/g, (_m, name: string) => knownFor(name)[0]);

function pathArb(route: RouteDef) {
  const names = [...route.path.matchAll(/:([A-Za-z0-9_]+)/g)].map((m) => m[1]);
  if (!names.length) return fc.constant(route.path);
  return fc.tuple(...names.map((name) => fc.tuple(paramValue, fc.constantFrom(...knownFor(name))).map(([odd, good]) => odd ?? good))).map((values) => {
    let i = 0;
    return route.path.replace(/:([A-Za-z0-9_]+)/g, () => values[i++]);
  });
}

// Prefixed references (`guide:<slug>`) in every case, since validation and lookup must agree on case.
const PREFIXED = ['guide', 'GUIDE', 'Guide', 'gUiDe']
  .flatMap((p) => [`${p}:stock-2wd-buggy-harbour-flats-clay`, `${p}:STOCK-2WD-BUGGY-HARBOUR-FLATS-CLAY`, `${p}:`, `${p}:no-such-guide`])
  .map(encodeURIComponent);
const QUERY_VALUES = [
  '',
  '-1',
  '0',
  '1',
  '2',
  'NaN',
  'Infinity',
  '1e400',
  'true',
  'null',
  '%00',
  '%ZZ',
  '%27%20OR%201%3D1--',
  'a'.repeat(3000),
  'drag-brake',
  'clay',
  'member',
  ...PREFIXED,
];

function queryArb(route: RouteDef) {
  const keys = [...fieldNames(route.query), 'q', 'page', 'pageSize', 'limit'];
  const key = fc.oneof(
    { weight: 4, arbitrary: fc.constantFrom(...keys) },
    {
      weight: 1,
      arbitrary: fc.constantFrom(
        '__proto__',
        '__proto__[polluted]',
        'constructor[prototype][polluted]',
        'a[b][c][d][e][f][g][h]',
        'page[]',
        'q[$ne]',
        'q[]',
        '',
      ),
    },
    { weight: 1, arbitrary: fc.string({ unit: 'binary-ascii', maxLength: 12 }).map(encodeURIComponent) },
  );
  const value = fc.oneof(
    { weight: 3, arbitrary: fc.constantFrom(...QUERY_VALUES) },
    { weight: 2, arbitrary: fc.string({ unit: 'grapheme', maxLength: 40 }).map(encodeURIComponent) },
    { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 20 }).map(encodeURIComponent) },
    { weight: 1, arbitrary: fc.integer().map(String) },
    { weight: 1, arbitrary: fc.uuid().map((u) => u.toUpperCase()) },
  );
  return fc.array(fc.tuple(key, value), { maxLength: 6 }).map((pairs) => pairs.map(([k, v]) => `${k}=${v}`).join('&'));
}

const DEEP = 10_000;
const RAW_BODIES = [
  '{"__proto__":{"polluted":"yes"}}',
  '{"constructor":{"prototype":{"polluted":"yes"}}}',
  '['.repeat(DEEP) + ']'.repeat(DEEP),
  '{"a":'.repeat(DEEP) + '1' + '}'.repeat(DEEP),
  'null',
  '[]',
  '""',
  '0',
  'true',
  '{"email":',
  '{"a":1,"a":2}',
  '\uFEFF{}',
  '{"x":"\\ud800"}',
  '{"x":"\\u0000"}',
  'not json at all',
];

/** Values of the wrong type, odd text, huge text and nested structures for one field. */
const wildValue = fc.oneof(
  fc.constantFrom(
    null,
    true,
    false,
    0,
    -1,
    1e308,
    -0,
    [],
    {},
    [null],
    '',
    ' ',
    '\u0000',
    '\ud800',
    '\u202e',
    'x'.repeat(200_000),
    '<img src=x onerror=alert(1)>',
    { __proto__: null, $gt: '' },
  ),
  fc.jsonValue({ maxDepth: 3 }),
  fc.string({ unit: 'binary', maxLength: 200 }),
  fc.string({ unit: 'grapheme', maxLength: 200 }),
);

function bodyArb(route: RouteDef) {
  const valid = validExample(route.body);
  const fields = fieldNames(route.body);
  const json = (v: unknown) => JSON.stringify(v);
  const arbs: Array<fc.Arbitrary<string>> = [
    fc.constantFrom(...RAW_BODIES),
    fc.jsonValue({ maxDepth: 4 }).map(json),
    fc.dictionary(fc.oneof(fc.constantFrom(...fields, '__proto__', 'constructor'), fc.string({ maxLength: 12 })), wildValue, { maxKeys: 6 }).map(json),
  ];
  if (fields.length) {
    arbs.push(fc.record(Object.fromEntries(fields.map((f) => [f, wildValue])), { requiredKeys: [] }).map(json));
  }
  if (valid && typeof valid === 'object' && !Array.isArray(valid)) {
    const base = valid as Record<string, unknown>;
    arbs.push(fc.constant(json(base)));
    if (fields.length) arbs.push(fc.tuple(fc.constantFrom(...fields), wildValue).map(([k, v]) => json({ ...base, [k]: v })));
    arbs.push(fc.tuple(fc.string({ minLength: 1, maxLength: 16 }), wildValue).map(([k, v]) => json({ ...base, [k]: v })));
    arbs.push(fc.constant(json(base).replace(/^\{/, '{"__proto__":{"polluted":"yes"},')));
  }
  return fc.oneof(...arbs);
}

function caseArb(route: RouteDef) {
  const fuzzBody = isMutating(route.method) && !route.multipart && !route.download;
  return fc.record({
    path: pathArb(route),
    query: queryArb(route),
    body: fuzzBody ? fc.option(bodyArb(route), { freq: 8 }) : fc.constant(null),
  });
}

// ---- checks ------------------------------------------------------------------------------------

function check(route: RouteDef, label: string, res: Sent) {
  const where = `${label}\n→ ${res.status} ${res.text.slice(0, 300)}`;
  expect(res.status, where).toBeLessThan(500);
  if (res.status >= 400) {
    expect(apiErrorSchema.safeParse(res.body).success, `error shape: ${where}`).toBe(true);
  } else if (res.status !== 204 && !route.download && res.status < 300) {
    expect(res.body, `success envelope: ${where}`).toHaveProperty('data');
  }
}

async function runProperty(route: RouteDef, client: FuzzClient, numRuns: number) {
  await fc.assert(
    fc.asyncProperty(caseArb(route), async ({ path, query, body }) => {
      const url = query ? `${path}?${query}` : path;
      const sent = body === null ? undefined : { raw: body, type: 'application/json' };
      const res = await client.send(route.method, url, sent);
      cases++;
      check(route, `${route.method.toUpperCase()} ${url.slice(0, 300)} body=${(body ?? '').slice(0, 200)}`, res);
    }),
    { numRuns, seed: SEED, endOnFailure: !process.env.FUZZ_SHRINK },
  );
}

const label = (r: RouteDef) => `${r.method.toUpperCase()} ${r.path}`;
const jsonMutating = routeTable.filter((r) => isMutating(r.method) && !r.multipart && !r.download);

describe('fuzz: random and malformed params, queries and bodies on every route', () => {
  it('covers the whole route table', () => {
    expect(routeTable.length).toBeGreaterThan(10);
  });

  for (const route of routeTable) {
    it(`${label(route)} never answers 5xx and always in the error shape`, async () => {
      await runProperty(route, admin, RUNS);
      await runProperty(route, visitor, VISITOR_RUNS);
      expect(({} as Record<string, unknown>).polluted, 'Object.prototype polluted').toBeUndefined();
    }, 120_000);
  }
});

describe('fuzz: oversized bodies answer 413', () => {
  const oversized = JSON.stringify({ filler: 'x'.repeat(LIMITS.jsonBodyBytes + 1024) });
  for (const route of jsonMutating) {
    it(`${label(route)} refuses a body over ${LIMITS.jsonBodyBytes / 1024} KB`, async () => {
      const url = knownPath(route);
      const res = await admin.send(route.method, url, { raw: oversized, type: 'application/json' });
      cases++;
      expect(res.status, url).toBe(413);
      expect((res.body as { error: { code: string } }).error.code).toBe('payload_too_large');
    });
  }
});

describe('fuzz: wrong content types answer 415', () => {
  for (const route of routeTable.filter((r) => isMutating(r.method) && !r.download)) {
    it(`${label(route)} refuses bodies that are not ${route.multipart ? 'multipart/form-data' : 'application/json'}`, async () => {
      const wrong: RawBody[] = route.multipart
        ? [
            { raw: '{"file":"x"}', type: 'application/json' },
            { raw: 'file=x', type: 'text/plain' },
          ]
        : [
            { raw: 'email=a%40b.test', type: 'application/x-www-form-urlencoded' },
            { raw: '{"a":1}', type: 'text/plain' },
            { raw: '<a>1</a>', type: 'application/xml' },
            { raw: '--b\r\nContent-Disposition: form-data; name="a"\r\n\r\n1\r\n--b--\r\n', type: 'multipart/form-data; boundary=b' },
            { raw: '{"a":1}', type: 'application/json; charset=iso-8859-1' },
          ];
      const url = knownPath(route);
      for (const body of wrong) {
        const res = await admin.send(route.method, url, body);
        cases++;
        expect(res.status, `${body.type} → ${res.text}`).toBe(415);
        expect((res.body as { error: { code: string } }).error.code).toBe('unsupported_media_type');
      }
    });
  }
});
