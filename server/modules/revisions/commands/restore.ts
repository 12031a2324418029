import type { DocumentKind } from '../../../../shared/constants';
import type { AppContext } from '../../../context';
import { notifyDocumentChanged } from '../../../lib/document-events';
import { notFound } from '../../../lib/errors';
import { DocumentEntity } from '../document.entity';
import { mayRestore } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { afterCommit, audit, check, inDocumentTx, nextNumber, revMeta, type Member } from '../transition';
import { view } from '../views';
import { notifyWatchers } from '../../watches/notify';

/** A new live revision copying an older one's content (restored_from_number says which); the current one is archived. */
export async function restore(ctx: AppContext, actor: Member, kind: DocumentKind, slug: string, number: number, note?: string) {
  const v = await inDocumentTx(ctx, kind, slug, async (m, doc) => {
    const target = await m.getRepository(RevisionEntity).findOneBy({ documentId: doc.id, number });
    if (!target) throw notFound(`Version ${number}`);
    check(mayRestore(actor, target));
    const now = new Date();
    const current = doc.publishedRevisionId ? await m.getRepository(RevisionEntity).findOneByOrFail({ id: doc.publishedRevisionId }) : null;
    if (current) {
      await m.getRepository(RevisionEntity).update({ id: current.id }, { state: 'archived' });
      await audit(m, {
        actorId: actor.id,
        action: 'revision.archive',
        subjectKind: 'revision',
        subjectId: current.id,
        from: 'published',
        to: 'archived',
        meta: revMeta(doc, current),
      });
    }
    const rev = await m.getRepository(RevisionEntity).save(
      m.getRepository(RevisionEntity).create({
        documentId: doc.id,
        number: await nextNumber(m, doc.id),
        baseRevisionId: current?.id ?? null,
        authorId: actor.id,
        state: 'published',
        note: note?.trim() || `Restored version ${target.number}`,
        content: target.content,
        setup: target.setup,
        restoredFromNumber: target.number,
        submittedAt: now,
        reviewedBy: actor.id,
        reviewedAt: now,
        publishedAt: now,
      }),
    );
    await m.getRepository(DocumentEntity).update({ id: doc.id }, { publishedRevisionId: rev.id });
    await audit(m, {
      actorId: actor.id,
      action: 'revision.restore',
      subjectKind: 'revision',
      subjectId: rev.id,
      from: null,
      to: 'published',
      meta: revMeta(doc, rev, { restoredFromNumber: target.number }),
    });
    await notifyDocumentChanged(m, { kind, documentId: doc.id, slug, action: 'restored' });
    await notifyWatchers(ctx, m, { doc, revision: rev, action: 'restored', actorId: actor.id });
    return view(m, rev, { ...doc, publishedRevisionId: rev.id });
  });
  afterCommit(ctx, { kind, slug });
  return v;
}
