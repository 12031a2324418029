import type { EntityManager } from 'typeorm';
import type { DocumentKind } from '../../shared/constants';

export const DOCUMENT_CHANNEL = 'tw_document_changed';

/** `author-left`: someone credited on the live or an older version deleted their account, so cached pages must drop their name. */
export type DocumentChange = {
  kind: DocumentKind;
  documentId: string;
  slug: string;
  action: 'published' | 'restored' | 'hidden' | 'unhidden' | 'author-left';
};

/**
 * Announces that a document's live content changed. Sent with pg_notify inside the caller's
 * transaction, so every app instance (including this one) hears it only once the change commits.
 */
export async function notifyDocumentChanged(m: EntityManager, change: DocumentChange) {
  await m.query('SELECT pg_notify($1, $2)', [DOCUMENT_CHANNEL, JSON.stringify(change)]);
}
