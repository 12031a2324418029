import { z } from 'zod';
import { defineRoute } from '../../lib/route';
import { APP_VERSION } from '../../lib/version';
import type { AppContext } from '../../context';

type Check = { db: 'ok' | 'down'; changes: 'ok' | 'down' };

async function check(ctx: AppContext): Promise<Check> {
  // First over the change listener's own connection: it does not queue behind busy request
  // connections, so a loaded instance is not reported down. If that connection is away (it
  // reconnects by itself), ask through the pool.
  if (await ctx.documentListener.ping(1000)) return { db: 'ok', changes: 'ok' };
  try {
    await Promise.race([
      ctx.dataSource.query('SELECT 1'),
      new Promise((_, reject) => setTimeout(() => reject(new Error('health check timed out')), 2000).unref()),
    ]);
    return { db: 'ok', changes: 'down' };
  } catch {
    return { db: 'down', changes: 'down' };
  }
}

/**
 * Checks arriving while one is under way share its answer: many probes at once (several balancers,
 * a monitoring burst) cost one query, not a queue of them on the one connection.
 */
const inFlight = new WeakMap<AppContext, Promise<Check>>();
function checkOnce(ctx: AppContext): Promise<Check> {
  let running = inFlight.get(ctx);
  if (!running) {
    running = check(ctx).finally(() => inFlight.delete(ctx));
    inFlight.set(ctx, running);
  }
  return running;
}

export const healthRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/health',
    summary: 'Liveness, database reachability and the change feed',
    tags: ['health'],
    access: 'public',
    response: z.object({ status: z.enum(['ok', 'degraded']), db: z.enum(['ok', 'down']), changes: z.enum(['ok', 'down']), version: z.string() }),
    handler: async ({ ctx }) => {
      const { db, changes } = await checkOnce(ctx);
      // 503 only when the database is away: without the change feed the instance still serves, but
      // its search and caches may lag until the listener is back (hence "degraded").
      return { status: db === 'ok' ? 200 : 503, data: { status: db === 'ok' && changes === 'ok' ? 'ok' : 'degraded', db, changes, version: APP_VERSION } };
    },
  }),
];
