import { LRUCache } from 'lru-cache';
import type { DocumentKind } from '../../../shared/constants';
import type { AppContext } from '../../context';

const MAX_ENTRIES = 5000;
/** The pseudo-document that views spanning many documents hang off. */
const ACROSS = '*';

/**
 * In-memory cache of what readers get for a live document (e.g. the presented guide page), per
 * slug. Entries are dropped when the document changes: in-process right after the transaction
 * commits, and on every instance through the document listener (LISTEN/NOTIFY).
 */
export type PublishedCache = {
  /**
   * The cached value under `view` (a name for the shape, e.g. 'guide-detail') for this document, or
   * the loader's result, which is kept unless it is null or the document changed while loading.
   */
  read<T>(view: string, kind: DocumentKind, slug: string, load: () => Promise<T | null>): Promise<T | null>;
  /**
   * Like read(), for a view that depends on many documents (a list, or an entry with its related
   * entries and guides): dropped whenever any document changes.
   */
  readAcross<T>(view: string, load: () => Promise<T | null>): Promise<T | null>;
  invalidate(kind: DocumentKind, slug: string): void;
  clear(): void;
  readonly size: number;
};

/** `enabled` false means every read goes to the loader (e.g. while the listener is reconnecting and changes could be missed). */
export function createPublishedCache(opts: { enabled?: () => boolean } = {}): PublishedCache {
  const enabled = opts.enabled ?? (() => true);
  // Boxed, since lru-cache holds no undefined values; the least recently read entry goes first when full.
  const entries = new LRUCache<string, { value: unknown }>({ max: MAX_ENTRIES });
  // Bumped on every invalidation, so a read that began before a change never stores the old value.
  const generations = new Map<string, number>();
  let epoch = 0;
  const docKey = (kind: DocumentKind, slug: string) => `${kind}:${slug}`;

  return {
    async read<T>(view: string, kind: DocumentKind, slug: string, load: () => Promise<T | null>) {
      const doc = docKey(kind, slug);
      const key = `${view}|${doc}`;
      if (!enabled()) return load();
      const hit = entries.get(key);
      if (hit) return hit.value as T;
      const gen = generations.get(doc) ?? 0;
      const startEpoch = epoch;
      const value = await load();
      if (value !== null && enabled() && (generations.get(doc) ?? 0) === gen && epoch === startEpoch) {
        entries.set(key, { value });
      }
      return value;
    },
    async readAcross<T>(view: string, load: () => Promise<T | null>) {
      const key = `${view}|${ACROSS}`;
      if (!enabled()) return load();
      const hit = entries.get(key);
      if (hit) return hit.value as T;
      const gen = generations.get(ACROSS) ?? 0;
      const startEpoch = epoch;
      const value = await load();
      if (value !== null && enabled() && (generations.get(ACROSS) ?? 0) === gen && epoch === startEpoch) {
        entries.set(key, { value });
      }
      return value;
    },
    invalidate(kind, slug) {
      for (const doc of [docKey(kind, slug), ACROSS]) {
        generations.set(doc, (generations.get(doc) ?? 0) + 1);
        for (const key of [...entries.keys()]) if (key.endsWith(`|${doc}`)) entries.delete(key);
      }
    },
    clear() {
      epoch++;
      entries.clear();
    },
    get size() {
      return entries.size;
    },
  };
}

const caches = new WeakMap<AppContext, PublishedCache>();

/** The app's published-content cache, subscribed to the document listener on first use. */
export function publishedCache(ctx: AppContext): PublishedCache {
  let cache = caches.get(ctx);
  if (!cache) {
    const created = createPublishedCache({ enabled: () => ctx.documentListener.listening });
    ctx.documentListener.onDocumentChanged((change) => created.invalidate(change.kind, change.slug));
    ctx.documentListener.onReconnected(() => created.clear());
    caches.set(ctx, created);
    cache = created;
  }
  return cache;
}
