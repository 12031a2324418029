import request from 'supertest';
import type { Express } from 'express';
import { loadConfig, type Config } from '../../server/config/env';
import { createApp } from '../../server/app';
import { createLogger } from '../../server/lib/logger';
import { createMailer, type Mailer } from '../../server/lib/mailer';
import { createDocumentListener } from '../../server/lib/document-listener';
import { createSearchService } from '../../server/modules/search/service';
import { startMailCatcher } from '../../server/lib/mail-catcher';
import { createStorage } from '../../server/lib/storage';
import os from 'node:os';
import path from 'node:path';
import fs from 'node:fs';
import { CapturedMailEntity } from '../../server/modules/dev-mail/captured-mail.entity';
import type { AppContext } from '../../server/context';
import { createDataSource } from '../../server/db/data-source';
import { createTestDatabase, type TestDatabase } from './test-db';

export type TestApp = {
  app: Express;
  ctx: AppContext;
  db: TestDatabase;
  mailer: Mailer;
  catcher: { port: number; close: () => Promise<void> } | null;
  /** Waits until a mail to `to` matching `subject` has been captured, and returns it. */
  waitForMail: (to: string, subject?: RegExp, timeoutMs?: number) => Promise<CapturedMailEntity>;
  close: () => Promise<void>;
};

/** createApp() on its own migrated database, with a loopback mail catcher, for one test file. */
export async function createTestApp(
  overrides: Record<string, string> = {},
  opts: { catcher?: boolean; serveClient?: boolean; db?: TestDatabase; clientDir?: string } = {},
): Promise<TestApp> {
  // Passing `db` puts a second app instance on the same database (as behind a load balancer).
  const db = opts.db ?? (await createTestDatabase());
  const dataSource = opts.db ? await createDataSource(db.url, { poolMax: 5 }).initialize() : db.dataSource;
  const uploadDir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-uploads-'));
  const catcher = opts.catcher === false ? null : await startMailCatcher({ dataSource: db.dataSource, port: 0 });
  const config: Config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: db.url,
    SMTP_URL: `smtp://127.0.0.1:${catcher?.port ?? 1}`,
    APP_URL: 'http://127.0.0.1:3000',
    RATE_LIMIT_AUTH_PER_15MIN: '10000',
    RATE_LIMIT_UPLOAD_PER_15MIN: '10000',
    OUTBOX_INTERVAL_MS: '200',
    // Each test app gets its own upload directory, removed on close.
    UPLOAD_DIR: uploadDir,
    // The tests turn the development helpers on explicitly (never with a production configuration).
    ...(overrides.NODE_ENV === 'production' ? {} : { DEV_TOOLS: 'true' }),
    ...overrides,
  });
  const logger = createLogger(config.logLevel);
  const mailer = createMailer({ dataSource, smtpUrl: config.smtpUrl, from: config.mailFrom, logger, intervalMs: config.outboxIntervalMs });
  const documentListener = createDocumentListener({ connectionString: db.url, logger, minRetryMs: 50, maxRetryMs: 500 });
  await documentListener.start();
  const search = createSearchService({ dataSource, logger, listener: documentListener });
  await search.start();
  const ctx: AppContext = { config, dataSource, mailer, logger, documentListener, storage: createStorage(config.storage), search };
  const created = createApp(ctx, { serveClient: opts.serveClient ?? false, clientDir: opts.clientDir });
  return {
    app: created.app,
    ctx,
    db,
    mailer,
    catcher,
    async waitForMail(to, subject, timeoutMs = 5000) {
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        await mailer.deliverPending();
        const rows = await db.dataSource.getRepository(CapturedMailEntity).find({ order: { receivedAt: 'DESC' } });
        const hit = rows.find((m) => m.to.includes(to) && (!subject || subject.test(m.subject)));
        if (hit) return hit;
        if (Date.now() > deadline) throw new Error(`no mail to ${to}${subject ? ` matching ${subject}` : ''} within ${timeoutMs} ms`);
        await new Promise((r) => setTimeout(r, 50));
      }
    },
    async close() {
      await mailer.stop();
      await search.close();
      await documentListener.close();
      await created.close();
      if (catcher) await catcher.close();
      if (opts.db) await dataSource.destroy();
      else await db.drop();
      fs.rmSync(uploadDir, { recursive: true, force: true });
    },
  };
}

/** A supertest agent that keeps cookies and sends the CSRF token on every state-changing call. */
export function createClient(app: Express) {
  const agent = request.agent(app);
  let token: string | null = null;
  async function csrfToken() {
    if (!token) token = (await agent.get('/api/csrf').expect(200)).body.data.token as string;
    return token;
  }
  const send = async (method: 'post' | 'patch' | 'put' | 'delete', path: string, body?: unknown) => {
    // Fetch the token first: the agent attaches its cookies when the request is created.
    const csrf = await csrfToken();
    const req = agent[method](path).set('x-csrf-token', csrf);
    return body === undefined ? req : req.send(body as object);
  };
  return {
    agent,
    get: (path: string) => agent.get(path),
    post: (path: string, body?: unknown) => send('post', path, body),
    patch: (path: string, body?: unknown) => send('patch', path, body),
    put: (path: string, body?: unknown) => send('put', path, body),
    delete: (path: string, body?: unknown) => send('delete', path, body),
    /** The session changed (sign-in/out): fetch a new token next time. */
    resetCsrf: () => {
      token = null;
    },
  };
}
export type TestClient = ReturnType<typeof createClient>;
