import type { DocumentKind } from '../../../../shared/constants';
import type { AppContext } from '../../../context';
import { notifyDocumentChanged } from '../../../lib/document-events';
import { DocumentEntity } from '../document.entity';
import { mayHide } from '../policy';
import { afterCommit, audit, check, inDocumentTx, type Member } from '../transition';
import { notifyWatchers } from '../../watches/notify';

/** Hides a document from everyone but moderators (abuse), or shows it again. */
export async function setHidden(ctx: AppContext, actor: Member, kind: DocumentKind, slug: string, hide: boolean, reason: string | null) {
  const doc = await inDocumentTx(ctx, kind, slug, async (m, d) => {
    check(mayHide(actor, d, hide));
    const patch = hide ? { hiddenAt: new Date(), hiddenBy: actor.id, hiddenReason: reason } : { hiddenAt: null, hiddenBy: null, hiddenReason: null };
    await m.getRepository(DocumentEntity).update({ id: d.id }, patch);
    await audit(m, {
      actorId: actor.id,
      action: hide ? 'document.hide' : 'document.unhide',
      subjectKind: 'document',
      subjectId: d.id,
      from: hide ? 'visible' : 'hidden',
      to: hide ? 'hidden' : 'visible',
      reason,
      meta: { kind, slug },
    });
    await notifyDocumentChanged(m, { kind, documentId: d.id, slug, action: hide ? 'hidden' : 'unhidden' });
    if (hide) await notifyWatchers(ctx, m, { doc: d, revision: null, action: 'hidden', actorId: actor.id, reason });
    return m.getRepository(DocumentEntity).findOneByOrFail({ id: d.id });
  });
  afterCommit(ctx, { kind, slug });
  return doc;
}
