import { z } from 'zod';
import { defineRoute } from '../../lib/route';
import { APP_VERSION } from '../../lib/version';

export const healthRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/health',
    summary: 'Liveness and database reachability',
    tags: ['health'],
    access: 'public',
    response: z.object({ status: z.enum(['ok', 'degraded']), db: z.enum(['ok', 'down']), version: z.string() }),
    handler: async ({ ctx }) => {
      let db: 'ok' | 'down' = 'ok';
      try {
        await Promise.race([
          ctx.dataSource.query('SELECT 1'),
          new Promise((_, reject) => setTimeout(() => reject(new Error('health check timed out')), 2000).unref()),
        ]);
      } catch {
        db = 'down';
      }
      return { status: db === 'ok' ? 200 : 503, data: { status: db === 'ok' ? 'ok' : 'degraded', db, version: APP_VERSION } };
    },
  }),
];
