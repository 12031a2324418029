import type { DocumentKind } from '../../../../shared/constants';
import type { AppContext } from '../../../context';
import { notifyDocumentChanged } from '../../../lib/document-events';
import { notFound } from '../../../lib/errors';
import { DocumentEntity } from '../document.entity';
import { mayRestore } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { activeUser, afterCommit, audit, check, inDocumentTx, nextNumber, revMeta, type Member } from '../transition';
import { titleOf } from '../content';
import { restoredMail } from '../mail';
import { UserEntity } from '../../auth/user.entity';
import { view } from '../views';
import { notifyWatchers } from '../../watches/notify';

/**
 * A new live revision copying an older one's content (restored_from_number says which); the current one
 * is archived. The copy stays credited to the older version's author (the words are theirs) and names
 * the moderator who brought it back as its reviewer; the reason goes to the audit log and to that author.
 */
export async function restore(ctx: AppContext, actor: Member, kind: DocumentKind, slug: string, number: number, reason: string, note?: string) {
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
        authorId: target.authorId,
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
      reason,
      meta: revMeta(doc, rev, { restoredFromNumber: target.number, authorId: target.authorId }),
    });
    await notifyDocumentChanged(m, { kind, documentId: doc.id, slug, action: 'restored' });
    await notifyWatchers(ctx, m, { doc, revision: rev, action: 'restored', actorId: actor.id });
    // The author of the restored words hears it from us directly, watching or not (the watch mail skips them).
    const author = target.authorId !== actor.id ? await activeUser(m, target.authorId) : null;
    if (author) {
      const restorer = await m.getRepository(UserEntity).findOneBy({ id: actor.id });
      await ctx.mailer.send(
        restoredMail(author, {
          appUrl: ctx.config.appUrl,
          kind,
          slug,
          title: titleOf(rev),
          number: rev.number,
          revisionId: rev.id,
          restoredFromNumber: target.number,
          restorerName: restorer?.displayName ?? 'A moderator',
          reason,
        }),
        m,
      );
    }
    return view(m, rev, { ...doc, publishedRevisionId: rev.id });
  });
  afterCommit(ctx, { kind, slug });
  return v;
}
