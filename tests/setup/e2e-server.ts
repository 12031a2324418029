import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createTestApp, type TestApp } from './test-app';
import { seed } from '../../server/db/seed';

export type E2EServer = { baseUrl: string; t: TestApp; close: () => Promise<void> };

/**
 * The real app (API + built client from dist/) on a loopback port, on its own test database
 * with a mail catcher. `seedContent` loads the library and demo guides first.
 */
export async function start(opts: { seedContent?: boolean; env?: Record<string, string> } = {}): Promise<E2EServer> {
  const t = await createTestApp(opts.env ?? {}, { serveClient: true });
  if (opts.seedContent) {
    await seed(t.db.dataSource, { demo: true, bcryptCost: 4 });
    await t.ctx.search.build(); // seeding writes rows directly, without change notifications
  }
  t.mailer.start();
  const server: Server = await new Promise((resolve) => {
    const s = t.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    t,
    close: async () => {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await t.close();
    },
  };
}
