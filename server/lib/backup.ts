import { spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';

// Backup = pg_dump's custom format of the app's database + a tar of the uploads folder + a manifest
// (row counts per table, file list with hashes) that restore checks itself against.

export type BackupManifest = {
  format: 1;
  createdAt: string;
  database: string;
  pgDumpVersion: string;
  tables: Record<string, number>;
  uploads: Array<{ path: string; bytes: number; sha256: string }>;
};

/** libpq settings from a postgres:// URL, so the password travels in the environment, never on a command line. */
function pgEnv(databaseUrl: string): NodeJS.ProcessEnv {
  const u = new URL(databaseUrl);
  return {
    ...process.env,
    PGHOST: u.hostname,
    PGPORT: u.port || '5432',
    PGUSER: decodeURIComponent(u.username),
    PGPASSWORD: decodeURIComponent(u.password),
    PGDATABASE: decodeURIComponent(u.pathname.slice(1)),
    PGAPPNAME: 'tunewright-backup',
  };
}

function runTool(cmd: string, args: string[], env: NodeJS.ProcessEnv) {
  const r = spawnSync(cmd, args, { env, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.error) throw new Error(`${path.basename(cmd)} could not run: ${r.error.message}`);
  if (r.status !== 0) throw new Error(`${path.basename(cmd)} ${args.join(' ')} failed (${r.status}): ${(r.stderr || r.stdout).trim()}`);
  return r.stdout;
}

async function withClient<T>(databaseUrl: string, fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: databaseUrl, connectionTimeoutMillis: 5000 });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

async function countTables(c: pg.Client) {
  const tables = (await c.query(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`)).rows.map((r) => r.tablename as string);
  const out: Record<string, number> = {};
  for (const t of tables) out[t] = Number((await c.query(`SELECT count(*) AS n FROM "${t.replace(/"/g, '""')}"`)).rows[0].n);
  return out;
}

/** Row count of every table in the public schema. */
export function tableCounts(databaseUrl: string): Promise<Record<string, number>> {
  return withClient(databaseUrl, countTables);
}

function listFiles(root: string, dir = root): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = path.join(dir, e.name);
    if (e.isDirectory()) return listFiles(root, full);
    return e.isFile() ? [path.relative(root, full)] : [];
  });
}

/** Path, size and SHA-256 of every file under the uploads folder. */
export function uploadInventory(uploadDir: string) {
  return listFiles(uploadDir)
    .sort()
    .map((rel) => {
      const buf = fs.readFileSync(path.join(uploadDir, rel));
      return { path: rel.split(path.sep).join('/'), bytes: buf.length, sha256: crypto.createHash('sha256').update(buf).digest('hex') };
    });
}

const stamp = (d: Date) => d.toISOString().replace(/[:.]/g, '-');

/** Writes `<outRoot>/<timestamp>/{database.dump, uploads.tar, manifest.json}` and returns that folder. */
export async function createBackup(opts: { databaseUrl: string; uploadDir: string; outRoot: string; pgBin: string; now?: Date }) {
  const dir = path.join(opts.outRoot, stamp(opts.now ?? new Date()));
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  const env = pgEnv(opts.databaseUrl);
  const pgDump = path.join(opts.pgBin, 'pg_dump');
  // Count the rows in the very snapshot pg_dump reads, so the manifest matches the dump even while the app writes.
  const tables = await withClient(opts.databaseUrl, async (c) => {
    await c.query('BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY');
    const snapshot = (await c.query('SELECT pg_export_snapshot() AS id')).rows[0].id as string;
    const counts = await countTables(c);
    runTool(pgDump, ['--format=custom', '--no-owner', '--no-privileges', `--snapshot=${snapshot}`, '--file', path.join(dir, 'database.dump')], env);
    await c.query('COMMIT');
    return counts;
  });
  // Files after the dump: every row in the dump then has its file (a file written since is merely extra).
  const uploads = uploadInventory(opts.uploadDir);
  const tarFile = path.join(dir, 'uploads.tar');
  if (fs.existsSync(opts.uploadDir)) runTool('tar', ['-C', opts.uploadDir, '-cf', tarFile, '.'], process.env);
  else runTool('tar', ['-cf', tarFile, '--files-from', '/dev/null'], process.env);
  const manifest: BackupManifest = {
    format: 1,
    createdAt: (opts.now ?? new Date()).toISOString(),
    database: env.PGDATABASE!,
    pgDumpVersion: runTool(pgDump, ['--version'], env).trim(),
    tables,
    uploads,
  };
  fs.writeFileSync(path.join(dir, 'manifest.json'), JSON.stringify(manifest, null, 2), { mode: 0o600 });
  return { dir, manifest };
}

