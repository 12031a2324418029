import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedParameters } from '../../server/db/seed-content';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { createDiskStorage, createS3Storage, newStorageKey, sweepDiskStorage, SWEEP_GRACE_MS, type Storage } from '../../server/lib/storage';
import { createClient, createTestApp, type TestApp } from '../setup/test-app';
import { signedInClient } from '../factories/user';
import { buildSetupRecord } from '../factories/setup-record';

const BUCKET = 'tunewright-test';
// s3rver accepts any credentials; these are placeholders, not secrets.
const FAKE_KEY = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

function driverContract(name: string, make: () => Storage) {
  describe(`${name} storage driver`, () => {
    it('puts, gets and deletes an object by key', async () => {
      const storage = make();
      const key = newStorageKey('setups', 'json');
      const body = Buffer.from('{"hello":"harbour flats"}');
      await storage.put(key, body, 'application/json');
      expect(await storage.get(key)).toEqual(body);
      await storage.delete(key);
      expect(await storage.get(key)).toBeNull();
      await expect(storage.delete(key)).resolves.toBeUndefined();
    });

    it('refuses keys it could not have generated', async () => {
      const storage = make();
      for (const key of ['../escape.json', 'setups/../../x.json', '/etc/passwd.json', 'Setups/UPPER.json', 'setups/a.exe']) {
        await expect(storage.put(key, Buffer.from('x'), 'text/plain')).rejects.toThrow(/Refusing storage key/);
      }
    });
  });
}

