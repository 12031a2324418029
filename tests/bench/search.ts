// `npm run bench:search`: how fast and how good our in-memory search is on a large corpus, next to
// PostgreSQL full-text search on the same corpus and queries. Prints figures; it is not a timed test.
//
// BENCH_BASELINE=<git revision> npm run bench:search also runs that revision's search code on the same
// corpus in this process, query by query in turn with ours, and prints both with their ratio: on a
// shared machine the load average moves absolute figures far more than it moves a ratio.
import 'reflect-metadata';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import v8 from 'node:v8';
import vm from 'node:vm';
import pg from 'pg';
import { SearchIndex, type SearchDocument } from '../../server/modules/search/search-index';
import { libraryDocuments } from '../search/library-index';
import { QUALITY_QUERIES } from '../search/queries';
import { fmt, line, mb, pct, shuffled } from './bench-util';
import { compareWithBaseline } from './search-baseline';
import { rng, syntheticGuides } from './search-corpus';

v8.setFlagsFromString('--expose-gc');
const gc = vm.runInNewContext('gc') as () => void;

const GUIDES = Number(process.env.BENCH_GUIDES ?? 10_000);
const BASELINE = process.env.BENCH_BASELINE;
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 20);
const TARGETS = { p95Ms: 2, updateMs: 10, buildMs: 10_000, heapMb: 300 };

// The fixed query mix: the quality set plus what readers type for guides and half-typed words.
const MIX = [
  ...QUALITY_QUERIES.map((q) => q.q),
  'drag brake clay',
  '17.5T',
  '2S',
  'touring asphalt timing',
  'short course 4S',
  'pinion',
  'motor temperature',
  'final drive',
  'Gullrock Hall',
  'stock buggy dusty',
  'thermal',
  'brake strength carpet',
  'ramp end rpm',
  'bec',
  'crawler drag brake',
  'lipo cutoff 3.2V',
];

function hitRate(search: (q: string) => string[]) {
  let top3 = 0;
  let rr = 0;
  for (const { q, expect } of QUALITY_QUERIES) {
    const got = search(q);
    const rank = got.indexOf(expect) + 1;
    if (rank && rank <= 3) top3++;
    if (rank) rr += 1 / rank;
  }
  return { top3: top3 / QUALITY_QUERIES.length, mrr: rr / QUALITY_QUERIES.length };
}

async function hitRateAsync(search: (q: string) => Promise<string[]>) {
  const ranked = new Map<string, string[]>();
  for (const { q } of QUALITY_QUERIES) ranked.set(q, await search(q));
  return hitRate((q) => ranked.get(q)!);
}

