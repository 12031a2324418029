import type { QueryDeepPartialEntity } from 'typeorm';
import { revisionPatchSchema } from '../../../../shared/schemas/revision';
import type { AppContext } from '../../../context';
import { parseContent, parseOrFail, splitInput } from '../content';
import { mayEdit } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { audit, check, inRevisionTx, reopenIfReturned, revMeta, staleBase, type Member } from '../transition';
import { reload } from '../views';

/**
 * Autosave of the author's draft (or returned revision). `baseRevisionId` may move only to the
 * live revision: that is how a merged draft catches up after a 409 stale_base.
 */
export async function updateDraft(ctx: AppContext, actor: Member, id: string, input: unknown) {
  return inRevisionTx(ctx, id, async (m, rev, doc) => {
    check(mayEdit(actor, rev));
    // The body's schema depends on the document's kind, known only now.
    const parsed = parseOrFail(revisionPatchSchema(doc.kind), input);
    const { note, baseRevisionId, fields } = splitInput(parsed);
    const patch: Partial<RevisionEntity> = {};
    if (baseRevisionId !== undefined && baseRevisionId !== rev.baseRevisionId) {
      if (baseRevisionId !== doc.publishedRevisionId) throw await staleBase(m, doc);
      patch.baseRevisionId = baseRevisionId;
    }
    if (Object.keys(fields).length) patch.content = parseContent(doc.kind, { ...rev.content, ...fields }, 'body');
    if (note !== undefined) patch.note = note;
    if (Object.keys(patch).length) {
      await m.getRepository(RevisionEntity).update({ id }, patch as QueryDeepPartialEntity<RevisionEntity>);
      await reopenIfReturned(m, actor.id, rev, doc);
    }
    if (patch.baseRevisionId) {
      await audit(m, {
        actorId: actor.id,
        action: 'revision.rebase',
        subjectKind: 'revision',
        subjectId: id,
        from: rev.baseRevisionId,
        to: patch.baseRevisionId,
        meta: revMeta(doc, rev),
      });
    }
    return reload(m, id, doc);
  });
}