describe('storage', () => {
  let dir: string;
  let s3: S3rver;
  let endpoint: string;
  let s3Dir: string;

  /** s3rver keeps each object as `<key>._S3rver_object` under its directory and reports the file's mtime as LastModified. */
  function ageS3rverObject(key: string, when: Date) {
    const file = path.join(s3Dir, BUCKET, ...path.posix.dirname(key).split('/'), `${path.posix.basename(key)}._S3rver_object`);
    fs.utimesSync(file, when, when);
  }

  beforeAll(async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-disk-'));
    s3Dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-s3rver-'));
    s3 = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: s3Dir, configureBuckets: [{ name: BUCKET }] });
    const address = await s3.run();
    endpoint = `http://127.0.0.1:${address.port}`;
  });
  afterAll(async () => {
    await s3?.close();
    fs.rmSync(dir, { recursive: true, force: true });
    fs.rmSync(s3Dir, { recursive: true, force: true });
  });

  driverContract('disk', () => createDiskStorage(dir));
  driverContract('s3', () => createS3Storage({ endpoint, region: 'us-east-1', bucket: BUCKET, forcePathStyle: true, ...FAKE_KEY }));

  it('disk writes leave no partial files behind', async () => {
    const storage = createDiskStorage(dir);
    const keys = Array.from({ length: 20 }, () => newStorageKey('setups', 'csv'));
    await Promise.all(keys.map((k, i) => storage.put(k, Buffer.from(`row ${i}\r\n`), 'text/csv')));
    const files = fs.readdirSync(dir, { recursive: true }).map(String);
    expect(files.filter((f) => f.endsWith('.partial'))).toEqual([]);
    for (const [i, k] of keys.entries()) expect((await storage.get(k))?.toString()).toBe(`row ${i}\r\n`);
  });

  it("the start-up sweep removes old temp files and unreferenced objects, and keeps rows' objects, fresh files and foreign names", async () => {
    const root = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-sweep-'));
    try {
      const storage = createDiskStorage(root);
      const kept = newStorageKey('setups', 'json');
      const orphan = newStorageKey('setups', 'csv');
      const fresh = newStorageKey('setups', 'json');
      for (const k of [kept, orphan, fresh]) await storage.put(k, Buffer.from('{}'), 'application/json');
      const dirOf = path.join(root, path.dirname(kept));
      const oldTemp = path.join(dirOf, `.${path.basename(orphan)}.0123456789ab.partial`);
      const freshTemp = path.join(dirOf, `.${path.basename(fresh)}.ba9876543210.partial`);
      const foreign = path.join(root, 'README.txt');
      for (const f of [oldTemp, freshTemp, foreign]) fs.writeFileSync(f, 'half');
      const past = new Date(Date.now() - 10 * 60_000);
      for (const f of [path.join(root, kept), path.join(root, orphan), oldTemp, foreign]) fs.utimesSync(f, past, past);
      const asked: string[][] = [];
      const result = await sweepDiskStorage(root, {
        olderThan: new Date(Date.now() - 60_000),
        referenced: async (keys) => {
          asked.push(keys);
          return new Set(keys.filter((k) => k === kept));
        },
      });
      expect(result.temp).toEqual([path.relative(root, oldTemp)]);
      expect(result.orphans).toEqual([orphan]);
      // Only old objects are looked up; the fresh one may belong to a row still being written elsewhere.
      expect(asked.flat().sort()).toEqual([kept, orphan].sort());
      expect(fs.existsSync(oldTemp)).toBe(false);
      expect(await storage.get(orphan)).toBeNull();
      expect(await storage.get(kept)).not.toBeNull();
      expect(await storage.get(fresh)).not.toBeNull();
      expect(fs.existsSync(freshTemp)).toBe(true);
      expect(fs.existsSync(foreign)).toBe(true);
      expect(await sweepDiskStorage(path.join(root, 'missing'), { olderThan: new Date(), referenced: async () => new Set() })).toEqual({
        temp: [],
        orphans: [],
      });
    } finally {
      fs.rmSync(root, { recursive: true, force: true });
    }
  });

  it("the S3 driver's start-up sweep removes old unreferenced objects under the app's prefix, and keeps rows' objects, fresh objects and foreign keys", async () => {
    // Small pages, so the sweep has to follow the listing across several of them.
    const storage = createS3Storage({ endpoint, region: 'us-east-1', bucket: BUCKET, forcePathStyle: true, ...FAKE_KEY, listPageSize: 2 });
    const raw = new S3Client({
      endpoint,
      region: 'us-east-1',
      forcePathStyle: true,
      credentials: FAKE_KEY,
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    });
    const kept = [newStorageKey('setups', 'json'), newStorageKey('setups', 'csv')];
    const orphans = [newStorageKey('setups', 'json'), newStorageKey('setups', 'csv'), newStorageKey('setups', 'json')];
    const fresh = newStorageKey('setups', 'json');
    for (const k of [...kept, ...orphans, fresh]) await storage.put(k, Buffer.from('{}'), 'application/json');
    // Another application's objects in the same bucket: outside our prefix, or not a key we could have made.
    const foreign = ['other-app/2026/01/notes.json', 'setups/Shared Notes.TXT', 'setups-archive/2026/01/x.json'];
    for (const k of foreign) await raw.send(new PutObjectCommand({ Bucket: BUCKET, Key: k, Body: 'theirs' }));
    // s3rver reports an object's LastModified from its file's mtime: age everything but the fresh one.
    const past = new Date(Date.now() - 30 * 60_000);
    for (const k of [...kept, ...orphans, ...foreign]) ageS3rverObject(k, past);
    const asked: string[][] = [];
    const result = await storage.sweep({
      olderThan: new Date(Date.now() - SWEEP_GRACE_MS.s3),
      referenced: async (keys) => {
        asked.push(keys);
        return new Set(keys.filter((k) => kept.includes(k)));
      },
    });
    expect(result.temp).toEqual([]);
    expect([...result.orphans].sort()).toEqual([...orphans].sort());
    // Only old keys the app could have written were looked up, a page at a time.
    expect(asked.flat().sort()).toEqual([...kept, ...orphans].sort());
    expect(asked.length).toBeGreaterThan(1);
    for (const k of orphans) expect(await storage.get(k)).toBeNull();
    for (const k of [...kept, fresh]) expect(await storage.get(k)).not.toBeNull();
    for (const k of foreign) expect((await raw.send(new GetObjectCommand({ Bucket: BUCKET, Key: k }))).$metadata.httpStatusCode).toBe(200);
    // A second pass finds nothing more to do.
    expect((await storage.sweep({ olderThan: new Date(Date.now() - SWEEP_GRACE_MS.s3), referenced: async (keys) => new Set(keys) })).orphans).toEqual([]);
    for (const k of [...kept, fresh, ...foreign]) await raw.send(new DeleteObjectCommand({ Bucket: BUCKET, Key: k }));
    raw.destroy();
  });

  describe('POST /api/setups with STORAGE_DRIVER=s3', () => {
    let t: TestApp;
    beforeAll(async () => {
      t = await createTestApp({
        STORAGE_DRIVER: 's3',
        STORAGE_S3_ENDPOINT: endpoint,
        STORAGE_S3_BUCKET: BUCKET,
        STORAGE_S3_ACCESS_KEY_ID: FAKE_KEY.accessKeyId,
        STORAGE_S3_SECRET_ACCESS_KEY: FAKE_KEY.secretAccessKey,
      });
      await seedParameters(t.db.dataSource);
    });
    afterAll(async () => {
      await t?.close();
    });

    it('stores the upload in the bucket, serves it back, and deletes it', async () => {
      expect(t.ctx.storage.driver).toBe('s3');
      const { client } = await signedInClient(t);
      const token = (await client.agent.get('/api/csrf')).body.data.token as string;
      const body = JSON.stringify(buildSetupRecord());
      const res = await client.agent
        .post('/api/setups')
        .set('x-csrf-token', token)
        .attach('file', Buffer.from(body), { filename: 'bucket.json', contentType: 'application/json' });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const key = (await t.db.dataSource.query('SELECT storage_key FROM setups WHERE id = $1', [res.body.data.id]))[0].storage_key as string;
      const bucketView = createS3Storage({ endpoint, region: 'us-east-1', bucket: BUCKET, forcePathStyle: true, ...FAKE_KEY });
      expect((await bucketView.get(key))?.toString()).toBe(body);
      expect(fs.readdirSync(t.ctx.config.uploadDir)).toEqual([]); // nothing went to local disk
      const dl = await client.get(`/api/setups/${res.body.data.id}/download`);
      expect(dl.text).toBe(body);
      expect((await client.delete(`/api/setups/${res.body.data.id}`)).status).toBe(204);
      expect(await bucketView.get(key)).toBeNull();
      expect((await createClient(t.app).get(`/api/setups/${res.body.data.id}`)).status).toBe(401);
    });
  });
});
