// `BENCH_BASELINE=<revision> npm run bench:search`: another revision's search index beside this one, in
// this process and on the same corpus, query by query in turn: on a shared machine the load moves
// absolute figures far more than it moves the ratio printed here.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { isDeepStrictEqual } from 'node:util';
import { SearchIndex, type SearchDocument } from '../../server/modules/search/search-index';
import { fmt, line, pct, shuffled } from './bench-util';

type Index = Pick<SearchIndex, 'load' | 'search'>;

/** The search index class of another revision (its search module and shared/), unpacked under .test-artifacts/. */
async function baselineIndex(rev: string): Promise<new () => Index> {
  const commit = execFileSync('git', ['rev-parse', '--verify', `${rev}^{commit}`], { encoding: 'utf8' }).trim();
  const dir = path.resolve('.test-artifacts', 'bench-baseline', commit);
  if (!fs.existsSync(dir)) {
    fs.mkdirSync(dir, { recursive: true });
    const tar = execFileSync('git', ['archive', '--format=tar', commit, 'server/modules/search', 'shared'], { maxBuffer: 256 * 1024 * 1024 });
    execFileSync('tar', ['-x', '-C', dir], { input: tar });
  }
  const mod = (await import(pathToFileURL(path.join(dir, 'server/modules/search/search-index.ts')).href)) as { SearchIndex: new () => Index };
  return mod.SearchIndex;
}

/** Both indexes over the same query mix, in turn (which goes first alternates by round), plus each query's fastest run. */
function compare(ours: Index, theirs: Index, mix: string[], rounds: number) {
  const lat = { ours: [] as number[], theirs: [] as number[] };
  const fastest = { ours: new Map<string, number>(), theirs: new Map<string, number>() };
  for (const q of mix) {
    ours.search(q, {}, 10);
    theirs.search(q, {}, 10);
  }
  for (let round = 0; round < rounds; round++) {
    for (const q of shuffled(mix, round + 2000)) {
      const order = round % 2 ? (['ours', 'theirs'] as const) : (['theirs', 'ours'] as const);
      for (const who of order) {
        const s = performance.now();
        (who === 'ours' ? ours : theirs).search(q, {}, 10);
        const ms = performance.now() - s;
        lat[who].push(ms);
        fastest[who].set(q, Math.min(fastest[who].get(q) ?? Infinity, ms));
      }
    }
  }
  return { lat, fastest: { ours: [...fastest.ours.values()], theirs: [...fastest.theirs.values()] } };
}

/**
 * The answer of this tree with only the fields the baseline answers with, for a query whose answer
 * differs only by a field this tree added (e.g. `searchedFor`).
 */
function withFieldsOf<T extends object>(ours: T, theirs: object): Partial<T> {
  return Object.fromEntries(Object.entries(ours).filter(([k]) => k in theirs)) as Partial<T>;
}

/** Builds both indexes afresh from `corpus`, checks their answers are the same and prints their latencies side by side. */
export async function compareWithBaseline(rev: string, corpus: SearchDocument[], mix: string[], rounds: number) {
  // Both built afresh from the same corpus (the index above has been through the update runs).
  const Baseline = await baselineIndex(rev);
  let tb = performance.now();
  const base = new Baseline();
  base.load(corpus);
  const baseBuildMs = performance.now() - tb;
  tb = performance.now();
  const ours = new SearchIndex();
  ours.load(corpus);
  const oursBuildMs = performance.now() - tb;
  // Same answers (hits, scores, snippets, facets, totals) for the whole mix, or the speed-up is not like for like.
  const same = mix.filter((q) => isDeepStrictEqual(ours.search(q, {}, 10), base.search(q, {}, 10))).length;
  const sameApartFromNew = mix.filter((q) => {
    const theirs = base.search(q, {}, 10);
    return isDeepStrictEqual(withFieldsOf(ours.search(q, {}, 10), theirs), theirs);
  }).length;
  const loadBefore = os.loadavg()[0];
  const c = compare(ours, base, mix, rounds);
  const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
  console.log(`\nBaseline ${rev} vs this tree, same corpus and process, queries in turn (load average ${fmt(loadBefore, 1)} → ${fmt(os.loadavg()[0], 1)})`);
  const W3 = [34, 12, 12, 12, 22];
  console.log(line(['', 'p50', 'p95', 'p99', 'fastest run: mean / p95'], W3));
  for (const [name, who] of [
    [`baseline ${rev}`, 'theirs'],
    ['this tree', 'ours'],
  ] as const)
    console.log(
      line(
        [
          name,
          `${fmt(pct(c.lat[who], 50))} ms`,
          `${fmt(pct(c.lat[who], 95))} ms`,
          `${fmt(pct(c.lat[who], 99))} ms`,
          `${fmt(mean(c.fastest[who]))} / ${fmt(pct(c.fastest[who], 95))} ms`,
        ],
        W3,
      ),
    );
  const ratio = (f: (xs: number[]) => number, a: number[], b: number[]) => fmt(f(a) / f(b));
  console.log(
    line(
      [
        'ratio this tree / baseline',
        ratio((x) => pct(x, 50), c.lat.ours, c.lat.theirs),
        ratio((x) => pct(x, 95), c.lat.ours, c.lat.theirs),
        ratio((x) => pct(x, 99), c.lat.ours, c.lat.theirs),
        `${ratio(mean, c.fastest.ours, c.fastest.theirs)} / ${ratio((x) => pct(x, 95), c.fastest.ours, c.fastest.theirs)}`,
      ],
      W3,
    ),
  );
  console.log(
    `index build: baseline ${fmt(baseBuildMs / 1000)} s, this tree ${fmt(oursBuildMs / 1000)} s; identical answers for ${same} of ${mix.length} queries (${sameApartFromNew} leaving out fields the baseline does not answer with)`,
  );
}
