// `npm run test:load [-- --duration 60 --readers 100 --writers 10 --instances 1]`
// A production-mode app (the built client in dist/, NODE_ENV=production) on a throwaway PostgreSQL
// cluster, seeded; readers hammer guide pages, the guide, parameter and search APIs and the health
// check with autocannon while signed-in writers create, autosave and submit drafts. Afterwards:
// zero 5xx, zero socket errors, and every write that got a 2xx is in the database. Everything is
// bounded in time and count and stays on loopback. Routes not in the table yet are skipped with a note.
import 'reflect-metadata';
import autocannon, { type Result } from 'autocannon';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { ensurePostgresInstalled, startCluster, ensureDatabase, freePort, type Cluster } from '../../server/bin/postgres.mjs';
import { createDataSource } from '../../server/db/data-source';
import { seed } from '../../server/db/seed';
import { routeTable } from '../../server/routes';
import { startAppProcess, type AppProcess } from '../setup/app-process';
import { httpClient, type HttpClient } from '../setup/http-client';
import { insertAccounts } from '../setup/accounts';
import { autosaveDraft, createGuideDraft, hasRoute, missingGuideSteps, submitDraft } from '../setup/guide-flow';

const { values } = parseArgs({
  options: {
    duration: { type: 'string', default: '60' },
    readers: { type: 'string', default: '100' },
    writers: { type: 'string', default: '10' },
    instances: { type: 'string', default: '1' },
  },
});
const DURATION_S = Number(values.duration);
const READERS = Number(values.readers);
const WRITERS = Number(values.writers);
const INSTANCES = Math.max(1, Number(values.instances));
const MAX_WRITER_STEPS = 2000; // per writer, on top of the time bound
const PROXY = { 'x-forwarded-proto': 'https' }; // as behind a TLS-terminating proxy, so Secure cookies flow
const log = (msg: string) => console.log(`[load] ${msg}`);

const root = path.resolve(import.meta.dirname, '..', '..');
if (!fs.existsSync(path.join(root, 'dist', 'index.html'))) {
  console.error('[load] dist/ is missing: run `npm run build` first (the load run builds nothing itself).');
  process.exit(2);
}

let cluster: Cluster | null = null;
let apps: AppProcess[] = [];
const pgDir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-load-pg-'));
const uploads = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-load-uploads-'));

async function cleanup() {
  await Promise.all(apps.map((a) => a.stop().catch(() => {})));
  apps = [];
  cluster?.stop();
  cluster = null;
  fs.rmSync(pgDir, { recursive: true, force: true });
  fs.rmSync(uploads, { recursive: true, force: true });
}
process.on('SIGINT', () => void cleanup().then(() => process.exit(130)));

type ReadTarget = { name: string; weight: number; paths: string[] };

/** What the readers hit, from the route table; absent routes are reported, not faked. */
function readTargets(guides: string[], parameters: string[]): { targets: ReadTarget[]; notes: string[] } {
  const notes: string[] = [];
  const targets: ReadTarget[] = [];
  const want = (name: string, weight: number, route: [string, string] | null, paths: string[]) => {
    if (route && !hasRoute(routeTable, route[0], route[1]))
      return notes.push(`${name}: ${route[0].toUpperCase()} ${route[1]} is not in the route table yet; skipped`);
    if (!paths.length) return notes.push(`${name}: nothing seeded to read; skipped`);
    targets.push({ name, weight, paths });
  };
  want(
    'GET /guides/:slug (page)',
    15,
    null,
    guides.map((s) => `/guides/${s}`),
  );
  want(
    'GET /api/guides/:slug',
    20,
    ['get', '/api/guides/:slug'],
    guides.map((s) => `/api/guides/${s}`),
  );
  want('GET /api/parameters', 10, ['get', '/api/parameters'], ['/api/parameters']);
  want(
    'GET /api/parameters/:slug',
    15,
    ['get', '/api/parameters/:slug'],
    parameters.map((s) => `/api/parameters/${s}`),
  );
  const terms = ['punch', 'drag brake', 'clay', 'timing', 'gearing', 'brake', 'throttle curve', 'astroturf', 'temperature', 'soft start'];
  want(
    'GET /api/search?q=',
    20,
    ['get', '/api/search'],
    terms.map((q) => `/api/search?q=${encodeURIComponent(q)}`),
  );
  want('GET /api/health', 20, null, ['/api/health']);
  return { targets, notes };
}

