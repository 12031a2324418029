// `npm start`: the whole local demo (or a production server) from a fresh clone, dependency-free until npm ci has run.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { root, ensureDependencies, ensureClientBuild, ensureServerBuild, runBuilt } from './deps.mjs';
import { ensurePostgresInstalled, startCluster, ensureDatabase, freePort, clusterDir } from './postgres.mjs';

const log = (msg) => console.log(`[tunewright] ${msg}`);
const production = process.env.NODE_ENV === 'production';
const started = Date.now();
const children = [];
let cluster = null;
let stopping = false;

function stopAll(code = 0) {
  if (stopping) return;
  stopping = true;
  log('Stopping…');
  for (const child of children) if (child.exitCode === null) child.kill('SIGTERM');
  const waitChildren = Promise.all(
    children.map((c) =>
      c.exitCode !== null
        ? null
        : new Promise((r) => {
            c.once('exit', r);
            setTimeout(r, 8000);
          }),
    ),
  );
  waitChildren.then(() => {
    if (cluster) {
      cluster.stop();
      log('PostgreSQL stopped.');
    }
    process.exit(code);
  });
}
process.on('SIGINT', () => stopAll(0));
process.on('SIGTERM', () => stopAll(0));

/** A child process: a compiled entry of dist-server/ (`{ built: 'index' }`) or a TypeScript file run through tsx (`{ ts: 'server/…' }`). */
function spawnChild(entry, env, name) {
  const args = entry.built ? ['--enable-source-maps', path.join(root, 'dist-server', `${entry.built}.js`)] : ['--import', 'tsx', path.join(root, entry.ts)];
  const child = spawn(process.execPath, args, { cwd: root, env, stdio: ['ignore', 'inherit', 'inherit'] });
  child.on('exit', (code, signal) => {
    if (!stopping) {
      log(`${name} exited (${signal ?? code}); shutting down.`);
      stopAll(code || 1);
    }
  });
  children.push(child);
  return child;
}

async function main() {
  ensureDependencies(log);
  const env = { ...process.env };
  if (production) {
    for (const key of ['DATABASE_URL', 'SMTP_URL', 'SESSION_SECRET']) {
      if (!env[key]) throw new Error(`${key} must be set when NODE_ENV=production`);
    }
  } else {
    const bin = ensurePostgresInstalled(log);
    const dir = clusterDir(path.join(root, '.data', 'postgres'), `tunewright-demo-${Buffer.from(root).toString('hex').slice(-16)}`);
    cluster = startCluster({ bin, dir, port: await freePort(), log });
    ensureDatabase(cluster, 'tunewright');
    env.DATABASE_URL = cluster.urlFor('tunewright');
    const smtpPort = await freePort();
    env.SMTP_URL = `smtp://127.0.0.1:${smtpPort}`;
    env.MAIL_CATCHER_PORT = String(smtpPort);
    // The local demo's helpers (mail viewer, built-in session secret); off in every other run.
    env.DEV_TOOLS = 'true';
    fs.mkdirSync(path.join(root, '.data'), { recursive: true });
    fs.writeFileSync(path.join(root, '.data', 'runtime.json'), JSON.stringify({ DATABASE_URL: env.DATABASE_URL, SMTP_URL: env.SMTP_URL }, null, 2), {
      mode: 0o600,
    });
    log(`PostgreSQL running on 127.0.0.1:${cluster.port} (${dir}).`);
  }
  // The server runs compiled (dist-server/, rebuilt when its sources changed), in production and in the local demo alike.
  await ensureServerBuild(log);
  runBuilt('prepare', { ...env, SEED_DEMO: production ? 'false' : 'true' });
  ensureClientBuild(log);
  if (!production) {
    // The demo's mail catcher is a development helper: it stays TypeScript, run through tsx.
    const catcher = spawnChild({ ts: 'server/bin/mail-catcher.ts' }, env, 'mail catcher');
    await new Promise((r) => setTimeout(r, 300));
    if (catcher.exitCode !== null) throw new Error('mail catcher failed to start');
  }
  spawnChild({ built: 'index' }, { ...env, TW_STARTED_AT: String(started) }, 'app');
}

main().catch((err) => {
  console.error(`[tunewright] ${err.message}`);
  stopAll(1);
});
