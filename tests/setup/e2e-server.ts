import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { seed as seedDatabase } from '../../server/db/seed';
import { createTestApp, type TestApp } from './test-app';

export type E2EServer = {
  /** http://127.0.0.1:<port>, no trailing slash. */
  baseUrl: string;
  t: TestApp;
  /** Stops answering on the port but keeps the database (another server takes over, as in a deployment). */
  stopListening: () => Promise<void>;
  close: () => Promise<void>;
};

export type E2EServerOptions = {
  /** Run seed() (library, demo accounts and guides) before listening. Default true (false with `db`). */
  seed?: boolean;
  /** Extra environment for loadConfig (e.g. rate limits). */
  env?: Record<string, string>;
  /** Start the loopback mail catcher (sign-up and password flows need it). Default true. */
  catcher?: boolean;
  /** Serve the client from this build instead of dist/ (a second build, as after a deployment). */
  clientDir?: string;
  /** Listen on this port instead of a free one (a new deployment at the same address). */
  port?: number;
  /** Share another server's database instead of creating one (that server seeded it already). */
  db?: TestApp['db'];
};

/**
 * The real app, serving the built client from dist/, on its own test database and a free port, for
 * browser tests. `npm test` builds dist/ first; run `npx vite build` yourself when running one file alone.
 */
export async function start(opts: E2EServerOptions = {}): Promise<E2EServer> {
  const index = path.resolve(opts.clientDir ?? path.resolve(process.cwd(), 'dist'), 'index.html');
  if (!fs.existsSync(index)) throw new Error('dist/index.html is missing: run `npx vite build` (npm test does it for you).');
  const t = await createTestApp(opts.env ?? {}, { catcher: opts.catcher ?? true, serveClient: true, clientDir: opts.clientDir, db: opts.db });
  try {
    if (opts.seed ?? !opts.db) {
      await seedDatabase(t.db.dataSource, { demo: true, bcryptCost: 4 });
      await t.ctx.search.build(); // seeding writes rows directly, without change notifications
    }
    t.mailer.start();
    const server = t.app.listen(opts.port ?? 0, '127.0.0.1');
    await new Promise<void>((resolve, reject) => {
      server.once('listening', resolve);
      server.once('error', reject);
    });
    const { port } = server.address() as AddressInfo;
    const stopListening = async () => {
      if (!server.listening) return;
      // Browsers keep connections alive; drop them so close() does not wait for their timeout.
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    };
    return {
      baseUrl: `http://127.0.0.1:${port}`,
      t,
      stopListening,
      async close() {
        await stopListening();
        await t.close();
      },
    };
  } catch (err) {
    await t.close();
    throw err;
  }
}
