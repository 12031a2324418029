import pg from 'pg';
import { DOCUMENT_CHANNEL, type DocumentChange } from '../../lib/document-events';
import type { Logger } from '../../lib/logger';

export type DocumentListener = {
  /** Resolves once LISTEN is active (the first time). */
  ready: Promise<void>;
  close: () => Promise<void>;
};

type Options = {
  connectionString: string;
  onChange: (change: DocumentChange) => void;
  /** Called after a lost connection is re-established: changes may have been missed meanwhile. */
  onReconnect?: () => void;
  logger?: Logger;
  /** First retry delay; doubles up to maxDelayMs. */
  minDelayMs?: number;
  maxDelayMs?: number;
};

/**
 * A dedicated PostgreSQL connection that LISTENs on the document channel and reconnects with
 * back-off when the server restarts. Kept small so a shared listener can replace it later.
 */
export function listenForDocumentChanges(opts: Options): DocumentListener {
  const minDelay = opts.minDelayMs ?? 250;
  const maxDelay = opts.maxDelayMs ?? 10_000;
  let client: pg.Client | null = null;
  let closed = false;
  let attempt = 0;
  let timer: NodeJS.Timeout | null = null;
  let connectedOnce = false;
  let resolveReady!: () => void;
  const ready = new Promise<void>((r) => (resolveReady = r));

  const schedule = () => {
    if (closed || timer) return;
    const delay = Math.min(maxDelay, minDelay * 2 ** attempt++);
    timer = setTimeout(() => {
      timer = null;
      void connect();
    }, delay);
    timer.unref?.();
  };

  const connect = async () => {
    if (closed) return;
    const c = new pg.Client({ connectionString: opts.connectionString, application_name: 'tunewright-search-listener', keepAlive: true });
    client = c;
    let failed = false;
    const fail = (err?: Error) => {
      if (failed) return;
      failed = true;
      if (client === c) client = null;
      c.removeAllListeners('notification');
      c.end().catch(() => {});
      if (!closed) {
        opts.logger?.warn({ err: err?.message }, 'search: document listener lost its connection; retrying');
        schedule();
      }
    };
    c.on('error', fail);
    c.on('end', () => fail());
    c.on('notification', (msg) => {
      if (msg.channel !== DOCUMENT_CHANNEL || !msg.payload) return;
      try {
        opts.onChange(JSON.parse(msg.payload) as DocumentChange);
      } catch (err) {
        opts.logger?.warn({ err: (err as Error).message, payload: msg.payload }, 'search: unreadable document notification');
      }
    });
    try {
      await c.connect();
      await c.query(`LISTEN ${DOCUMENT_CHANNEL}`);
    } catch (err) {
      fail(err as Error);
      return;
    }
    if (closed) {
      await c.end().catch(() => {});
      return;
    }
    attempt = 0;
    if (connectedOnce) opts.onReconnect?.();
    connectedOnce = true;
    resolveReady();
  };

  void connect();
  return {
    ready,
    async close() {
      closed = true;
      if (timer) clearTimeout(timer);
      timer = null;
      const c = client;
      client = null;
      if (c) {
        c.removeAllListeners();
        c.on('error', () => {});
        await c.end().catch(() => {});
      }
    },
  };
}
