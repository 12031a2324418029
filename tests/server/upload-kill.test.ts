import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import S3rver from 's3rver';
import { ListObjectsCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { seedParameters } from '../../server/db/seed-content';
import { createTestDatabase, type TestDatabase } from '../setup/test-db';
import { startAppProcess, type AppProcess } from '../setup/app-process';
import { httpClient } from '../setup/http-client';
import { insertAccounts } from '../setup/accounts';
import { buildSetupRecord } from '../factories/setup-record';
import { newStorageKey, SWEEP_GRACE_MS } from '../../server/lib/storage';

// The app process killed (SIGKILL, no clean-up of its own) in the middle of a setup upload, then started
// again on the same database and upload directory: storage and the setups table must still agree.

let db: TestDatabase;
let app: AppProcess | undefined;
const uploads = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-upload-kill-'));

const env = () => ({
  NODE_ENV: 'test',
  // warn, so the start-up sweep's report reaches the captured output.
  LOG_LEVEL: 'warn',
  DATABASE_URL: db.url,
  SMTP_URL: 'smtp://127.0.0.1:1',
  OUTBOX_INTERVAL_MS: '60000',
  RATE_LIMIT_AUTH_PER_15MIN: '10000',
  UPLOAD_DIR: uploads,
  STORAGE_DRIVER: 'disk',
});

/** Every file under the upload directory, relative and with / separators (temp files included). */
function filesOnDisk(): string[] {
  if (!fs.existsSync(uploads)) return [];
  return fs
    .readdirSync(uploads, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.relative(uploads, path.join(e.parentPath, e.name)).split(path.sep).join('/'))
    .sort();
}
const storedKeys = async (): Promise<string[]> =>
  (await db.dataSource.query('SELECT storage_key FROM setups ORDER BY storage_key')).map((r: { storage_key: string }) => r.storage_key);
const rowsOf = async (ownerId: string): Promise<number> =>
  (await db.dataSource.query('SELECT count(*)::int AS n FROM setups WHERE owner_id = $1', [ownerId]))[0].n;

async function signedInMember(baseUrl: string, label: string) {
  const [member] = await insertAccounts(db.dataSource, 'member', 1, label);
  const client = httpClient(baseUrl);
  await client.signIn(member.email, member.password);
  const csrf = await client.csrf();
  return { member, cookie: `tw.sid=${client.cookie('tw.sid')}`, csrf };
}

function multipartBody(fileName: string, content: Buffer) {
  const boundary = `----tw-kill-${crypto.randomBytes(8).toString('hex')}`;
  const body = Buffer.concat([
    Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${fileName}"\r\nContent-Type: application/json\r\n\r\n`),
    content,
    Buffer.from(`\r\n--${boundary}--\r\n`),
  ]);
  return { boundary, body };
}

type RawUpload = {
  /** Resolves when the server has parsed the headers and handed the request to the app (100 Continue). */
  accepted: Promise<void>;
  /** The answer, or the socket error when the process died under it. */
  outcome: Promise<{ status: number; text: string } | { error: string }>;
  write: (chunk: Buffer) => Promise<void>;
  end: (chunk?: Buffer) => void;
};

/** A POST /api/setups over a bare socket, so the test decides how much of the body the server gets. */
function rawUpload(port: number, session: { cookie: string; csrf: string }, boundary: string, totalLength: number): RawUpload {
  const req = http.request({
    host: '127.0.0.1',
    port,
    method: 'POST',
    path: '/api/setups',
    agent: false,
    headers: {
      'content-type': `multipart/form-data; boundary=${boundary}`,
      'content-length': String(totalLength),
      cookie: session.cookie,
      'x-csrf-token': session.csrf,
      expect: '100-continue',
    },
  });
  const accepted = new Promise<void>((resolve, reject) => {
    req.once('continue', () => resolve());
    req.once('error', reject);
    setTimeout(() => reject(new Error('no 100 Continue within 10 s')), 10_000).unref();
  });
  accepted.catch(() => {});
  const outcome = new Promise<{ status: number; text: string } | { error: string }>((resolve) => {
    req.once('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString('utf8') }));
      res.on('error', (err) => resolve({ error: err.message }));
    });
    req.once('error', (err) => resolve({ error: (err as NodeJS.ErrnoException).code ?? err.message }));
  });
  req.flushHeaders();
  return {
    accepted,
    outcome,
    write: (chunk) => new Promise<void>((resolve, reject) => req.write(chunk, (err) => (err ? reject(err) : resolve()))),
    end: (chunk) => req.end(chunk),
  };
}

