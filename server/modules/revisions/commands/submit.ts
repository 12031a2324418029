import type { EntityManager, QueryDeepPartialEntity } from 'typeorm';
import { hasBlockingChecks } from '../../../../shared/content-checks/run';
import type { AppContext } from '../../../context';
import { UserEntity } from '../../auth/user.entity';
import { assertImagesReady } from '../../images/submit-check';
import { clearApprovals } from '../approvals';
import { checkRevisionContent, contentCheckFailed } from '../checks';
import { parseContent, titleOf } from '../content';
import type { DocumentEntity } from '../document.entity';
import { reviewRequestMail } from '../mail';
import { maySubmit } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { assertFreshBase, audit, check, inRevisionTx, revMeta, type Member } from '../transition';
import { reload } from '../views';

/** Every active, verified moderator but the author is asked to review. */
async function mailModerators(ctx: AppContext, m: EntityManager, rev: RevisionEntity, doc: DocumentEntity, authorName: string) {
  const moderators = await m
    .getRepository(UserEntity)
    .createQueryBuilder('u')
    .where("u.role IN ('moderator', 'admin') AND u.disabledAt IS NULL AND u.emailVerifiedAt IS NOT NULL AND u.id <> :author", { author: rev.authorId })
    .getMany();
  for (const mod of moderators) {
    await ctx.mailer.send(
      reviewRequestMail(mod, {
        appUrl: ctx.config.appUrl,
        kind: doc.kind,
        slug: doc.slug,
        title: titleOf(rev),
        number: rev.number,
        revisionId: rev.id,
        authorName,
        note: rev.note,
        isNew: doc.publishedRevisionId === null,
      }),
      m,
    );
  }
}

/** Draft (or returned) → in_review, with the edit note; the content checks must pass; the moderators are told. */
export async function submit(ctx: AppContext, actor: Member, id: string, note: string) {
  return inRevisionTx(ctx, id, async (m, rev, doc) => {
    check(maySubmit(actor, rev));
    const content = parseContent(doc.kind, rev.content, 'content');
    const checks = await checkRevisionContent(m, doc.kind, content, rev.setup);
    if (hasBlockingChecks(checks)) throw contentCheckFailed(checks);
    await assertImagesReady(m, doc.id, content);
    await assertFreshBase(m, rev, doc);
    const from = rev.state;
    await clearApprovals(m, id);
    await m.getRepository(RevisionEntity).update({ id }, {
      state: 'in_review',
      note,
      content,
      submittedAt: new Date(),
      reason: null,
      reviewedBy: null,
      reviewedAt: null,
    } as QueryDeepPartialEntity<RevisionEntity>);
    await audit(m, {
      actorId: actor.id,
      action: 'revision.submit',
      subjectKind: 'revision',
      subjectId: id,
      from,
      to: 'in_review',
      meta: revMeta(doc, rev, { note }),
    });
    const v = await reload(m, id, doc);
    await mailModerators(ctx, m, v.rev, doc, v.author.displayName);
    return v;
  });
}
