// `npm run bench:start`: cold start and memory of the server run through tsx (TypeScript loaded at run time)
// and compiled (dist-server/, as production runs it), measured the same way in one run, alternating, on a
// throwaway seeded PostgreSQL: the time from spawning the process to its first 200 from GET /api/health,
// and its resident memory (VmRSS from /proc) then, and again after 20 guide-page and API reads.
import 'reflect-metadata';
import { spawn } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensurePostgresInstalled, ensureDatabase, freePort, startCluster } from '../../server/bin/postgres.mjs';
import { buildServer, SERVER_OUT } from '../../server/bin/build-server.mjs';
import { createDataSource } from '../../server/db/data-source';
import { seed } from '../../server/db/seed';

const RUNS = Number(process.env.BENCH_RUNS ?? 5);
const root = path.resolve(import.meta.dirname, '..', '..');
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const rssMb = (pid: number) => Number(/VmRSS:\s+(\d+)/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'))![1]) / 1024;

async function once(args: string[], env: Record<string, string>) {
  const port = await freePort();
  const started = performance.now();
  const child = spawn(process.execPath, args, { cwd: root, env: { ...process.env, ...env, HOST: '127.0.0.1', PORT: String(port) }, stdio: 'ignore' });
  const base = `http://127.0.0.1:${port}`;
  try {
    for (;;) {
      if (child.exitCode !== null) throw new Error(`exited with ${child.exitCode}`);
      if (performance.now() - started > 60_000) throw new Error('not ready in 60 s');
      const ok = await fetch(`${base}/api/health`)
        .then(async (r) => (await r.arrayBuffer(), r.status === 200))
        .catch(() => false);
      if (ok) break;
      await new Promise((r) => setTimeout(r, 10));
    }
    const readyMs = performance.now() - started;
    const rssReady = rssMb(child.pid!);
    for (let i = 0; i < 10; i++) {
      await (await fetch(`${base}/guides/stock-2wd-buggy-harbour-flats-clay`)).arrayBuffer();
      await (await fetch(`${base}/api/search?q=drag%20brake`)).arrayBuffer();
    }
    return { readyMs, rssReady, rssAfter: rssMb(child.pid!) };
  } finally {
    child.kill('SIGTERM');
    await new Promise((r) => child.once('exit', r));
  }
}

async function main() {
  if (!fs.existsSync(path.join(root, 'dist', 'index.html'))) throw new Error('dist/ is missing: run `npm run build` first');
  await buildServer();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-bench-start-'));
  const cluster = startCluster({ bin: ensurePostgresInstalled(() => {}), dir, port: await freePort(), log: () => {} });
  try {
    ensureDatabase(cluster, 'tunewright_start');
    const url = cluster.urlFor('tunewright_start');
    const ds = createDataSource(url, { poolMax: 2 });
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    await seed(ds, { demo: true, bcryptCost: 4 });
    await ds.destroy();
    const env = {
      NODE_ENV: 'production',
      DEV_TOOLS: 'false',
      DATABASE_URL: url,
      SESSION_SECRET: crypto.randomBytes(24).toString('hex'),
      SMTP_URL: 'smtp://127.0.0.1:1',
      LOG_LEVEL: 'error',
    };
    const ways = {
      'tsx (server/index.ts)': ['--import', 'tsx', path.join(root, 'server', 'index.ts')],
      'compiled (dist-server/index.js)': ['--enable-source-maps', path.join(SERVER_OUT, 'index.js')],
    };
    const results: Record<string, Array<Awaited<ReturnType<typeof once>>>> = {};
    const load = os.loadavg();
    for (let run = 0; run < RUNS; run++) for (const [name, args] of Object.entries(ways)) (results[name] ??= []).push(await once(args, env));
    console.log(
      `[bench:start] load average at start ${load.map((l) => l.toFixed(2)).join(' ')}, at end ${os
        .loadavg()
        .map((l) => l.toFixed(2))
        .join(' ')} on ${os.cpus().length} cores; median of ${RUNS}`,
    );
    for (const [name, rs] of Object.entries(results))
      console.log(
        `  ${name.padEnd(32)} start → first 200 from /api/health ${(median(rs.map((r) => r.readyMs)) / 1000).toFixed(2)} s (runs ${rs.map((r) => (r.readyMs / 1000).toFixed(2)).join(', ')}); RSS when ready ${median(rs.map((r) => r.rssReady)).toFixed(0)} MB, after 20 reads ${median(rs.map((r) => r.rssAfter)).toFixed(0)} MB`,
      );
  } finally {
    cluster.stop();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
