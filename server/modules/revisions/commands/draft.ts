import type { DocumentKind } from '../../../../shared/constants';
import { proposeEditSchema } from '../../../../shared/schemas/revision';
import type { AppContext } from '../../../context';
import { parseContent, parseOrFail, splitInput } from '../content';
import { canSeeDocument, mayProposeEdit } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { audit, check, documentNotFound, lockDocument, nextNumber, revMeta, staleBase, type Member } from '../transition';
import { view } from '../views';
import { copyEvidence } from '../../runs/evidence';
import { watchOwnWork } from '../../watches/notify';

/** A new draft of an existing document, based on its live revision; fields not sent are copied from it. */
export async function createDraft(ctx: AppContext, actor: Member, kind: DocumentKind, slug: string, input: Record<string, unknown>) {
  const parsed = parseOrFail(proposeEditSchema(kind), input);
  const { note, baseRevisionId, fields } = splitInput(parsed);
  return ctx.dataSource.transaction(async (m) => {
    const doc = await lockDocument(m, { kind, slug });
    // The same answer as for a slug nobody used, whatever this one's state.
    if (!doc || !canSeeDocument(actor, doc)) throw documentNotFound(kind);
    check(mayProposeEdit(actor, doc));
    if (baseRevisionId !== doc.publishedRevisionId) throw await staleBase(m, doc);
    const base = await m.getRepository(RevisionEntity).findOneByOrFail({ id: doc.publishedRevisionId! });
    const content = parseContent(kind, { ...base.content, ...fields }, 'body', 'draft');
    const rev = await m.getRepository(RevisionEntity).save(
      m.getRepository(RevisionEntity).create({
        documentId: doc.id,
        number: await nextNumber(m, doc.id),
        baseRevisionId: base.id,
        authorId: actor.id,
        state: 'draft',
        note: note ?? '',
        content,
        setup: base.setup,
      }),
    );
    await copyEvidence(m, base.id, rev.id);
    await audit(m, {
      actorId: actor.id,
      action: 'revision.create',
      subjectKind: 'revision',
      subjectId: rev.id,
      from: null,
      to: 'draft',
      meta: revMeta(doc, rev, { baseNumber: base.number }),
    });
    await watchOwnWork(m, actor.id, doc.id);
    return view(m, rev, doc);
  });
}
