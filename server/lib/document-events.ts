import type { EntityManager } from 'typeorm';
import type { DocumentKind } from '../../shared/constants';

export const DOCUMENT_CHANNEL = 'tw_document_changed';

export type DocumentChange = { kind: DocumentKind; documentId: string; slug: string; action: 'published' | 'restored' | 'hidden' | 'unhidden' };

/**
 * Announces that a document's live content changed. Sent with pg_notify inside the caller's
 * transaction, so every app instance (including this one) hears it only once the change commits.
 */
export async function notifyDocumentChanged(m: EntityManager, change: DocumentChange) {
  await m.query('SELECT pg_notify($1, $2)', [DOCUMENT_CHANNEL, JSON.stringify(change)]);
}
