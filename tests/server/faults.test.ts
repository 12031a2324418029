import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { startCluster, freePort, ensureDatabase, type Cluster } from '../../server/bin/postgres.mjs';
import { createDataSource } from '../../server/db/data-source';
import { startMailCatcher } from '../../server/lib/mail-catcher';
import { startAppProcess, type AppProcess } from '../setup/app-process';
import { httpClient } from '../setup/http-client';
import { createClient, createTestApp, type TestApp } from '../setup/test-app';
import { STRONG_PASSWORD } from '../factories/user';

// Faults while people use the app: PostgreSQL restarted under load (its own small cluster, so the other
// test files keep theirs), and the mail catcher away while someone signs up.

/**
 * pg_ctl stop, as cluster.stop() runs it, but asynchronously: a synchronous stop would freeze this
 * process's own HTTP clients mid-request and turn keep-alive races into false "socket errors".
 */
function stopClusterWithoutBlocking(clusterDir: string) {
  const pgCtl = path.join(process.env.TEST_PG_BIN!, 'pg_ctl');
  const args = ['-D', path.join(clusterDir, 'data'), '-m', 'fast', '-w', '-t', '30', 'stop'];
  const root = typeof process.getuid === 'function' && process.getuid() === 0;
  return new Promise<void>((resolve, reject) => {
    const child = root ? spawn('runuser', ['-u', 'postgres', '--', pgCtl, ...args], { stdio: 'ignore' }) : spawn(pgCtl, args, { stdio: 'ignore' });
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`pg_ctl stop exited with ${code}`))));
  });
}