function connectionsFor(targets: ReadTarget[]) {
  const total = targets.reduce((s, t) => s + t.weight, 0);
  const counts = targets.map((t) => Math.max(1, Math.round((t.weight / total) * READERS)));
  return counts;
}

type WriterStats = { ok: number; non2xx: Record<string, number>; errors: string[]; serverErrors: string[] };
type Expected = { revisionId: string; title: string; body: string; state: 'draft' | 'in_review'; authorId: string };

async function writer(client: HttpClient, userId: string, w: number, endAt: number, stats: WriterStats, expected: Expected[], guideWrites: boolean) {
  const tally = (status: number, what: string, text: string) => {
    if (status >= 200 && status < 300) stats.ok++;
    else stats.non2xx[status] = (stats.non2xx[status] ?? 0) + 1;
    if (status >= 500) stats.serverErrors.push(`${what}: ${status} ${text.slice(0, 160)}`);
  };
  let lastName: string | null = null;
  for (let step = 0; step < MAX_WRITER_STEPS && Date.now() < endAt; step++) {
    try {
      if (!guideWrites) {
        const name = `Load writer ${w} step ${step}`;
        const res = await client.patch('/api/account', { displayName: name });
        tally(res.status, 'PATCH /api/account', res.text);
        if (res.status === 200) lastName = name;
        continue;
      }
      const draft = await createGuideDraft(client, `w${w}-s${step}-${crypto.randomBytes(3).toString('hex')}`).catch((err: Error) => {
        const status = Number(/answered (\d+)/.exec(err.message)?.[1] ?? 0);
        if (status) tally(status, 'POST /api/guides', err.message);
        else throw err;
        return null;
      });
      if (!draft) continue;
      tally(draft.res.status, 'POST /api/guides', draft.res.text);
      const exp: Expected = { revisionId: draft.revisionId, title: draft.content.title, body: draft.content.body, state: 'draft', authorId: userId };
      expected.push(exp);
      for (let save = 0; save < 3 && Date.now() < endAt; save++) {
        const body = `${exp.body}\nAutosave ${save}: pinion one tooth up after the heat.\n`;
        const res = await autosaveDraft(client, exp.revisionId, { body });
        tally(res.status, 'PATCH /api/revisions/:id', res.text);
        if (res.status === 200) exp.body = body;
      }
      const sub = await submitDraft(client, exp.revisionId, 'Ready for a moderator: tried at the club night');
      tally(sub.status, 'POST /api/revisions/:id/submit', sub.text);
      if (sub.status === 200) exp.state = 'in_review';
    } catch (err) {
      stats.errors.push(`writer ${w}: ${(err as Error).message}`);
    }
  }
  return lastName;
}

const fmt = (n: number, d = 0) => n.toFixed(d).padStart(8);

