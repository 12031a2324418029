// `npm run build:server`: the server compiled ahead of time into dist-server/ (esbuild, one ES module per
// entry, shared code in chunks), so production runs plain JavaScript instead of loading TypeScript
// through a loader at every start. Packages stay in node_modules (not bundled); our own code — server/,
// shared/ and the one client entry the server draws pages with (src/entry-server.tsx) — is bundled.
// TypeORM's entities and migrations are imported by name (server/db/entities.ts, migrations/index.ts), so
// they are in the bundle like any other module; nothing is found by globbing files at run time.
import fs from 'node:fs';
import path from 'node:path';
import { root } from './deps.mjs';

export const SERVER_OUT = path.join(root, 'dist-server');

/** Entry points, by output name. */
export const SERVER_ENTRIES = {
  // The app.
  index: 'server/index.ts',
  // Migrations and seed (npm start runs it before the app).
  prepare: 'server/db/prepare.ts',
  // Loaded by the app as a worker thread, from beside the chunk that starts it.
  'body-diff-worker': 'server/modules/revisions/body-diff-worker.ts',
};

/** Builds into `outdir` (dist-server/ unless told; it must be inside the project, where node_modules is found). */
export async function buildServer(outdir = SERVER_OUT) {
  const { build } = await import('esbuild');
  fs.rmSync(outdir, { recursive: true, force: true });
  await build({
    absWorkingDir: root,
    entryPoints: Object.fromEntries(Object.entries(SERVER_ENTRIES).map(([name, file]) => [name, path.join(root, file)])),
    outdir,
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    packages: 'external',
    tsconfig: path.join(root, 'tsconfig.json'),
    // Paths, `experimentalDecorators` (TypeORM's legacy decorators; every column names its type, as esbuild
    // emits no decorator metadata — tsx, which runs the tests, does not either) and the JSX runtime come from tsconfig.json.
    jsx: 'automatic',
    sourcemap: 'linked',
    // Chunks beside the entries: code that finds a file relative to its own module (the body-diff worker) finds it here.
    chunkNames: 'chunk-[hash]',
    logLevel: 'warning',
  });
  fs.writeFileSync(path.join(outdir, 'package.json'), JSON.stringify({ type: 'module', private: true }) + '\n');
}

if (import.meta.url === new URL(`file://${process.argv[1]}`).href) {
  const started = Date.now();
  await buildServer();
  console.log(`[build:server] dist-server/ in ${((Date.now() - started) / 1000).toFixed(1)} s`);
}
