// `npm test`: the same bootstrap as `npm start`, then every suite against a throwaway cluster on a free port.
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { root, ensureDependencies, ensureClientBuild } from './deps.mjs';
import { ensurePostgresInstalled, ensureChromiumInstalled, startCluster, freePort } from './postgres.mjs';

const log = (msg) => console.log(`[test] ${msg}`);
let cluster = null;

function cleanup() {
  if (!cluster) return;
  cluster.stop();
  fs.rmSync(cluster.dir, { recursive: true, force: true });
  cluster = null;
}
process.on('SIGINT', () => {
  cleanup();
  process.exit(130);
});
process.on('SIGTERM', () => {
  cleanup();
  process.exit(143);
});

/**
 * The static checks CI runs before the suites (a whole `npm test`, not one run for chosen files): lint,
 * typecheck and the format check. Each counts as one check in the closing line.
 */
function staticChecks() {
  const bin = (pkg, file) => path.join(root, 'node_modules', pkg, file);
  const checks = [
    ['lint', [bin('eslint', 'bin/eslint.js'), '.']],
    ['typecheck', [bin('typescript', 'bin/tsc'), '--noEmit', '-p', '.']],
    ['format', [bin('prettier', 'bin/prettier.cjs'), '--check', '--log-level', 'warn', '.']],
  ];
  let passed = 0;
  let failed = 0;
  for (const [name, args] of checks) {
    const started = Date.now();
    const r = spawnSync(process.execPath, args, { cwd: root, stdio: 'inherit' });
    const ok = r.status === 0;
    log(`${name}: ${ok ? 'ok' : 'FAILED'} (${((Date.now() - started) / 1000).toFixed(1)} s)`);
    if (ok) passed++;
    else failed++;
  }
  return { passed, failed };
}

async function main() {
  ensureDependencies(log);
  const fileArgs = process.argv.slice(2);
  const statics = fileArgs.length ? { passed: 0, failed: 0 } : staticChecks();
  const bin = ensurePostgresInstalled(log);
  ensureChromiumInstalled(log);
  ensureClientBuild(log);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-test-pg-'));
  process.env.TW_PG_FSYNC = 'off'; // throwaway data: durability is not under test here
  cluster = startCluster({ bin, dir, port: await freePort(), log: () => {} });
  log(`throwaway PostgreSQL on 127.0.0.1:${cluster.port}`);
  const artifacts = path.join(root, '.test-artifacts');
  fs.mkdirSync(artifacts, { recursive: true });
  const report = path.join(artifacts, 'vitest.json');
  fs.rmSync(report, { force: true });
  const args = [
    path.join(root, 'node_modules', 'vitest', 'vitest.mjs'),
    'run',
    '--reporter=default',
    '--reporter=json',
    `--outputFile.json=${report}`,
    ...process.argv.slice(2),
  ];
  const code = await new Promise((resolve) => {
    const child = spawn(process.execPath, args, {
      cwd: root,
      stdio: 'inherit',
      env: {
        ...process.env,
        NODE_ENV: 'test',
        DEV_TOOLS: 'true',
        TEST_PG_ADMIN_URL: cluster.adminUrl,
        TEST_PG_DIR: dir,
        TEST_PG_BIN: bin,
        TEST_PG_PORT: String(cluster.port),
      },
    });
    child.on('exit', (c) => resolve(c ?? 1));
  });
  cleanup();
  let passed = 0;
  let failed;
  if (fs.existsSync(report)) {
    const json = JSON.parse(fs.readFileSync(report, 'utf8'));
    passed = json.numPassedTests ?? 0;
    failed = (json.numFailedTests ?? 0) + (json.numRuntimeErrorTestSuites ?? 0);
    if (code !== 0 && failed === 0) failed = 1; // a crash outside any test still fails the run
  } else {
    failed = 1;
  }
  passed += statics.passed;
  failed += statics.failed;
  console.log(`tests: ${passed} passed, ${failed} failed`);
  process.exit(failed > 0 || code !== 0 ? 1 : 0);
}

main().catch((err) => {
  console.error(`[test] ${err.stack ?? err.message}`);
  cleanup();
  console.log('tests: 0 passed, 1 failed');
  process.exit(1);
});
