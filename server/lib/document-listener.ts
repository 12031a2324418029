import pg from 'pg';
import { DOCUMENT_KINDS } from '../../shared/constants';
import { DOCUMENT_CHANNEL, type DocumentChange } from './document-events';
import type { Logger } from './logger';

export type DocumentListener = {
  /** Calls `cb` for every committed change to a document's live content (from any app instance). Returns an unsubscribe function. */
  onDocumentChanged(cb: (change: DocumentChange) => void): () => void;
  /**
   * Calls `cb` after the connection was lost and came back: notifications sent in between are gone,
   * so anything derived from live content (caches, search index) should be rebuilt.
   */
  onReconnected(cb: () => void): () => void;
  /** Connects and LISTENs; if PostgreSQL is not reachable yet it keeps retrying in the background. */
  start(): Promise<void>;
  close(): Promise<void>;
  /** True while LISTEN is active. */
  readonly listening: boolean;
  /**
   * Asks PostgreSQL for `SELECT 1` over this dedicated connection: true when it answers within
   * `timeoutMs`. It never waits behind the request pool, so it tells whether the database is there even
   * when every pooled connection is busy.
   */
  ping(timeoutMs: number): Promise<boolean>;
};

const ACTIONS = new Set(['published', 'restored', 'hidden', 'unhidden', 'author-left']);

function parseChange(payload: string | undefined): DocumentChange | null {
  if (!payload) return null;
  try {
    const v = JSON.parse(payload) as Partial<DocumentChange>;
    if (!v || typeof v.slug !== 'string' || typeof v.documentId !== 'string') return null;
    if (!DOCUMENT_KINDS.includes(v.kind as never) || !ACTIONS.has(String(v.action))) return null;
    return { kind: v.kind!, documentId: v.documentId, slug: v.slug, action: v.action! };
  } catch {
    return null;
  }
}

/**
 * One dedicated PostgreSQL connection that LISTENs on the document channel and fans each change out
 * to in-process subscribers. A pooled connection cannot hold a LISTEN, hence its own client; it
 * reconnects with back-off when PostgreSQL restarts or the connection drops.
 */
export function createDocumentListener(opts: {
  connectionString: string;
  logger: Logger;
  minRetryMs?: number;
  maxRetryMs?: number;
  applicationName?: string;
}): DocumentListener {
  const minRetry = opts.minRetryMs ?? 250;
  const maxRetry = opts.maxRetryMs ?? 10_000;
  const changeSubs = new Set<(change: DocumentChange) => void>();
  const reconnectSubs = new Set<() => void>();
  let client: pg.Client | null = null;
  let listening = false;
  let closed = false;
  let everConnected = false;
  let failures = 0;
  let timer: NodeJS.Timeout | null = null;
  let connecting: Promise<void> | null = null;

  function fanOut<T>(subs: Set<(arg: T) => void>, arg: T) {
    for (const cb of subs) {
      try {
        cb(arg);
      } catch (err) {
        opts.logger.warn({ err: String(err) }, 'document change subscriber failed');
      }
    }
  }

  function scheduleReconnect() {
    if (closed || timer || connecting) return;
    const delay = Math.min(maxRetry, minRetry * 2 ** Math.min(failures, 10));
    timer = setTimeout(() => {
      timer = null;
      void connect();
    }, delay);
    timer.unref();
  }

  function dropClient(c: pg.Client) {
    if (client !== c) return;
    client = null;
    listening = false;
    c.removeAllListeners('notification');
    c.end().catch(() => {});
    scheduleReconnect();
  }

  function connect(): Promise<void> {
    if (connecting) return connecting;
    connecting = (async () => {
      const c = new pg.Client({
        connectionString: opts.connectionString,
        keepAlive: true,
        application_name: opts.applicationName ?? 'tunewright-document-listener',
        connectionTimeoutMillis: 5000,
      });
      c.on('error', (err) => {
        opts.logger.warn({ err: err.message }, 'document listener connection error; reconnecting');
        dropClient(c);
      });
      c.on('end', () => dropClient(c));
      c.on('notification', (msg) => {
        if (msg.channel !== DOCUMENT_CHANNEL) return;
        const change = parseChange(msg.payload);
        if (change) fanOut(changeSubs, change);
        else opts.logger.warn({ payload: msg.payload }, 'ignored a malformed document change notification');
      });
      try {
        await c.connect();
        if (closed) {
          await c.end();
          return;
        }
        await c.query(`LISTEN ${DOCUMENT_CHANNEL}`);
        client = c;
        listening = true;
        failures = 0;
        if (everConnected) {
          opts.logger.info('document listener reconnected');
          fanOut(reconnectSubs, undefined);
        }
        everConnected = true;
      } catch (err) {
        failures++;
        c.removeAllListeners();
        c.on('error', () => {});
        c.end().catch(() => {});
        if (!closed) opts.logger.warn({ err: String((err as Error).message ?? err), failures }, 'document listener could not connect; retrying');
      }
    })().finally(() => {
      connecting = null;
      if (!listening) scheduleReconnect();
    });
    return connecting;
  }

  return {
    onDocumentChanged(cb) {
      changeSubs.add(cb);
      return () => void changeSubs.delete(cb);
    },
    onReconnected(cb) {
      const wrapped = () => cb();
      reconnectSubs.add(wrapped);
      return () => void reconnectSubs.delete(wrapped);
    },
    start: () => connect(),
    async close() {
      closed = true;
      if (timer) clearTimeout(timer);
      timer = null;
      if (connecting) await connecting;
      const c = client;
      client = null;
      listening = false;
      if (c) {
        c.removeAllListeners();
        c.on('error', () => {});
        await c.end().catch(() => {});
      }
    },
    get listening() {
      return listening;
    },
    async ping(timeoutMs) {
      const c = client;
      if (!c || !listening) return false;
      let timer: ReturnType<typeof setTimeout> | undefined;
      try {
        return await Promise.race([
          c.query('SELECT 1').then(() => true),
          new Promise<boolean>((resolve) => {
            timer = setTimeout(() => resolve(false), timeoutMs);
            timer.unref();
          }),
        ]);
      } catch {
        return false;
      } finally {
        clearTimeout(timer);
      }
    },
  };
}
