import type { AppContext } from '../../../context';
import { notifyDocumentChanged } from '../../../lib/document-events';
import { approveOrPublish, type ApprovalState } from '../approvals';
import { titleOf } from '../content';
import { DocumentEntity } from '../document.entity';
import { publishedMail } from '../mail';
import { mayReview } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { activeUser, afterCommit, assertFreshBase, audit, check, inRevisionTx, revMeta, type Member } from '../transition';
import { reload, type RevisionView } from '../views';
import { notifyWatchers } from '../../watches/notify';

/**
 * in_review → published by another moderator; the previous live revision becomes archived. A
 * safety-relevant proposal needs two different moderators: the first call records an approval and
 * leaves it in review (`approval` is then set), the second publishes.
 */
export async function publish(ctx: AppContext, actor: Member, id: string): Promise<RevisionView & { approval: ApprovalState | null }> {
  const v = await inRevisionTx(ctx, id, async (m, rev, doc) => {
    check(mayReview(actor, rev));
    await assertFreshBase(m, rev, doc);
    const gate = await approveOrPublish(m, actor.id, rev, doc);
    if (!gate.publish) return { ...(await reload(m, id, doc)), approval: gate.state };
    const now = new Date();
    const previousId = doc.publishedRevisionId;
    if (previousId) {
      // Archive first: at most one published revision per document, checked row by row.
      await m.getRepository(RevisionEntity).update({ id: previousId }, { state: 'archived' });
      const prev = await m.getRepository(RevisionEntity).findOneByOrFail({ id: previousId });
      await audit(m, {
        actorId: actor.id,
        action: 'revision.archive',
        subjectKind: 'revision',
        subjectId: previousId,
        from: 'published',
        to: 'archived',
        meta: revMeta(doc, prev, { supersededBy: rev.number }),
      });
    }
    await m.getRepository(RevisionEntity).update({ id }, { state: 'published', publishedAt: now, reviewedBy: actor.id, reviewedAt: now });
    await m.getRepository(DocumentEntity).update({ id: doc.id }, { publishedRevisionId: id });
    await audit(m, {
      actorId: actor.id,
      action: 'revision.publish',
      subjectKind: 'revision',
      subjectId: id,
      from: 'in_review',
      to: 'published',
      meta: revMeta(doc, rev),
    });
    await notifyDocumentChanged(m, { kind: doc.kind, documentId: doc.id, slug: doc.slug, action: 'published' });
    await notifyWatchers(ctx, m, { doc, revision: rev, action: 'published', actorId: actor.id });
    const author = await activeUser(m, rev.authorId);
    const fresh = await reload(m, id, { ...doc, publishedRevisionId: id });
    if (author) {
      await ctx.mailer.send(
        publishedMail(author, {
          appUrl: ctx.config.appUrl,
          kind: doc.kind,
          slug: doc.slug,
          title: titleOf(rev),
          number: rev.number,
          revisionId: id,
          reviewerName: fresh.reviewer?.displayName ?? 'A moderator',
        }),
        m,
      );
    }
    return { ...fresh, approval: null };
  });
  if (!v.approval) afterCommit(ctx, v.doc);
  return v;
}
