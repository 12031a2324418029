import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { startCluster, freePort, ensureDatabase, type Cluster } from '../../server/bin/postgres.mjs';
import { createDataSource } from '../../server/db/data-source';
import { loadConfig } from '../../server/config/env';
import { createLogger } from '../../server/lib/logger';
import { createSearchService } from '../../server/modules/search/service';
import { createMailer } from '../../server/lib/mailer';
import { createDiskStorage } from '../../server/lib/storage';
import { createApp } from '../../server/app';
import type { AppContext } from '../../server/context';
import { createDocumentListener } from '../../server/lib/document-listener';
import type { DataSource } from 'typeorm';

// Its own small cluster, so stopping PostgreSQL here does not disturb the other test files.
let cluster: Cluster;
let ds: DataSource;
let ctx: AppContext;
let closeApp: () => Promise<void>;
let app: ReturnType<typeof createApp>['app'];
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-health-pg-'));

beforeAll(async () => {
  const bin = process.env.TEST_PG_BIN;
  if (!bin) throw new Error('run with npm test (TEST_PG_BIN)');
  cluster = startCluster({ bin, dir, port: await freePort(), log: () => {} });
  ensureDatabase(cluster, 'health');
  ds = createDataSource(cluster.urlFor('health'));
  await ds.initialize();
  await ds.runMigrations();
  const config = loadConfig({ NODE_ENV: 'test', DEV_TOOLS: 'true', DATABASE_URL: cluster.urlFor('health'), SMTP_URL: 'smtp://127.0.0.1:1' });
  const logger = createLogger('silent');
  const documentListener = createDocumentListener({ connectionString: cluster.urlFor('health'), logger, minRetryMs: 50, maxRetryMs: 500 });
  await documentListener.start();
  ctx = {
    config,
    dataSource: ds,
    logger,
    documentListener,
    mailer: createMailer({ dataSource: ds, smtpUrl: config.smtpUrl, from: config.mailFrom, logger, intervalMs: 60_000 }),
    storage: createDiskStorage(path.join(dir, 'uploads')),
    search: createSearchService({ dataSource: ds, logger }),
  };
  const created = createApp(ctx, { serveClient: false });
  app = created.app;
  closeApp = created.close;
}, 60_000);

afterAll(async () => {
  await closeApp?.();
  await ctx?.documentListener.close();
  await ds?.destroy().catch(() => {});
  cluster?.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('GET /api/health', () => {
  it('reports ok, then 503 with db down while PostgreSQL is stopped, and recovers by itself', async () => {
    const ok = await request(app).get('/api/health');
    expect(ok.status).toBe(200);
    expect(ok.body.data).toMatchObject({ status: 'ok', db: 'ok', changes: 'ok' });
    expect(ok.body.data.version).toMatch(/^\d+\.\d+\.\d+/);

    cluster.stop();
    const started = Date.now();
    const down = await request(app).get('/api/health');
    expect(Date.now() - started).toBeLessThan(5000);
    expect(down.status).toBe(503);
    expect(down.body.data).toMatchObject({ status: 'degraded', db: 'down', changes: 'down' });
    // Routes that need the database fail fast in the error shape, not with a 500 or a hang.
    const me = await request(app).get('/api/auth/me').set('Cookie', 'tw.sid=s%3Aabc.def');
    expect([200, 503]).toContain(me.status);
    const csrf = await request(app).get('/api/csrf');
    expect(csrf.status).toBe(503);
    expect(csrf.body.error.code).toBe('db_unavailable');

    cluster = startCluster({ bin: process.env.TEST_PG_BIN!, dir, port: cluster.port, log: () => {} });
    let back = await request(app).get('/api/health');
    for (let i = 0; i < 20 && back.status !== 200; i++) {
      await new Promise((r) => setTimeout(r, 250));
      back = await request(app).get('/api/health');
    }
    expect(back.status).toBe(200);
    expect(back.body.data.db).toBe('ok');
    // The change listener reconnects on its own too (with back-off), and health says so.
    for (let i = 0; i < 40 && back.body.data.changes !== 'ok'; i++) {
      await new Promise((r) => setTimeout(r, 250));
      back = await request(app).get('/api/health');
    }
    expect(back.body.data).toMatchObject({ status: 'ok', db: 'ok', changes: 'ok' });
  }, 60_000);

  it('stays ok and quick while every pooled connection is busy (it does not queue behind them)', async () => {
    // Occupy the whole request pool (10 connections) for three seconds.
    let firstFreed = Infinity;
    const busy = Array.from({ length: 10 }, () => ds.query('SELECT pg_sleep(3)').then(() => (firstFreed = Math.min(firstFreed, Date.now()))));
    const pool = (ds.driver as unknown as { master: { totalCount: number; idleCount: number } }).master;
    await expect.poll(() => pool.totalCount - pool.idleCount).toBe(10); // all of them taken
    const res = await request(app).get('/api/health');
    const answeredAt = Date.now();
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ status: 'ok', db: 'ok', changes: 'ok' });
    // Answered while the pool was still fully busy: it did not wait for a pooled connection.
    expect(answeredAt).toBeLessThan(firstFreed);
    await Promise.all(busy);
  }, 30_000);
});

describe('GET /api/health under a burst', () => {
  it('answers many probes at once with one check of the database, not one each', async () => {
    const listener = ctx.documentListener;
    const original = listener.ping.bind(listener);
    let pings = 0;
    // A slow answer (as from a busy machine): probes arriving meanwhile must wait for this one, not start their own.
    listener.ping = async (ms) => {
      pings++;
      await new Promise((r) => setTimeout(r, 150));
      return original(ms);
    };
    try {
      const server = (await import('node:http')).createServer(app);
      await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
      const port = (server.address() as { port: number }).port;
      // Twenty probes sent together over separate connections.
      const answers = await Promise.all(
        Array.from({ length: 20 }, () =>
          fetch(`http://127.0.0.1:${port}/api/health`, { headers: { connection: 'close' } }).then(async (r) => ({ status: r.status, body: await r.json() })),
        ),
      );
      await new Promise<void>((r) => server.close(() => r()));
      expect(answers.every((a) => a.status === 200 && a.body.data.db === 'ok' && a.body.data.changes === 'ok')).toBe(true);
      expect(pings).toBeGreaterThanOrEqual(1);
      expect(pings).toBeLessThan(20);
    } finally {
      listener.ping = original;
    }
  });
});

describe('security headers', () => {
  it('sets a CSP without inline script, nosniff, frame-ancestors and a referrer policy', async () => {
    const res = await request(app).get('/api/health');
    const csp = String(res.headers['content-security-policy']);
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(csp).toContain("frame-ancestors 'none'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['referrer-policy']).toBe('strict-origin-when-cross-origin');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('GET /api/openapi.json', () => {
  it('documents every route of the table', async () => {
    const res = await request(app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    expect(res.body.paths['/api/admin/users/{id}'].patch.requestBody).toBeDefined();
    expect(res.body.paths['/api/auth/sign-up'].post.responses['202']).toBeDefined();
  });
});
