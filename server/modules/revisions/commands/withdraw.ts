import type { AppContext } from '../../../context';
import { clearApprovals } from '../approvals';
import { mayWithdraw } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { audit, check, inRevisionTx, revMeta, type Member } from '../transition';
import { reload } from '../views';

/** in_review → draft, by the author. */
export async function withdraw(ctx: AppContext, actor: Member, id: string) {
  return inRevisionTx(ctx, id, async (m, rev, doc) => {
    check(mayWithdraw(actor, rev));
    await clearApprovals(m, id);
    await m.getRepository(RevisionEntity).update({ id }, { state: 'draft', submittedAt: null });
    await audit(m, {
      actorId: actor.id,
      action: 'revision.withdraw',
      subjectKind: 'revision',
      subjectId: id,
      from: 'in_review',
      to: 'draft',
      meta: revMeta(doc, rev),
    });
    return reload(m, id, doc);
  });
}