describe('PostgreSQL restarts in the middle of load', () => {
  let cluster: Cluster;
  let ds: DataSource;
  let app: AppProcess;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-faults-pg-'));

  beforeAll(async () => {
    const bin = process.env.TEST_PG_BIN;
    if (!bin) throw new Error('run with npm test (TEST_PG_BIN)');
    cluster = startCluster({ bin, dir, port: await freePort(), log: () => {} });
    ensureDatabase(cluster, 'faults');
    ds = createDataSource(cluster.urlFor('faults'), { poolMax: 2 });
    await ds.initialize();
    await ds.runMigrations();
    app = await startAppProcess(
      {
        NODE_ENV: 'test',
        LOG_LEVEL: 'error',
        DATABASE_URL: cluster.urlFor('faults'),
        SMTP_URL: 'smtp://127.0.0.1:1',
        OUTBOX_INTERVAL_MS: '60000',
        RATE_LIMIT_AUTH_PER_15MIN: '100000',
      },
      { readyTimeoutMs: 90_000 },
    );
  }, 120_000);

  afterAll(async () => {
    await app?.stop();
    await ds?.destroy().catch(() => {});
    cluster?.stop();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('answers 503 db_unavailable fast while it is down, recovers by itself, and leaves no half-written sign-up', async () => {
    type Seen = { at: number; what: string; status: number; ms: number; code?: string };
    // `at` is when the answer arrived; `at - ms` is when the request was sent.
    const seen: Seen[] = [];
    const socketErrors: Array<{ at: number; sent: number; message: string }> = [];
    const attempted: Array<{ email: string; status: number }> = [];
    let stop = false;

    async function loop(w: number) {
      for (let i = 0; i < 400 && !stop; i++) {
        const client = httpClient(app.baseUrl);
        let step = 'health';
        let sent = Date.now();
        const email = `outage-${w}-${i}-${crypto.randomBytes(3).toString('hex')}@tidewater.test`;
        try {
          const health = await client.get('/api/health', { timeoutMs: 10_000 });
          seen.push({ at: Date.now(), what: 'health', status: health.status, ms: health.ms, code: (health.body as { data?: { db?: string } })?.data?.db });
          step = 'csrf';
          sent = Date.now();
          const csrf = await client.get('/api/csrf', { timeoutMs: 10_000 });
          seen.push({ at: Date.now(), what: 'csrf', status: csrf.status, ms: csrf.ms, code: (csrf.body as { error?: { code: string } })?.error?.code });
          if (csrf.status !== 200) continue;
          step = 'sign-up';
          sent = Date.now();
          const signUp = await client.post(
            '/api/auth/sign-up',
            { email, displayName: `Outage ${w}`, password: STRONG_PASSWORD },
            { csrf: (csrf.body as { data: { token: string } }).data.token, timeoutMs: 10_000 },
          );
          seen.push({
            at: Date.now(),
            what: 'sign-up',
            status: signUp.status,
            ms: signUp.ms,
            code: (signUp.body as { error?: { code: string } })?.error?.code,
          });
          attempted.push({ email, status: signUp.status });
        } catch (err) {
          socketErrors.push({
            at: Date.now(),
            sent,
            message: `${w}/${i} ${step}: ${(err as Error).message} ${String((err as { cause?: unknown }).cause ?? '')}`,
          });
        }
        await new Promise((r) => setTimeout(r, 20));
      }
    }

    const loops = Array.from({ length: 6 }, (_, w) => loop(w));
    await new Promise((r) => setTimeout(r, 1500));
    await stopClusterWithoutBlocking(dir);
    const stoppedAt = Date.now();
    await new Promise((r) => setTimeout(r, 3000));
    const restartedAt = Date.now();
    cluster = startCluster({ bin: process.env.TEST_PG_BIN!, dir, port: cluster.port, log: () => {} });
    // Let the app find its way back, then keep the load on a little longer.
    let recoveredAt = 0;
    while (!recoveredAt && Date.now() - restartedAt < 15_000) {
      await new Promise((r) => setTimeout(r, 100));
      recoveredAt = seen.find((s) => s.at > restartedAt && s.what === 'sign-up' && s.status === 202)?.at ?? 0;
    }
    await new Promise((r) => setTimeout(r, 1000));
    stop = true;
    await Promise.all(loops);

    // Requests sent after PostgreSQL had fully stopped and answered before it was started again. (By
    // arrival time alone, an answer computed just before the stop but delivered late on a busy machine
    // would count as answered during the outage.)
    const during = seen.filter((s) => s.at - s.ms > stoppedAt + 50 && s.at < restartedAt);
    const slowest = Math.max(...seen.map((s) => s.ms));
    const statuses = (list: Seen[]) =>
      JSON.stringify(list.reduce<Record<string, number>>((acc, s) => ({ ...acc, [`${s.what} ${s.status}`]: (acc[`${s.what} ${s.status}`] ?? 0) + 1 }), {}));
    console.log(
      `faults: ${seen.length} responses; during the outage ${statuses(during)}; slowest ${slowest} ms; ` +
        `back ${recoveredAt ? recoveredAt - restartedAt : 'never'} ms after the restart; ${attempted.length} sign-ups tried`,
    );

    // No connection is reset, not even at the instant PostgreSQL goes away. (One or two used to be: a session
    // save failing after the answer went to Express's final handler, which destroyed the kept-alive socket.)
    if (socketErrors.length) console.log(`faults: ${socketErrors.length} socket errors: ${socketErrors.map((e) => e.message).join('; ')}`);
    expect(app.child.exitCode, `the app exited; its last words:\n${app.output().split('\n').slice(-40).join('\n')}`).toBeNull();
    expect(socketErrors.map((e) => e.message)).toEqual([]);
    // Fast while it is down (a refused connection, not a hang). Outside the outage a sign-up's password hash on a
    // machine busy with the rest of the suite can take seconds; the 10 s client timeout above bounds those.
    const slowestDuring = during.reduce<Seen | null>((a, s) => (a && a.ms >= s.ms ? a : s), null);
    expect(slowestDuring?.ms ?? 0, JSON.stringify(slowestDuring)).toBeLessThan(5000);
    const fivehundreds = seen.filter((s) => s.status >= 500 && s.status !== 503);
    if (fivehundreds.length)
      console.log(
        `faults: unexpected answers ${JSON.stringify(fivehundreds)}\n${app
          .output()
          .split('\n')
          .filter((l) => !l.includes('ECONNREFUSED'))
          .join('\n')}`,
      );
    expect(fivehundreds).toEqual([]);
    expect(during.length).toBeGreaterThan(5);
    for (const s of during) {
      expect(s.status, JSON.stringify(s)).toBe(503);
      expect(s.code, JSON.stringify(s)).toBe(s.what === 'health' ? 'down' : 'db_unavailable');
    }
    expect(recoveredAt, 'a sign-up succeeded after the restart').toBeGreaterThan(0);

    // No half-written sign-up: each attempt left the account, its verification token and its mail together, or nothing.
    for (const { email, status } of attempted) {
      const [row] = await ds.query(
        `SELECT (SELECT count(*)::int FROM users WHERE email = $1) AS users,
                (SELECT count(*)::int FROM user_tokens t JOIN users u ON u.id = t.user_id WHERE u.email = $1 AND t.purpose = 'verify_email') AS tokens,
                (SELECT count(*)::int FROM outbox WHERE to_address = $1) AS mails`,
        [email],
      );
      const whole = row.users === 1 && row.tokens === 1 && row.mails === 1;
      const none = row.users === 0 && row.tokens === 0 && row.mails === 0;
      expect(whole || none, `${email} (${status}): ${JSON.stringify(row)}`).toBe(true);
      if (status === 202) expect(whole, `${email} was acknowledged`).toBe(true);
    }
  }, 90_000);
});

describe('the mail catcher is away during sign-up', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
    t.mailer.start();
  });
  afterAll(async () => {
    await t.close();
  });

  it('the sign-up succeeds, the mail waits in the outbox, and arrives by the normal retry once the catcher is back', async () => {
    const port = t.catcher!.port;
    await t.catcher!.close();
    const email = 'harbour-newcomer@tidewater.test';
    const client = createClient(t.app);
    const res = await client.post('/api/auth/sign-up', { email, displayName: 'Harbour Newcomer', password: STRONG_PASSWORD });
    expect(res.status).toBe(202);

    // The first delivery attempt fails and the mail stays queued with its error.
    let held: { sent_at: Date | null; attempts: number; last_error: string | null } | undefined;
    for (let i = 0; i < 50 && !(held && held.attempts > 0); i++) {
      await new Promise((r) => setTimeout(r, 100));
      [held] = await t.db.dataSource.query(`SELECT sent_at, attempts, last_error FROM outbox WHERE to_address = $1`, [email]);
    }
    expect(held?.sent_at).toBeNull();
    expect(held?.attempts).toBeGreaterThanOrEqual(1);
    expect(held?.last_error).toBeTruthy();
    expect(await t.db.dataSource.query(`SELECT 1 FROM captured_mail WHERE to_address = $1`, [email])).toEqual([]);

    const back = await startMailCatcher({ dataSource: t.db.dataSource, port });
    try {
      const started = Date.now();
      // No shortcut past the back-off: the periodic pass delivers it when the retry is due.
      const mail = await t.waitForMail(email, /confirm/i, 15_000);
      console.log(`faults: the held mail was delivered ${Date.now() - started} ms after the catcher came back`);
      const token = /token=([A-Za-z0-9_-]+)/.exec(mail.text)?.[1];
      expect(token).toBeTruthy();
      const verified = await createClient(t.app).post('/api/auth/verify', { token });
      expect(verified.status).toBe(200);
      const [row] = await t.db.dataSource.query(`SELECT sent_at FROM outbox WHERE to_address = $1`, [email]);
      expect(row.sent_at).not.toBeNull();
    } finally {
      await back.close();
    }
  }, 30_000);
});