/** The newest backup folder under outRoot, or null. */
export function latestBackup(outRoot: string) {
  if (!fs.existsSync(outRoot)) return null;
  const dirs = fs
    .readdirSync(outRoot)
    .filter((d) => fs.existsSync(path.join(outRoot, d, 'manifest.json')))
    .sort();
  return dirs.length ? path.join(outRoot, dirs[dirs.length - 1]) : null;
}

/**
 * Restores a backup into a fresh or empty database (created when missing; with `replace`, dropped
 * and created again) and an empty uploads folder, then checks row counts and file hashes against
 * the manifest. Refuses to mix a backup into data that is already there.
 */
export async function restoreBackup(opts: { backupDir: string; databaseUrl: string; uploadDir: string; pgBin: string; replace?: boolean }) {
  const manifest = JSON.parse(fs.readFileSync(path.join(opts.backupDir, 'manifest.json'), 'utf8')) as BackupManifest;
  if (manifest.format !== 1) throw new Error(`Unknown backup format ${manifest.format}`);
  const env = pgEnv(opts.databaseUrl);
  const target = env.PGDATABASE!;
  const quoted = `"${target.replace(/"/g, '""')}"`;
  const maintenanceUrl = Object.assign(new URL(opts.databaseUrl), { pathname: '/postgres' }).toString();
  await withClient(maintenanceUrl, async (c) => {
    const exists = (await c.query(`SELECT 1 FROM pg_database WHERE datname = $1`, [target])).rowCount;
    if (exists && opts.replace) await c.query(`DROP DATABASE ${quoted} WITH (FORCE)`);
    if (!exists || opts.replace) await c.query(`CREATE DATABASE ${quoted}`);
  });
  const existingTables = await withClient(opts.databaseUrl, async (c) =>
    Number((await c.query(`SELECT count(*) AS n FROM pg_tables WHERE schemaname = 'public'`)).rows[0].n),
  );
  if (existingTables > 0)
    throw new Error(`Database "${target}" already has ${existingTables} tables. Restore into a new database, or pass --replace to drop and recreate it.`);
  const filesThere = listFiles(opts.uploadDir);
  if (filesThere.length && !opts.replace)
    throw new Error(`The uploads folder ${opts.uploadDir} already holds ${filesThere.length} files. Restore into an empty folder, or pass --replace.`);

  runTool(
    path.join(opts.pgBin, 'pg_restore'),
    ['--exit-on-error', '--no-owner', '--no-privileges', '--single-transaction', '--dbname', target, path.join(opts.backupDir, 'database.dump')],
    env,
  );

  if (opts.replace) fs.rmSync(opts.uploadDir, { recursive: true, force: true });
  fs.mkdirSync(opts.uploadDir, { recursive: true });
  runTool('tar', ['-C', opts.uploadDir, '-xf', path.join(opts.backupDir, 'uploads.tar'), '--no-same-owner', '--no-same-permissions'], process.env);

  const problems: string[] = [];
  const counts = await tableCounts(opts.databaseUrl);
  for (const [table, n] of Object.entries(manifest.tables))
    if (counts[table] !== n) problems.push(`${table}: ${counts[table] ?? 'missing'} rows, backup had ${n}`);
  const files = new Map(uploadInventory(opts.uploadDir).map((f) => [f.path, f.sha256]));
  for (const f of manifest.uploads) if (files.get(f.path) !== f.sha256) problems.push(`upload ${f.path}: ${files.has(f.path) ? 'content differs' : 'missing'}`);
  if (problems.length) throw new Error(`The restore does not match the backup:\n${problems.join('\n')}`);
  return { manifest, counts };
}
