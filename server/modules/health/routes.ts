import { z } from 'zod';
import { defineRoute } from '../../lib/route';
import { APP_VERSION } from '../../lib/version';

export const healthRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/health',
    summary: 'Liveness, database reachability and the change feed',
    tags: ['health'],
    access: 'public',
    response: z.object({ status: z.enum(['ok', 'degraded']), db: z.enum(['ok', 'down']), changes: z.enum(['ok', 'down']), version: z.string() }),
    handler: async ({ ctx }) => {
      // First over the change listener's own connection: it does not queue behind busy request
      // connections, so a loaded instance is not reported down. If that connection is away (it
      // reconnects by itself), ask through the pool.
      const changes = (await ctx.documentListener.ping(1000)) ? 'ok' : 'down';
      let db: 'ok' | 'down' = changes;
      if (db === 'down') {
        try {
          await Promise.race([
            ctx.dataSource.query('SELECT 1'),
            new Promise((_, reject) => setTimeout(() => reject(new Error('health check timed out')), 2000).unref()),
          ]);
          db = 'ok';
        } catch {
          db = 'down';
        }
      }
      // 503 only when the database is away: without the change feed the instance still serves, but
      // its search and caches may lag until the listener is back (hence "degraded").
      return { status: db === 'ok' ? 200 : 503, data: { status: db === 'ok' && changes === 'ok' ? 'ok' : 'degraded', db, changes, version: APP_VERSION } };
    },
  }),
];