async function main() {
  const started = Date.now();
  const bin = ensurePostgresInstalled((m) => log(m));
  cluster = startCluster({ bin, dir: pgDir, port: await freePort(), log: () => {} });
  ensureDatabase(cluster, 'tunewright_load');
  const databaseUrl = cluster.urlFor('tunewright_load');
  const ds = createDataSource(databaseUrl, { poolMax: 4, applicationName: 'tunewright-load-check' });
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  await seed(ds, { demo: true, bcryptCost: 4 });
  const writers = await insertAccounts(ds, 'member', WRITERS, 'load-writer');

  const env = {
    NODE_ENV: 'production',
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: crypto.randomBytes(24).toString('hex'),
    TRUST_PROXY: 'true',
    LOG_LEVEL: 'error',
    SMTP_URL: 'smtp://127.0.0.1:1',
    UPLOAD_DIR: uploads,
    // Every reader and writer comes from 127.0.0.1: one address, so the per-address sign-in budget is raised.
    RATE_LIMIT_AUTH_PER_15MIN: '100000',
  };
  apps = await Promise.all(Array.from({ length: INSTANCES }, () => startAppProcess(env, { readyTimeoutMs: 60_000 })));
  log(`${INSTANCES} production instance(s) on ${apps.map((a) => a.baseUrl).join(', ')} (setup ${((Date.now() - started) / 1000).toFixed(1)} s)`);

  const guides = (
    await ds.query(`SELECT slug FROM documents WHERE kind = 'guide' AND published_revision_id IS NOT NULL AND hidden_at IS NULL ORDER BY slug`)
  ).map((r: { slug: string }) => r.slug);
  const parameters = (
    await ds.query(`SELECT slug FROM documents WHERE kind = 'parameter' AND published_revision_id IS NOT NULL AND hidden_at IS NULL ORDER BY slug`)
  ).map((r: { slug: string }) => r.slug);
  const { targets, notes } = readTargets(guides, parameters);
  for (const n of notes) log(`note: ${n}`);
  const missingWrites = missingGuideSteps(routeTable, ['create', 'autosave', 'submit']);
  const guideWrites = missingWrites.length === 0;
  if (!guideWrites) log(`note: guide writing routes missing (${missingWrites.join(', ')}); writers change their display name instead (PATCH /api/account)`);

  const conns = connectionsFor(targets);
  log(`${READERS} readers over ${targets.length} read routes, ${WRITERS} writers, ${DURATION_S} s`);

  // Writers: signed in (CSRF through the client), alternating over the instances.
  const clients = await Promise.all(
    writers.map(async (w, i) => {
      const c = httpClient(apps[i % apps.length].baseUrl, { headers: PROXY });
      await c.signIn(w.email, w.password);
      return c;
    }),
  );
  const endAt = Date.now() + DURATION_S * 1000;
  const stats: WriterStats = { ok: 0, non2xx: {}, errors: [], serverErrors: [] };
  const expected: Expected[] = [];
  const writerRuns = clients.map((c, i) => writer(c, writers[i].id, i, endAt, stats, expected, guideWrites));

  const readerRuns = targets.flatMap((t, ti) =>
    apps.map((app) => {
      let i = crypto.randomInt(t.paths.length);
      return autocannon({
        url: app.baseUrl,
        connections: Math.max(1, Math.round(conns[ti] / apps.length)),
        duration: DURATION_S,
        timeout: 10,
        headers: PROXY,
        requests: [{ method: 'GET', setupRequest: (req) => ({ ...req, path: t.paths[i++ % t.paths.length] }) }],
      }).then((r) => ({ target: t.name, result: r }));
    }),
  );
  const [reads, lastNames] = await Promise.all([Promise.all(readerRuns), Promise.all(writerRuns)]);

  // ---- report ----
  const byTarget = new Map<string, Result[]>();
  for (const r of reads) byTarget.set(r.target, [...(byTarget.get(r.target) ?? []), r.result]);
  console.log('\nroute                              conns    req/s   p50 ms   p99 ms      2xx   non2xx      5xx   errors');
  let readErrors = 0;
  let read5xx = 0;
  const rpsPerConn = new Map<string, number>();
  for (const [ti, t] of targets.entries()) {
    const rs = byTarget.get(t.name) ?? [];
    const rps = rs.reduce((s, r) => s + r.requests.average, 0);
    const p50 = Math.max(...rs.map((r) => r.latency.p50));
    const p99 = Math.max(...rs.map((r) => r.latency.p99));
    const ok = rs.reduce((s, r) => s + r['2xx'], 0);
    const non2xx = rs.reduce((s, r) => s + r.non2xx, 0);
    const five = rs.reduce((s, r) => s + r['5xx'], 0);
    const errors = rs.reduce((s, r) => s + r.errors + r.timeouts, 0);
    const c = rs.length * Math.max(1, Math.round(conns[ti] / apps.length));
    readErrors += errors;
    read5xx += five;
    rpsPerConn.set(t.name, rps / c);
    console.log(`${t.name.padEnd(32)} ${fmt(c)} ${fmt(rps)} ${fmt(p50)} ${fmt(p99)} ${fmt(ok)} ${fmt(non2xx)} ${fmt(five)} ${fmt(errors)}`);
  }
  const writeTotal = stats.ok + Object.values(stats.non2xx).reduce((a, b) => a + b, 0);
  console.log(
    `writers (${WRITERS}): ${writeTotal} requests, ${(writeTotal / DURATION_S).toFixed(1)} req/s, ${stats.ok} 2xx, non-2xx ${JSON.stringify(stats.non2xx)}, ${stats.errors.length} socket errors`,
  );

  const guideRead = rpsPerConn.get('GET /api/guides/:slug') ?? rpsPerConn.get('GET /guides/:slug (page)');
  const health = rpsPerConn.get('GET /api/health');
  const ratioName = rpsPerConn.has('GET /api/guides/:slug') ? 'GET /api/guides/:slug' : 'GET /guides/:slug (page)';
  if (guideRead !== undefined && health) {
    const ratio = guideRead / health;
    console.log(`read/health ratio (${ratioName} vs GET /api/health, per connection): ${ratio.toFixed(2)} (goal ≥ 0.6) ${ratio >= 0.6 ? 'met' : 'NOT met'}`);
  }

  // ---- durability: every acknowledged write is in the database ----
  const problems: string[] = [];
  if (guideWrites) {
    const ids = expected.map((e) => e.revisionId);
    const rows: Array<{ id: string; state: string; title: string; body: string; author_id: string }> = ids.length
      ? await ds.query(`SELECT id, state, content->>'title' AS title, content->>'body' AS body, author_id FROM revisions WHERE id = ANY($1::uuid[])`, [ids])
      : [];
    const byId = new Map(rows.map((r) => [r.id, r]));
    for (const e of expected) {
      const row = byId.get(e.revisionId);
      if (!row) problems.push(`revision ${e.revisionId} acknowledged but missing`);
      else if (row.title !== e.title || row.body !== e.body || row.state !== e.state || row.author_id !== e.authorId)
        problems.push(`revision ${e.revisionId} differs: ${JSON.stringify({ row, e })}`);
    }
    const [{ n }] = await ds.query(`SELECT count(*)::int AS n FROM revisions WHERE author_id = ANY($1::uuid[])`, [writers.map((w) => w.id)]);
    if (n !== expected.length) problems.push(`writers own ${n} revisions but ${expected.length} creations were acknowledged`);
    console.log(
      `durability: ${expected.length} drafts acknowledged (${expected.filter((e) => e.state === 'in_review').length} submitted), ${rows.length} found with matching content`,
    );
  } else {
    for (const [i, w] of writers.entries()) {
      const [row] = await ds.query(`SELECT display_name FROM users WHERE id = $1`, [w.id]);
      if (lastNames[i] && row.display_name !== lastNames[i])
        problems.push(`writer ${i}: database has "${row.display_name}", last acknowledged "${lastNames[i]}"`);
    }
    console.log(`durability: ${writers.length} writers' last acknowledged display names checked in the database`);
  }
  await ds.destroy();

  const failures = [
    ...(read5xx ? [`${read5xx} 5xx answers to readers`] : []),
    ...(readErrors ? [`${readErrors} reader socket errors or timeouts`] : []),
    ...stats.serverErrors.slice(0, 10),
    ...stats.errors.slice(0, 10),
    ...problems.slice(0, 20),
  ];
  if (failures.length) {
    console.log(`\nFAIL\n${failures.join('\n')}`);
    for (const a of apps) console.log(`--- app ${a.baseUrl} output ---\n${a.output().split('\n').slice(-30).join('\n')}`);
  } else {
    console.log('\nPASS: zero 5xx, zero socket errors, every acknowledged write is in the database');
  }
  await cleanup();
  process.exit(failures.length ? 1 : 0);
}

main().catch(async (err) => {
  console.error(`[load] ${(err as Error).stack ?? err}`);
  for (const a of apps) console.error(`--- app ${a.baseUrl} output ---\n${a.output().split('\n').slice(-30).join('\n')}`);
  await cleanup();
  process.exit(1);
});
