import type { DataSource } from 'typeorm';
import type { DocumentKind } from '../../shared/constants';
import { notifyDocumentChanged } from '../../server/lib/document-events';
import { DocumentEntity } from '../../server/modules/revisions/document.entity';
import { RevisionEntity } from '../../server/modules/revisions/revision.entity';

// Until the revision service lands in main, these do what it will do: change the live revision and
// announce it inside the same transaction.

async function nextNumber(ds: DataSource | import('typeorm').EntityManager, documentId: string) {
  const [{ n }] = await ds.query('SELECT COALESCE(MAX(number), 0) + 1 AS n FROM revisions WHERE document_id = $1', [documentId]);
  return Number(n);
}

/** Publishes new content for an existing document (the old live revision becomes archived). */
export async function publishRevision(
  ds: DataSource,
  kind: DocumentKind,
  slug: string,
  edit: (content: Record<string, unknown>) => Record<string, unknown>,
  opts: { setup?: Record<string, unknown> | null; action?: 'published' | 'restored' } = {},
) {
  return ds.transaction(async (m) => {
    const doc = await m.getRepository(DocumentEntity).findOneByOrFail({ kind, slug });
    const live = doc.publishedRevisionId ? await m.getRepository(RevisionEntity).findOneByOrFail({ id: doc.publishedRevisionId }) : null;
    if (live) await m.getRepository(RevisionEntity).update(live.id, { state: 'archived' });
    const rev = await m.getRepository(RevisionEntity).save(
      m.getRepository(RevisionEntity).create({
        documentId: doc.id,
        number: await nextNumber(m, doc.id),
        baseRevisionId: live?.id ?? null,
        authorId: live?.authorId ?? doc.createdBy!,
        state: 'published',
        note: 'Test edit',
        content: edit(structuredClone(live?.content ?? {})),
        setup: opts.setup === undefined ? (live?.setup ?? null) : opts.setup,
        submittedAt: new Date(),
        publishedAt: new Date(),
        reviewedAt: new Date(),
      }),
    );
    await m.getRepository(DocumentEntity).update(doc.id, { publishedRevisionId: rev.id });
    await notifyDocumentChanged(m, { kind, documentId: doc.id, slug, action: opts.action ?? 'published' });
    return rev;
  });
}

/** Adds a draft or in-review revision without touching the live one. */
export async function proposeRevision(
  ds: DataSource,
  kind: DocumentKind,
  slug: string,
  edit: (content: Record<string, unknown>) => Record<string, unknown>,
  state: 'draft' | 'in_review' = 'in_review',
) {
  const doc = await ds.getRepository(DocumentEntity).findOneByOrFail({ kind, slug });
  const live = await ds.getRepository(RevisionEntity).findOneByOrFail({ id: doc.publishedRevisionId! });
  return ds.getRepository(RevisionEntity).save(
    ds.getRepository(RevisionEntity).create({
      documentId: doc.id,
      number: await nextNumber(ds, doc.id),
      baseRevisionId: live.id,
      authorId: live.authorId,
      state,
      note: 'Proposed edit',
      content: edit(structuredClone(live.content)),
      submittedAt: state === 'in_review' ? new Date() : null,
    }),
  );
}

/** Hides or unhides a document, announcing it. */
export async function setHidden(ds: DataSource, kind: DocumentKind, slug: string, hidden: boolean) {
  await ds.transaction(async (m) => {
    const doc = await m.getRepository(DocumentEntity).findOneByOrFail({ kind, slug });
    await m
      .getRepository(DocumentEntity)
      .update(doc.id, hidden ? { hiddenAt: new Date(), hiddenReason: 'Test' } : { hiddenAt: null, hiddenReason: null, hiddenBy: null });
    await notifyDocumentChanged(m, { kind, documentId: doc.id, slug, action: hidden ? 'hidden' : 'unhidden' });
  });
}
