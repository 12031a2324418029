import type { EntityManager } from 'typeorm';
import type { SetupRecord } from '../../../../shared/schemas/setup-record';
import type { AppContext } from '../../../context';
import { AppError } from '../../../lib/errors';
import { mayChangeBaseline } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { audit, check, inRevisionTx, reopenIfReturned, revMeta, type Member } from '../transition';

/**
 * Sets or removes the baseline setup of the author's own draft (or sent-back) guide revision: the
 * same lock, the same who-may rule and an audit row like every other change to a revision. `prepare`
 * validates the incoming record and runs only once the caller is known to own the revision, so a
 * stranger learns nothing about someone else's draft, not even from a validation error.
 */
export async function changeBaseline(
  ctx: AppContext,
  actor: Member,
  revisionId: string,
  prepare: (m: EntityManager) => Promise<SetupRecord | null>,
): Promise<SetupRecord | null> {
  return inRevisionTx(ctx, revisionId, async (m, rev, doc) => {
    check(mayChangeBaseline(actor, rev));
    if (doc.kind !== 'guide') throw new AppError(409, 'not_a_guide', 'Only guide revisions carry a baseline setup.');
    const record = await prepare(m);
    await m.getRepository(RevisionEntity).update({ id: rev.id }, { setup: record });
    await reopenIfReturned(m, actor.id, rev, doc);
    await audit(m, {
      actorId: actor.id,
      action: record ? 'revision.baseline' : 'revision.baseline_removed',
      subjectKind: 'revision',
      subjectId: rev.id,
      from: null,
      to: null,
      meta: revMeta(doc, rev),
    });
    return record;
  });
}
