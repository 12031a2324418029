import type { QueryDeepPartialEntity } from 'typeorm';
import type { AppContext } from '../../../context';
import { clearApprovals } from '../approvals';
import { titleOf } from '../content';
import { returnedMail } from '../mail';
import { mayReview } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { activeUser, audit, check, inRevisionTx, revMeta, type Member } from '../transition';
import { reload } from '../views';

/** in_review → returned with the moderator's reason; the author is told and can edit and resubmit it. */
export async function returnRevision(ctx: AppContext, actor: Member, id: string, reason: string) {
  return inRevisionTx(ctx, id, async (m, rev, doc) => {
    check(mayReview(actor, rev));
    await clearApprovals(m, id);
    const at = new Date();
    // What was sent back, so the next review can show what the author changed since.
    const returnedSnapshot = { content: rev.content, setup: rev.setup, reason, returnedAt: at.toISOString(), reviewerId: actor.id };
    await m
      .getRepository(RevisionEntity)
      .update({ id }, { state: 'returned', reason, reviewedBy: actor.id, reviewedAt: at, returnedSnapshot } as QueryDeepPartialEntity<RevisionEntity>);
    await audit(m, {
      actorId: actor.id,
      action: 'revision.return',
      subjectKind: 'revision',
      subjectId: id,
      from: 'in_review',
      to: 'returned',
      reason,
      meta: revMeta(doc, rev),
    });
    const fresh = await reload(m, id, doc);
    const author = await activeUser(m, rev.authorId);
    if (author) {
      await ctx.mailer.send(
        returnedMail(author, {
          appUrl: ctx.config.appUrl,
          kind: doc.kind,
          slug: doc.slug,
          title: titleOf(rev),
          number: rev.number,
          revisionId: id,
          reviewerName: fresh.reviewer?.displayName ?? 'A moderator',
          reason,
          isNew: !rev.baseRevisionId,
        }),
        m,
      );
    }
    return fresh;
  });
}