async function startPostgres(): Promise<{ url: string; stop: () => void }> {
  if (process.env.TEST_PG_ADMIN_URL) return { url: process.env.TEST_PG_ADMIN_URL, stop: () => {} };
  const boot = (await import('../../server/bin/postgres.mjs' as string)) as {
    ensurePostgresInstalled: (log: (m: string) => void) => string;
    startCluster: (o: { bin: string; dir: string; port: number; log: (m: string) => void }) => { adminUrl: string; stop: () => void; dir: string };
    freePort: () => Promise<number>;
  };
  const bin = boot.ensurePostgresInstalled(() => {});
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-bench-pg-'));
  process.env.TW_PG_FSYNC = 'off';
  const cluster = boot.startCluster({ bin, dir, port: await boot.freePort(), log: () => {} });
  return {
    url: cluster.adminUrl,
    stop: () => {
      cluster.stop();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

async function main() {
  const library = libraryDocuments();
  const synthetic = syntheticGuides(GUIDES);
  const corpus: SearchDocument[] = [...library, ...synthetic];
  const words = corpus.reduce((n, d) => n + d.body.split(' ').length, 0);
  console.log(`corpus: ${library.length} library items + ${synthetic.length} synthetic guides, ${(words / 1e6).toFixed(1)} M body words`);
  console.log(
    `machine: ${os.cpus().length} cores, load average ${os
      .loadavg()
      .map((l) => l.toFixed(1))
      .join(' ')}, node ${process.version}`,
  );

  // ---- ours: build and heap
  gc();
  const heapBefore = process.memoryUsage().heapUsed;
  const t0 = performance.now();
  const index = new SearchIndex();
  index.load(corpus);
  const buildMs = performance.now() - t0;
  gc();
  const heapAfter = process.memoryUsage().heapUsed;
  const heapIndexMb = mb(heapAfter - heapBefore);

  // ---- ours: latency (the API's work for one results page: ranking, facets, 10 snippets, did-you-mean).
  // Wall time and CPU time are both recorded: on a shared machine the first includes waiting for a core.
  for (const q of MIX) index.search(q, {}, 10);
  const lat: number[] = [];
  const cpu: number[] = [];
  const suggestLat: number[] = [];
  for (let round = 0; round < ROUNDS; round++) {
    for (const q of shuffled(MIX, round)) {
      const c = process.cpuUsage();
      const s = performance.now();
      index.search(q, {}, 10);
      lat.push(performance.now() - s);
      const used = process.cpuUsage(c);
      cpu.push((used.user + used.system) / 1000);
    }
    for (const q of shuffled(MIX, round + 1000)) {
      const typed = q.slice(0, Math.max(2, Math.ceil(q.length * 0.6)));
      const s = performance.now();
      index.suggest(typed);
      suggestLat.push(performance.now() - s);
    }
  }

  // ---- ours: incremental updates (replace one guide, one parameter; remove and re-add)
  const upd: number[] = [];
  const r = rng(7);
  for (let i = 0; i < 300; i++) {
    const d = synthetic[Math.floor(r() * synthetic.length)];
    const edited = { ...d, body: `${d.body} Edited ${i}: raise the drag brake a touch.` };
    const s = performance.now();
    index.put(edited);
    upd.push(performance.now() - s);
  }
  // The first search after an update brings the changed item's terms' flattened postings up to date.
  // The same query without an update before it is timed in the same loop, so the two compare under the same load.
  const afterUpd = { wall: [] as number[], cpu: [] as number[] };
  const noUpd = { wall: [] as number[], cpu: [] as number[] };
  const timed = (into: { wall: number[]; cpu: number[] }, run: () => void) => {
    const c = process.cpuUsage();
    const s = performance.now();
    run();
    into.wall.push(performance.now() - s);
    const used = process.cpuUsage(c);
    into.cpu.push((used.user + used.system) / 1000);
  };
  for (let i = 0; i < 100; i++) {
    timed(noUpd, () => index.search('drag brake', {}, 10));
    const d = synthetic[Math.floor(r() * synthetic.length)];
    index.put({ ...d, body: `${d.body} Lower the drag brake for the dusty afternoon.` });
    timed(afterUpd, () => index.search('drag brake', {}, 10));
  }
  const paramUpd: number[] = [];
  for (let i = 0; i < 50; i++) {
    const p = library[i % 31];
    const s = performance.now();
    index.put({ ...p, summary: `${p.summary} (${i})` });
    paramUpd.push(performance.now() - s);
  }
  const rem: number[] = [];
  for (let i = 0; i < 100; i++) {
    const d = synthetic[i];
    const s = performance.now();
    index.remove('guide', d.slug);
    rem.push(performance.now() - s);
    index.put(d);
  }

  const oursBig = hitRate((q) => index.search(q, {}, 10).hits.map((h) => `${h.type}:${h.slug}`));
  const small = new SearchIndex();
  small.load(library);
  const oursSmall = hitRate((q) => small.search(q, {}, 10).hits.map((h) => `${h.type}:${h.slug}`));

  // ---- PostgreSQL full-text search on the same corpus
  const pgServer = await startPostgres();
  const admin = new pg.Client({ connectionString: pgServer.url });
  await admin.connect();
  const dbName = `tw_bench_${process.pid}`;
  await admin.query(`DROP DATABASE IF EXISTS ${dbName}`);
  await admin.query(`CREATE DATABASE ${dbName}`);
  const client = new pg.Client({ connectionString: pgServer.url.replace(/\/[^/]*$/, `/${dbName}`) });
  await client.connect();
  let pgResult: {
    loadMs: number;
    indexMs: number;
    sizeMb: number;
    and: number[];
    or: number[];
    andBig: ReturnType<typeof hitRate>;
    orBig: ReturnType<typeof hitRate>;
    andSmall: ReturnType<typeof hitRate>;
    orSmall: ReturnType<typeof hitRate>;
    upd: number[];
  };
  try {
    await client.query(`CREATE TABLE docs (id text PRIMARY KEY, synthetic boolean NOT NULL, title text, aliases text, tags text, summary text, body text,
      tsv tsvector GENERATED ALWAYS AS (
        setweight(to_tsvector('english', coalesce(title, '')), 'A') || setweight(to_tsvector('english', coalesce(aliases, '')), 'A') ||
        setweight(to_tsvector('english', coalesce(tags, '')), 'B') || setweight(to_tsvector('english', coalesce(summary, '')), 'C') ||
        setweight(to_tsvector('english', coalesce(body, '')), 'D')) STORED)`);
    const tl = performance.now();
    const rows = corpus.map((d) => [
      `${d.type}:${d.slug}`,
      d.slug.startsWith('synthetic-'),
      d.title,
      d.aliases.join(', '),
      [...d.tags, d.class ?? '', d.surface ?? ''].join(' '),
      d.summary,
      d.body,
    ]);
    for (let i = 0; i < rows.length; i += 500) {
      const batch = rows.slice(i, i + 500);
      const params: unknown[] = [];
      const values = batch.map((row, j) => `(${row.map((_, k) => `$${j * 7 + k + 1}`).join(',')})`).join(',');
      for (const row of batch) params.push(...row);
      await client.query(`INSERT INTO docs (id, synthetic, title, aliases, tags, summary, body) VALUES ${values}`, params);
    }
    const loadMs = performance.now() - tl;
    const ti = performance.now();
    await client.query('CREATE INDEX docs_tsv ON docs USING gin (tsv)');
    await client.query('ANALYZE docs');
    const indexMs = performance.now() - ti;
    const sizeMb = mb(Number((await client.query(`SELECT pg_total_relation_size('docs') AS n`)).rows[0].n));
    const AND = `SELECT id FROM docs, websearch_to_tsquery('english', $1) q WHERE tsv @@ q ORDER BY ts_rank(tsv, q) DESC LIMIT 20`;
    // OR of the words, closer to how our engine treats a query.
    const OR = `SELECT id FROM docs, to_tsquery('english', coalesce(nullif(replace(plainto_tsquery('english', $1)::text, ' & ', ' | '), ''), 'zzzz')) q WHERE tsv @@ q ORDER BY ts_rank(tsv, q) DESC LIMIT 20`;
    const ids = async (sql: string, q: string, where = '') =>
      (await client.query(where ? sql.replace('WHERE', `WHERE ${where} AND`) : sql, [q])).rows.map((x: { id: string }) => x.id);
    for (const q of MIX) {
      await ids(AND, q);
      await ids(OR, q);
    }
    const and: number[] = [];
    const or: number[] = [];
    for (let round = 0; round < Math.max(3, Math.round(ROUNDS / 4)); round++) {
      for (const q of shuffled(MIX, round)) {
        let s = performance.now();
        await ids(AND, q);
        and.push(performance.now() - s);
        s = performance.now();
        await ids(OR, q);
        or.push(performance.now() - s);
      }
    }
    const pgUpd: number[] = [];
    for (let i = 0; i < 100; i++) {
      const d = synthetic[i];
      const s = performance.now();
      await client.query('UPDATE docs SET body = $2 WHERE id = $1', [`guide:${d.slug}`, `${d.body} Edited ${i}.`]);
      pgUpd.push(performance.now() - s);
    }
    const andBig = await hitRateAsync((q) => ids(AND, q));
    const orBig = await hitRateAsync((q) => ids(OR, q));
    const andSmall = await hitRateAsync((q) => ids(AND, q, 'NOT synthetic'));
    const orSmall = await hitRateAsync((q) => ids(OR, q, 'NOT synthetic'));
    pgResult = { loadMs, indexMs, sizeMb, and, or, andBig, orBig, andSmall, orSmall, upd: pgUpd };
  } finally {
    await client.end();
    await admin.query(`DROP DATABASE IF EXISTS ${dbName} WITH (FORCE)`);
    await admin.end();
    pgServer.stop();
  }

  const ok = (v: number, target: number) => (v <= target ? 'ok' : 'MISSED');
  const W = [34, 14, 14, 14, 10];
  console.log('\nIn-memory search (MiniSearch + our ranking), whole API work per query');
  console.log(line(['', 'value', 'target', '', ''], W));
  console.log(line(['index build', `${fmt(buildMs / 1000)} s`, `≤ ${TARGETS.buildMs / 1000} s`, ok(buildMs, TARGETS.buildMs), ''], W));
  console.log(line(['heap held by the index', `${fmt(heapIndexMb, 0)} MB`, `≤ ${TARGETS.heapMb} MB`, ok(heapIndexMb, TARGETS.heapMb), ''], W));
  console.log(line(['heap used, whole process', `${fmt(mb(heapAfter), 0)} MB`, '', '', ''], W));
  console.log(
    line(['search p50 / p95 / p99', `${fmt(pct(lat, 50))} ms`, `${fmt(pct(lat, 95))} ms`, `${fmt(pct(lat, 99))} ms`, ok(pct(lat, 95), TARGETS.p95Ms)], W),
  );
  console.log(
    line(
      ['  same, CPU time of this process', `${fmt(pct(cpu, 50))} ms`, `${fmt(pct(cpu, 95))} ms`, `${fmt(pct(cpu, 99))} ms`, ok(pct(cpu, 95), TARGETS.p95Ms)],
      W,
    ),
  );
  console.log(line(['suggest p50 / p95 / p99', `${fmt(pct(suggestLat, 50))} ms`, `${fmt(pct(suggestLat, 95))} ms`, `${fmt(pct(suggestLat, 99))} ms`, ''], W));
  console.log(
    line(
      [
        'update guide p50 / p95 / max',
        `${fmt(pct(upd, 50), 3)} ms`,
        `${fmt(pct(upd, 95), 3)} ms`,
        `${fmt(Math.max(...upd), 3)} ms`,
        ok(pct(upd, 95), TARGETS.updateMs),
      ],
      W,
    ),
  );
  console.log(line(['search right after an update p50/p95', `${fmt(pct(afterUpd.wall, 50))} ms`, `${fmt(pct(afterUpd.wall, 95))} ms`, '', ''], W));
  console.log(line(['  same, CPU time', `${fmt(pct(afterUpd.cpu, 50))} ms`, `${fmt(pct(afterUpd.cpu, 95))} ms`, '', ''], W));
  console.log(line(['  same query, no update before it', `${fmt(pct(noUpd.wall, 50))} ms`, `${fmt(pct(noUpd.wall, 95))} ms`, '', ''], W));
  console.log(line(['  same, CPU time', `${fmt(pct(noUpd.cpu, 50))} ms`, `${fmt(pct(noUpd.cpu, 95))} ms`, '', ''], W));
  console.log(line(['update parameter p50 / p95', `${fmt(pct(paramUpd, 50), 3)} ms`, `${fmt(pct(paramUpd, 95), 3)} ms`, '', ''], W));
  console.log(line(['remove item p50 / p95', `${fmt(pct(rem, 50), 3)} ms`, `${fmt(pct(rem, 95), 3)} ms`, '', ''], W));
  console.log(`(${lat.length} searches over ${MIX.length} distinct queries; ${upd.length} guide updates)`);

  const p = pgResult;
  console.log('\nSame corpus, same queries: ours vs PostgreSQL full-text search (tsvector, GIN, ts_rank; top 20 ids only)');
  const W2 = [30, 12, 12, 12, 16, 16];
  console.log(line(['', 'p50', 'p95', 'p99', 'top-3 (library)', 'top-3 (+10k)'], W2));
  const row = (name: string, l: number[], small: ReturnType<typeof hitRate>, big: ReturnType<typeof hitRate>) =>
    console.log(
      line(
        [
          name,
          `${fmt(pct(l, 50))} ms`,
          `${fmt(pct(l, 95))} ms`,
          `${fmt(pct(l, 99))} ms`,
          `${fmt(small.top3 * 100, 0)} % (${fmt(small.mrr, 2)})`,
          `${fmt(big.top3 * 100, 0)} % (${fmt(big.mrr, 2)})`,
        ],
        W2,
      ),
    );
  row('ours (in memory)', lat, oursSmall, oursBig);
  row('PostgreSQL FTS, AND', p.and, p.andSmall, p.andBig);
  row('PostgreSQL FTS, OR', p.or, p.orSmall, p.orBig);
  console.log('(top-3 hit rate on the quality set, MRR in brackets; "library" = the real library only, "+10k" = with the synthetic guides)');
  console.log(
    `latency ratio PostgreSQL / ours at p50: AND ${fmt(pct(p.and, 50) / pct(lat, 50), 1)}×, OR ${fmt(pct(p.or, 50) / pct(lat, 50), 1)}×; at p95: AND ${fmt(pct(p.and, 95) / pct(lat, 95), 1)}×, OR ${fmt(pct(p.or, 95) / pct(lat, 95), 1)}×`,
  );
  console.log(
    `PostgreSQL: load ${fmt(p.loadMs / 1000)} s, GIN build ${fmt(p.indexMs / 1000)} s, table + index ${fmt(p.sizeMb, 0)} MB, single-row update p50 ${fmt(pct(p.upd, 50))} ms`,
  );

  if (BASELINE) await compareWithBaseline(BASELINE, corpus, MIX, ROUNDS);
  console.log(
    `load average at the end: ${os
      .loadavg()
      .map((l) => l.toFixed(1))
      .join(' ')}`,
  );
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