async function waitFor<T>(what: string, probe: () => Promise<T | undefined> | T | undefined, timeoutMs = 10_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

/** A complete upload on a running app; returns the status and the created row's storage key. */
async function completeUpload(target: AppProcess, label: string) {
  const session = await signedInMember(target.baseUrl, label);
  const content = Buffer.from(JSON.stringify(buildSetupRecord()));
  const { boundary, body } = multipartBody('harbour-flats-after-restart.json', content);
  const up = rawUpload(target.port, session, boundary, body.length);
  await up.accepted;
  up.end(body);
  const res = await up.outcome;
  return { res, content, ownerId: session.member.id };
}

beforeAll(async () => {
  db = await createTestDatabase();
  // The setup validator checks ESC settings against the live parameter library.
  await seedParameters(db.dataSource);
}, 60_000);

afterAll(async () => {
  await app?.stop();
  await db?.drop();
  fs.rmSync(uploads, { recursive: true, force: true });
});

describe('POST /api/setups when the app process is killed mid-upload', () => {
  it('killed while the body is still arriving: no row, no file, and an upload after the restart is stored (201)', async () => {
    const started = Date.now();
    app = await startAppProcess(env());
    const session = await signedInMember(app.baseUrl, 'kill-body');
    const content = Buffer.from(JSON.stringify(buildSetupRecord()));
    const { boundary, body } = multipartBody('harbour-flats-killed.json', content);
    const up = rawUpload(app.port, session, boundary, body.length);
    // The server has the request open once it answers 100 Continue; then it gets the headers and half the file.
    await up.accepted;
    await up.write(body.subarray(0, Math.floor(body.length / 2)));
    await new Promise((r) => setTimeout(r, 300));
    expect(app.child.exitCode, 'the app is still up with the request open').toBeNull();
    await app.kill('SIGKILL');
    const outcome = await up.outcome;
    expect(outcome, 'the killed upload got no answer').toHaveProperty('error');

    app = await startAppProcess(env());
    expect(await rowsOf(session.member.id)).toBe(0);
    expect(filesOnDisk(), 'nothing on disk from the cut-off upload').toEqual([]);

    const after = await completeUpload(app, 'kill-body-after');
    expect('status' in after.res && after.res.status, JSON.stringify(after.res)).toBe(201);
    const created = JSON.parse((after.res as { text: string }).text).data as { id: string };
    const [row] = await db.dataSource.query('SELECT storage_key FROM setups WHERE id = $1 AND owner_id = $2', [created.id, after.ownerId]);
    expect(fs.readFileSync(path.join(uploads, row.storage_key))).toEqual(after.content);
    expect(filesOnDisk()).toEqual(await storedKeys());
    console.log(`upload-kill: mid-body kill, restart and a good upload took ${Date.now() - started} ms`);
  }, 60_000);

  it('killed after the object is written but before its row commits: no row, and the restart removes the orphaned object and a stale temp file', async () => {
    const started = Date.now();
    app ??= await startAppProcess(env());
    const before = await storedKeys();
    const session = await signedInMember(app.baseUrl, 'kill-gap');
    // Hold the setups table from outside, so the app's INSERT waits inside its transaction; the object is
    // on disk by then (object first, row second). This needs nothing in the app itself.
    const locker = new pg.Client({ connectionString: db.url });
    await locker.connect();
    try {
      await locker.query('BEGIN');
      await locker.query('LOCK TABLE setups IN ACCESS EXCLUSIVE MODE');
      const content = Buffer.from(JSON.stringify(buildSetupRecord()));
      const { boundary, body } = multipartBody('harbour-flats-gap.json', content);
      const up = rawUpload(app.port, session, boundary, body.length);
      await up.accepted;
      up.end(body);
      const orphan = await waitFor('the object on disk', () => filesOnDisk().find((f) => !before.includes(f) && !path.basename(f).startsWith('.')));
      await waitFor('the app INSERT waiting on the lock', async () => {
        // Asked on another connection: inside the locker's transaction pg_stat_activity is a snapshot taken at its first read.
        const rows = await db.dataSource.query(
          `SELECT 1 FROM pg_stat_activity WHERE datname = current_database() AND wait_event_type = 'Lock' AND query ILIKE 'INSERT INTO "setups"%'`,
        );
        return rows.length ? true : undefined;
      });
      expect(fs.readFileSync(path.join(uploads, orphan))).toEqual(content);
      await app.kill('SIGKILL');
      expect(await up.outcome, 'the killed upload got no answer').toHaveProperty('error');
      await locker.query('ROLLBACK');

      // The waiting INSERT was never committed: its connection died with the process.
      await waitFor('the dead backend to go', async () => {
        const rows = await db.dataSource.query(
          `SELECT 1 FROM pg_stat_activity WHERE datname = current_database() AND query ILIKE 'INSERT INTO "setups"%' AND pid <> pg_backend_pid()`,
        );
        return rows.length === 0 ? true : undefined;
      });
      expect(await rowsOf(session.member.id)).toBe(0);
      expect(filesOnDisk()).toContain(orphan);

      // The sweep spares files younger than a minute (another instance may be between its object and its
      // row), so age the orphan as if the restart came later; also leave a temp file such as a kill inside
      // the disk driver's write would, next to a row's own file that must survive.
      const past = new Date(Date.now() - 10 * 60_000);
      fs.utimesSync(path.join(uploads, orphan), past, past);
      for (const key of before) fs.utimesSync(path.join(uploads, key), past, past);
      const temp = path.posix.join(path.posix.dirname(orphan), `.${crypto.randomUUID()}.json.${crypto.randomBytes(6).toString('hex')}.partial`);
      fs.writeFileSync(path.join(uploads, temp), '{"format": "tunewright.se');
      fs.utimesSync(path.join(uploads, temp), past, past);

      app = await startAppProcess(env());
      expect(filesOnDisk(), 'only files that belong to rows are left').toEqual(await storedKeys());
      expect(await storedKeys()).toEqual(before);
      expect(app.output()).toContain(orphan);
      expect(app.output()).toContain(path.posix.basename(temp));

      const after = await completeUpload(app, 'kill-gap-after');
      expect('status' in after.res && after.res.status, JSON.stringify(after.res)).toBe(201);
      const created = JSON.parse((after.res as { text: string }).text).data as { id: string };
      const [row] = await db.dataSource.query('SELECT storage_key FROM setups WHERE id = $1', [created.id]);
      expect(fs.readFileSync(path.join(uploads, row.storage_key))).toEqual(after.content);
      expect(filesOnDisk()).toEqual(await storedKeys());
    } finally {
      await locker.end().catch(() => {});
    }
    console.log(`upload-kill: gap kill, restart sweep and a good upload took ${Date.now() - started} ms`);
  }, 60_000);
});

describe('POST /api/setups on S3 storage when the app process is killed between object and row', () => {
  const BUCKET = 'tunewright-kill';
  // s3rver accepts any credentials; these are placeholders, not secrets.
  const FAKE_KEY = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };
  const s3Dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-kill-s3rver-'));
  let s3: S3rver;
  let endpoint: string;
  let bucket: S3Client;

  beforeAll(async () => {
    s3 = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: s3Dir, configureBuckets: [{ name: BUCKET }] });
    endpoint = `http://127.0.0.1:${(await s3.run()).port}`;
    bucket = new S3Client({
      endpoint,
      region: 'us-east-1',
      forcePathStyle: true,
      credentials: FAKE_KEY,
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    });
  });
  afterAll(async () => {
    bucket?.destroy();
    await s3?.close();
    fs.rmSync(s3Dir, { recursive: true, force: true });
  });

  const s3Env = () => ({
    ...env(),
    STORAGE_DRIVER: 's3',
    STORAGE_S3_ENDPOINT: endpoint,
    STORAGE_S3_BUCKET: BUCKET,
    STORAGE_S3_ACCESS_KEY_ID: FAKE_KEY.accessKeyId,
    STORAGE_S3_SECRET_ACCESS_KEY: FAKE_KEY.secretAccessKey,
  });
  const bucketKeys = async () => ((await bucket.send(new ListObjectsCommand({ Bucket: BUCKET }))).Contents ?? []).map((o) => o.Key!).sort();
  /** s3rver reports LastModified from the mtime of `<key>._S3rver_object` in its directory. */
  const age = (key: string, when: Date) =>
    fs.utimesSync(path.join(s3Dir, BUCKET, ...path.posix.dirname(key).split('/'), `${path.posix.basename(key)}._S3rver_object`), when, when);

  it('the restart removes the orphaned object from the bucket, spares an unreferenced object younger than the grace, and the next upload is stored (201)', async () => {
    await app?.stop();
    app = await startAppProcess(s3Env());
    const session = await signedInMember(app.baseUrl, 'kill-s3');
    const locker = new pg.Client({ connectionString: db.url });
    await locker.connect();
    let orphan: string;
    try {
      await locker.query('BEGIN');
      await locker.query('LOCK TABLE setups IN ACCESS EXCLUSIVE MODE');
      const content = Buffer.from(JSON.stringify(buildSetupRecord()));
      const { boundary, body } = multipartBody('harbour-flats-s3-gap.json', content);
      const up = rawUpload(app.port, session, boundary, body.length);
      await up.accepted;
      up.end(body);
      orphan = await waitFor('the object in the bucket', async () => (await bucketKeys())[0]);
      await waitFor('the app INSERT waiting on the lock', async () => {
        // Asked on another connection: inside the locker's transaction pg_stat_activity is a snapshot taken at its first read.
        const rows = await db.dataSource.query(
          `SELECT 1 FROM pg_stat_activity WHERE datname = current_database() AND wait_event_type = 'Lock' AND query ILIKE 'INSERT INTO "setups"%'`,
        );
        return rows.length ? true : undefined;
      });
      await app.kill('SIGKILL');
      expect(await up.outcome, 'the killed upload got no answer').toHaveProperty('error');
      await locker.query('ROLLBACK');
    } finally {
      await locker.end().catch(() => {});
    }
    await waitFor('the dead backend to go', async () => {
      const rows = await db.dataSource.query(
        `SELECT 1 FROM pg_stat_activity WHERE datname = current_database() AND query ILIKE 'INSERT INTO "setups"%' AND pid <> pg_backend_pid()`,
      );
      return rows.length === 0 ? true : undefined;
    });
    expect(await rowsOf(session.member.id)).toBe(0);
    expect(await bucketKeys()).toEqual([orphan]);

    // Age the orphan past the grace, as if the restart came later; leave a second unreferenced object
    // fresh, as another instance's upload between its object and its row would be.
    age(orphan, new Date(Date.now() - SWEEP_GRACE_MS.s3 - 60_000));
    const inFlight = newStorageKey('setups', 'json');
    await bucket.send(new PutObjectCommand({ Bucket: BUCKET, Key: inFlight, Body: '{}', ContentType: 'application/json' }));

    app = await startAppProcess(s3Env());
    expect(await bucketKeys(), 'the orphan is gone, the young object stays').toEqual([inFlight]);
    expect(app.output()).toContain(orphan);
    expect(app.output()).not.toContain(inFlight);

    const after = await completeUpload(app, 'kill-s3-after');
    expect('status' in after.res && after.res.status, JSON.stringify(after.res)).toBe(201);
    const created = JSON.parse((after.res as { text: string }).text).data as { id: string };
    const [row] = await db.dataSource.query('SELECT storage_key FROM setups WHERE id = $1', [created.id]);
    expect(await bucketKeys()).toEqual([inFlight, row.storage_key].sort());
    expect(
      filesOnDisk().filter((f) => f === row.storage_key),
      'nothing went to local disk',
    ).toEqual([]);
  }, 60_000);
});
