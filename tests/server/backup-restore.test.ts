import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { seed } from '../../server/db/seed';
import { createDataSource } from '../../server/db/data-source';
import { createTestDatabase, urlForDb, adminUrl, type TestDatabase } from '../setup/test-db';

// npm run db:backup / db:restore, end to end through the CLI entry points: a seeded database and an
// uploads folder are backed up, restored into a database that did not exist, and compared table by
// table (row counts and every row's content), guides and revisions by name, and files by hash.
let source: TestDatabase;
const work = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-backup-'));
const uploads = path.join(work, 'uploads');
const restoredUploads = path.join(work, 'restored-uploads');
const backups = path.join(work, 'backups');
const restoredDb = `tw_restored_${crypto.randomBytes(4).toString('hex')}`;

function cli(script: string, args: string[], env: Record<string, string>) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join('server', 'bin', script), ...args], {
    encoding: 'utf8',
    env: { ...process.env, ...env },
    timeout: 60_000,
  });
  return { code: r.status, out: `${r.stdout}${r.stderr}` };
}

async function query<T = Record<string, unknown>>(url: string, sql: string): Promise<T[]> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    return (await c.query(sql)).rows as T[];
  } finally {
    await c.end();
  }
}

/** Per table: row count and a digest of every row's content, in a stable order. */
async function fingerprint(url: string) {
  const tables = (await query<{ tablename: string }>(url, `SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`)).map(
    (r) => r.tablename,
  );
  const out: Record<string, { rows: number; digest: string }> = {};
  for (const t of tables) {
    const [row] = await query<{ rows: string; digest: string }>(
      url,
      `SELECT count(*) AS rows, md5(coalesce(string_agg(x::text, E'\\n' ORDER BY x::text), '')) AS digest FROM "${t}" x`,
    );
    out[t] = { rows: Number(row.rows), digest: row.digest };
  }
  return out;
}

beforeAll(async () => {
  source = await createTestDatabase();
  await seed(source.dataSource, { demo: true, bcryptCost: 4 });
  // Uploaded files as the storage keeps them: nested folders, binary-safe content.
  fs.mkdirSync(path.join(uploads, 'setups', 'ab'), { recursive: true });
  fs.writeFileSync(path.join(uploads, 'setups', 'ab', 'harbour-flats-buggy.json'), JSON.stringify({ class: 'buggy-2wd-stock', surface: 'clay', punch: 3 }));
  fs.writeFileSync(path.join(uploads, 'setups', 'club-night.csv'), 'setting,value\npunch,3\ndrag brake,10\n');
  fs.writeFileSync(path.join(uploads, 'blob.bin'), crypto.randomBytes(4096));
}, 60_000);

afterAll(async () => {
  await source?.drop();
  const c = new pg.Client({ connectionString: adminUrl() });
  await c.connect();
  await c.query(`DROP DATABASE IF EXISTS ${restoredDb} WITH (FORCE)`);
  await c.end();
  fs.rmSync(work, { recursive: true, force: true });
});

describe('npm run db:backup and db:restore', () => {
  it('restore into a fresh database gives back the same guides, revisions, every other table and the uploads', async () => {
    const backup = cli('db-backup.ts', ['--out', backups], { DATABASE_URL: source.url, UPLOAD_DIR: uploads });
    expect(backup.code, backup.out).toBe(0);
    const [stampDir] = fs.readdirSync(backups);
    const dir = path.join(backups, stampDir);
    expect(fs.readdirSync(dir).sort()).toEqual(['database.dump', 'manifest.json', 'uploads.tar']);
    const manifest = JSON.parse(fs.readFileSync(path.join(dir, 'manifest.json'), 'utf8'));
    expect(manifest.tables.revisions).toBeGreaterThan(0);
    expect(manifest.uploads).toHaveLength(3);
    // The backup holds no plain-text password of the database.
    expect(fs.readFileSync(path.join(dir, 'manifest.json'), 'utf8')).not.toContain(new URL(source.url).password);

    // Writes after the backup must not show up in the restore.
    await source.dataSource.query(`UPDATE documents SET slug = slug || '-renamed-after-backup' WHERE kind = 'guide'`);

    const restore = cli('db-restore.ts', [dir, '--database-url', urlForDb(restoredDb), '--uploads', restoredUploads], {});
    expect(restore.code, restore.out).toBe(0);
    expect(restore.out).toMatch(/row counts match/);

    await source.dataSource.query(`UPDATE documents SET slug = replace(slug, '-renamed-after-backup', '') WHERE kind = 'guide'`);
    const before = await fingerprint(source.url);
    const after = await fingerprint(urlForDb(restoredDb));
    expect(Object.keys(after)).toEqual(Object.keys(before));
    expect(after).toEqual(before); // every table, setups included once that table exists: same rows, same content
    expect(before.revisions.rows).toBeGreaterThan(5);

    const guidesSql = `SELECT d.slug, r.number, r.state, r.content->>'title' AS title, md5(r.content::text) AS content FROM documents d JOIN revisions r ON r.document_id = d.id WHERE d.kind = 'guide' ORDER BY d.slug, r.number`;
    const guides = await query(urlForDb(restoredDb), guidesSql);
    expect(guides.length).toBeGreaterThan(3);
    expect(guides).toEqual(await query(source.url, guidesSql));
    expect(guides.some((g) => g.state === 'published')).toBe(true);

    for (const f of manifest.uploads as Array<{ path: string; sha256: string }>) {
      const bytes = fs.readFileSync(path.join(restoredUploads, f.path));
      expect(crypto.createHash('sha256').update(bytes).digest('hex'), f.path).toBe(f.sha256);
    }

    // The restored database is one the app can run on: its migrations are all recorded.
    const ds = createDataSource(urlForDb(restoredDb), { poolMax: 1 });
    await ds.initialize();
    try {
      expect(await ds.showMigrations()).toBe(false);
    } finally {
      await ds.destroy();
    }
  }, 120_000);

  it('refuses to restore over a database that already has data, and says how to proceed', async () => {
    const dir = path.join(backups, fs.readdirSync(backups)[0]);
    const res = cli('db-restore.ts', [dir, '--database-url', source.url, '--uploads', path.join(work, 'other-uploads')], {});
    expect(res.code).toBe(1);
    expect(res.out).toMatch(/already has \d+ tables.*--replace/s);
    expect((await fingerprint(source.url)).revisions.rows).toBeGreaterThan(5);
  }, 60_000);
});
