import { spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildServer } from '../../server/bin/build-server.mjs';
import { migrations } from '../../server/db/migrations/index';
import { adminUrl, urlForDb } from '../setup/test-db';
import { startAppProcess, type AppProcess } from '../setup/app-process';
import pg from 'pg';

// Production runs the server compiled ahead of time (server/bin/build-server.mjs → dist-server/). This file
// builds it (into its own folder inside the project, so a developer's dist-server/ is left alone), migrates
// and seeds an empty database with the built prepare step, and starts the built app on it.
const outdir = path.resolve('.test-artifacts', `compiled-server-${process.pid}`);
const name = `tw_compiled_${crypto.randomBytes(4).toString('hex')}`;
const uploads = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-compiled-uploads-'));
let app: AppProcess | undefined;

async function admin(sql: string) {
  const c = new pg.Client({ connectionString: adminUrl() });
  await c.connect();
  try {
    await c.query(sql);
  } finally {
    await c.end();
  }
}

beforeAll(async () => {
  await buildServer(outdir);
  await admin(`CREATE DATABASE ${name}`);
}, 120_000);
afterAll(async () => {
  await app?.stop();
  await admin(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  fs.rmSync(outdir, { recursive: true, force: true });
  fs.rmSync(uploads, { recursive: true, force: true });
});

describe('the compiled server (dist-server/)', () => {
  it('migrates an empty database from the build, starts in production mode and answers', async () => {
    const env = {
      NODE_ENV: 'production',
      DEV_TOOLS: 'false',
      DATABASE_URL: urlForDb(name),
      SESSION_SECRET: crypto.randomBytes(24).toString('hex'),
      SMTP_URL: 'smtp://127.0.0.1:1',
      LOG_LEVEL: 'error',
      BCRYPT_COST: '4',
      UPLOAD_DIR: uploads,
      SEED_DEMO: 'false',
    };
    // The entry points are plain JavaScript: no TypeScript loader anywhere in the process.
    for (const entry of ['index.js', 'prepare.js', 'body-diff-worker.js']) expect(fs.existsSync(path.join(outdir, entry)), entry).toBe(true);
    const prepared = spawnSync(process.execPath, [path.join(outdir, 'prepare.js')], { env: { ...process.env, ...env }, encoding: 'utf8', timeout: 120_000 });
    expect(prepared.status, `${prepared.stdout}\n${prepared.stderr}`).toBe(0);
    expect(prepared.stdout).toContain(`applied ${migrations.length} migration(s)`);

    app = await startAppProcess(env, { compiledEntry: path.join(outdir, 'index.js'), readyTimeoutMs: 60_000 });
    const health = await fetch(`${app.baseUrl}/api/health`);
    expect(health.status).toBe(200);
    // The change listener is up too (the read cache and the search index depend on it).
    expect(((await health.json()) as { data: { db: string; changes: string } }).data).toMatchObject({ db: 'ok', changes: 'ok' });
    // The library the built prepare step seeded, through the API and as a page drawn by the built server.
    const list = (await (await fetch(`${app.baseUrl}/api/parameters`)).json()) as { data: Array<{ slug: string; name: string }> };
    expect(list.data.length).toBeGreaterThan(10);
    const page = await fetch(`${app.baseUrl}/parameters/drag-brake`);
    expect(page.status).toBe(200);
    expect(await page.text()).toMatch(/<h1[^>]*>Drag brake<\/h1>/);
    const library = await (await fetch(`${app.baseUrl}/parameters`)).text();
    for (const p of list.data) expect(library).toContain(`href="/parameters/${p.slug}"`);
  }, 180_000);
});
