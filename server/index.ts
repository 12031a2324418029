import 'reflect-metadata';
import { loadConfig } from './config/env';
import { createDataSource } from './db/data-source';
import { createLogger } from './lib/logger';
import { createMailer } from './lib/mailer';
import { createDocumentListener } from './lib/document-listener';
import { createStorage, SWEEP_GRACE_MS } from './lib/storage';
import { createSearchService } from './modules/search/service';
import { createApp } from './app';
import { DEMO_ACCOUNTS } from './db/demo-accounts';
import type { AppContext } from './context';
import { warmBodyDiffWorker } from './modules/revisions/body-diff-pool';
import { IMAGE_KEYS_SQL, IMAGE_SWEEP_GRACE_MS, sweepImages } from './modules/images/sweep';
import { startDigests } from './modules/watches/service';
import { isConnectionLoss } from './lib/connection-loss';

// Every key a row still points at: uploaded setups, run logs' raw files and columns, and each stored width of an image.
const REFERENCED_KEYS_SQL = `SELECT storage_key FROM setups WHERE storage_key = ANY($1) UNION SELECT raw_key FROM runs WHERE raw_key = ANY($1) UNION SELECT data_key FROM runs WHERE data_key = ANY($1) UNION ${IMAGE_KEYS_SQL}`;

async function main() {
  const config = loadConfig();
  const logger = createLogger(config.logLevel);
  process.on('unhandledRejection', (reason) => {
    // A promise nobody awaited: the request it belonged to has already been answered or timed out.
    logger.error({ err: reason instanceof Error ? { message: reason.message, stack: reason.stack } : String(reason) }, 'unhandled promise rejection');
  });
  process.on('uncaughtException', (err, origin) => {
    if (isConnectionLoss(err)) {
      logger.error(
        { err: { message: err.message, code: (err as { code?: string }).code, stack: err.stack }, origin },
        'a database connection was lost; carrying on',
      );
      return;
    }
    logger.fatal({ err: { message: err.message, stack: err.stack }, origin }, 'uncaught exception; stopping');
    process.exit(1);
  });
  const dataSource = createDataSource(config.databaseUrl);
  await dataSource.initialize();
  const storage = createStorage(config.storage);
  try {
    // The grace keeps a write still in flight in another instance safe (see SWEEP_GRACE_MS).
    const swept = await storage.sweep({
      olderThan: new Date(Date.now() - SWEEP_GRACE_MS[storage.driver]),
      referenced: async (keys) => new Set((await dataSource.query(REFERENCED_KEYS_SQL, [keys])).map((r: { storage_key: string }) => r.storage_key)),
    });
    if (swept.temp.length || swept.orphans.length)
      logger.warn({ driver: storage.driver, temp: swept.temp, orphans: swept.orphans }, 'removed upload files left by an interrupted write');
  } catch (err) {
    // Housekeeping only: an unreachable bucket must not keep the app from serving; the next start tries again.
    logger.error({ err, driver: storage.driver }, 'the start-up sweep of stored uploads failed');
  }
  // Unused images: at start and then every six hours (a long-running instance would otherwise keep them forever).
  const sweepUnusedImages = async () => {
    try {
      const images = await sweepImages({ dataSource, storage, logger }, new Date(Date.now() - IMAGE_SWEEP_GRACE_MS));
      if (images.length) logger.info({ images }, 'removed images no revision uses');
    } catch (err) {
      logger.error({ err }, 'the sweep of unused images failed');
    }
  };
  await sweepUnusedImages();
  setInterval(() => void sweepUnusedImages(), 6 * 60 * 60 * 1000).unref();
  const mailer = createMailer({ dataSource, smtpUrl: config.smtpUrl, from: config.mailFrom, logger, intervalMs: config.outboxIntervalMs });
  const documentListener = createDocumentListener({ connectionString: config.databaseUrl, logger });
  await documentListener.start();
  const search = createSearchService({ dataSource, logger, listener: documentListener });
  await search.start();
  const ctx: AppContext = { config, dataSource, mailer, logger, documentListener, storage, search };
  const { app, close } = createApp(ctx);
  mailer.start();
  startDigests(ctx);
  warmBodyDiffWorker();
  const server = app.listen(config.port, config.host, () => {
    const url = `http://${config.host}:${config.port}`;
    const lines = [`Tunewright is serving on ${url}`];
    if (config.devTools) {
      lines.push(`Captured mail: ${url}/dev/mail`, 'Demo accounts (local demo only):');
      for (const a of DEMO_ACCOUNTS.filter((d) => d.printed)) lines.push(`  ${a.role.padEnd(9)} ${a.email.padEnd(24)} ${a.password}`);
    }
    const since = Number(process.env.TW_STARTED_AT);
    if (since) lines.push(`Ready in ${((Date.now() - since) / 1000).toFixed(1)} s`);
    console.log(lines.join('\n'));
  });
  // Keep idle connections open longer than the clients and balancers in front of us do (they commonly
  // idle out at 60 s): with Node's 5 s default, a client reusing a connection just as the server closes
  // it gets a connection reset instead of an answer.
  server.keepAliveTimeout = 65_000;
  server.headersTimeout = 66_000;

  let closing = false;
  const shutdown = async () => {
    if (closing) return;
    closing = true;
    server.close();
    server.closeIdleConnections();
    setTimeout(() => server.closeAllConnections(), 3000).unref();
    await mailer.stop();
    await search.close();
    await documentListener.close();
    await close();
    await dataSource.destroy();
    process.exit(0);
  };
  process.on('SIGTERM', shutdown);
  process.on('SIGINT', shutdown);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
