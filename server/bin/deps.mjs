// Dependency-free checks run by `npm start` and `npm test` before node_modules may exist.
import { spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

export const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..', '..');

const lockHash = (file) => crypto.createHash('sha256').update(fs.readFileSync(file)).digest('hex');

/**
 * Runs `npm ci` when node_modules is missing or older than the lockfile. A lockfile that is only
 * newer on disk (a checkout, a merge) but has the content node_modules was installed from is no reason to reinstall.
 */
export function ensureDependencies(log = console.log) {
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  const stamp = path.join(root, 'node_modules', '.tunewright-lock-sha256');
  const lock = path.join(root, 'package-lock.json');
  const installed = fs.existsSync(marker);
  const older = installed && fs.statSync(marker).mtimeMs < fs.statSync(lock).mtimeMs;
  const sameContent = fs.existsSync(stamp) && fs.readFileSync(stamp, 'utf8').trim() === lockHash(lock);
  if (installed && (!older || sameContent)) return;
  log('Installing dependencies (npm ci)…');
  const r = spawnSync('npm', ['ci', '--include=dev', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) throw new Error('npm ci failed');
  fs.writeFileSync(stamp, lockHash(lock));
}

function newestMtime(p) {
  if (!fs.existsSync(p)) return 0;
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const e of fs.readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, e)));
  return newest;
}

/** Builds the client when dist/ is missing or older than its sources. */
export function ensureClientBuild(log = console.log) {
  const built = path.join(root, 'dist', 'index.html');
  const sources = ['src', 'shared', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];
  const newest = Math.max(...sources.map((s) => newestMtime(path.join(root, s))));
  if (fs.existsSync(built) && fs.statSync(built).mtimeMs >= newest) return;
  log('Building the client (vite build)…');
  const r = spawnSync(process.execPath, [path.join(root, 'node_modules', 'vite', 'bin', 'vite.js'), 'build', '--logLevel', 'warn'], {
    cwd: root,
    stdio: 'inherit',
  });
  if (r.status !== 0) throw new Error('vite build failed');
}

/**
 * Compiles the server into dist-server/ (server/bin/build-server.mjs) when it is missing or older than its
 * sources: everything it bundles (server/, shared/, src/ for the page drawing) and the settings it is built with.
 */
export async function ensureServerBuild(log = console.log) {
  const built = path.join(root, 'dist-server', 'index.js');
  const sources = ['server', 'shared', 'src', 'tsconfig.json', 'package-lock.json'];
  const newest = Math.max(...sources.map((s) => newestMtime(path.join(root, s))));
  if (fs.existsSync(built) && fs.statSync(built).mtimeMs >= newest) return;
  log('Compiling the server (esbuild → dist-server/)…');
  const { buildServer } = await import('./build-server.mjs');
  await buildServer();
}

/** Runs a compiled entry point of dist-server/ and waits for it. */
export function runBuilt(name, env = process.env, args = []) {
  const r = spawnSync(process.execPath, ['--enable-source-maps', path.join(root, 'dist-server', `${name}.js`), ...args], { cwd: root, env, stdio: 'inherit' });
  if (r.status !== 0) throw new Error(`dist-server/${name}.js exited with ${r.status}`);
}

/** Runs a TypeScript entry point with tsx and waits for it. */
export function runTs(entry, env = process.env, args = []) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(root, entry), ...args], { cwd: root, env, stdio: 'inherit' });
  if (r.status !== 0) throw new Error(`${entry} exited with ${r.status}`);
}
