// `npm run dev`: the local database and mail catcher, the API with reload (tsx watch) and Vite's dev server with hot reload.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { root, ensureDependencies, runTs } from './deps.mjs';
import { ensurePostgresInstalled, startCluster, ensureDatabase, freePort, clusterDir } from './postgres.mjs';

const log = (msg) => console.log(`[dev] ${msg}`);
const children = [];
let cluster = null;

function stopAll() {
  for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
  setTimeout(() => {
    cluster?.stop();
    process.exit(0);
  }, 1500);
}
process.on('SIGINT', stopAll);
process.on('SIGTERM', stopAll);

ensureDependencies(log);
const bin = ensurePostgresInstalled(log);
const dir = clusterDir(path.join(root, '.data', 'postgres'), `tunewright-demo-${Buffer.from(root).toString('hex').slice(-16)}`);
cluster = startCluster({ bin, dir, port: await freePort(), log });
ensureDatabase(cluster, 'tunewright');
const apiPort = String(await freePort());
const smtpPort = String(await freePort());
const webPort = process.env.PORT ?? '5173';
const env = {
  ...process.env,
  DEV_TOOLS: 'true',
  DATABASE_URL: cluster.urlFor('tunewright'),
  SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
  MAIL_CATCHER_PORT: smtpPort,
  PORT: apiPort,
  API_PORT: apiPort,
  APP_URL: `http://127.0.0.1:${webPort}`,
};
runTs('server/db/prepare.ts', env);
const spawnChild = (args, extraEnv = {}) => {
  const c = spawn(process.execPath, args, { cwd: root, env: { ...env, ...extraEnv }, stdio: 'inherit' });
  children.push(c);
  return c;
};
spawnChild(['--import', 'tsx', 'server/bin/mail-catcher.ts']);
spawnChild([path.join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs'), 'watch', '--clear-screen=false', 'server/index.ts']);
spawnChild([path.join(root, 'node_modules', 'vite', 'bin', 'vite.js'), '--port', webPort, '--strictPort'], { PORT: webPort });
log(`open http://127.0.0.1:${webPort} (API on ${apiPort}, proxied)`);
