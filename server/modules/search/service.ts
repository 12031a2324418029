import type { DataSource } from 'typeorm';
import type { DocumentKind } from '../../../shared/constants';
import type { SearchSuggestion } from '../../../shared/schemas/search';
import type { DocumentChange } from '../../lib/document-events';
import type { Logger } from '../../lib/logger';
import type { DocumentListener } from '../../lib/document-listener';
import { loadLiveDocument, loadLiveDocuments } from './documents';
import { SearchIndex, type IndexSearchResult, type SearchFilters } from './search-index';

export type SearchResult = IndexSearchResult & { tookMs: number };

/**
 * Search over live parameters, guides and setup baselines. One in-memory implementation today;
 * PostgreSQL full-text search or a search cluster can sit behind the same interface later.
 */
export interface SearchService {
  /** (Re)builds the whole index from PostgreSQL. */
  build(): Promise<{ documents: number; ms: number }>;
  /** Re-reads one document's live revision and replaces it in the index (or removes it if it is no longer live). */
  upsertDocument(kind: DocumentKind, slug: string): Promise<void>;
  removeDocument(kind: DocumentKind, slug: string): void;
  /** `limit` ranked hits after the first `offset`; `total` counts every match. */
  search(query: string, filters?: SearchFilters, limit?: number, offset?: number): SearchResult;
  suggest(q: string): SearchSuggestion[];
  /** Builds the index and starts following document-change notifications. */
  start(): Promise<void>;
  close(): Promise<void>;
}

/** `listener`: the app's document listener (already started); without one the index is only built at start. */
type Deps = { dataSource: DataSource; logger: Logger; listener?: DocumentListener };

/** The MiniSearch-backed service, kept current through LISTEN/NOTIFY. */
export function createSearchService(deps: Deps): SearchService {
  const index = new SearchIndex();
  const unsubscribe: Array<() => void> = [];
  let built = false;
  let pending: DocumentChange[] = [];
  // One queue, so two notifications for one document never apply out of order.
  let chain: Promise<unknown> = Promise.resolve();
  const enqueue = (job: () => Promise<void>) => {
    const next = chain.then(job).catch((err) => deps.logger.error({ err }, 'search: index update failed'));
    chain = next;
    return next;
  };

  const service: SearchService = {
    async build() {
      const t0 = performance.now();
      const docs = await loadLiveDocuments(deps.dataSource);
      index.load(docs);
      built = true;
      const queued = pending;
      pending = [];
      for (const c of queued) await service.upsertDocument(c.kind, c.slug);
      return { documents: index.size, ms: Math.round(performance.now() - t0) };
    },
    async upsertDocument(kind, slug) {
      const docs = await loadLiveDocument(deps.dataSource, kind, slug);
      service.removeDocument(kind, slug);
      for (const d of docs) index.put(d);
    },
    removeDocument(kind, slug) {
      if (kind === 'parameter') index.remove('parameter', slug);
      else {
        index.remove('guide', slug);
        index.remove('setup', slug);
      }
    },
    search(query, filters = {}, limit = 10, offset = 0) {
      const t0 = performance.now();
      const r = index.search(query, filters, limit, offset);
      return { ...r, tookMs: Math.round((performance.now() - t0) * 100) / 100 };
    },
    suggest(q) {
      return index.suggest(q);
    },
    async start() {
      if (deps.listener) {
        unsubscribe.push(
          deps.listener.onDocumentChanged((change) => {
            if (!built) {
              pending.push(change);
              return;
            }
            void enqueue(() => service.upsertDocument(change.kind, change.slug));
          }),
          // Notifications sent while the connection was down are lost: read everything again once.
          deps.listener.onReconnected(() => void enqueue(async () => void (await service.build()))),
        );
      }
      // Listening first, then building, so a change committed during the build is not missed.
      await enqueue(async () => void (await service.build()));
    },
    async close() {
      for (const off of unsubscribe.splice(0)) off();
      await chain;
    },
  };
  return service;
}
