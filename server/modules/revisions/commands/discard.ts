import type { AppContext } from '../../../context';
import { DocumentEntity } from '../document.entity';
import { mayDiscard } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { audit, check, inRevisionTx, revMeta, type Member } from '../transition';

/**
 * The author throws away their draft (or a sent-back version they will not fix). A new guide's first
 * draft takes its document with it: nothing else of it ever existed. Its runs stay the author's (only
 * the evidence link goes); images it alone used are removed by the image sweep.
 */
export async function discard(ctx: AppContext, actor: Member, id: string) {
  return inRevisionTx(ctx, id, async (m, rev, doc) => {
    check(mayDiscard(actor, rev));
    const [{ n }] = await m.query(`SELECT count(*)::int AS n FROM revisions WHERE document_id = $1`, [doc.id]);
    const wholeDocument = doc.publishedRevisionId === null && Number(n) === 1;
    await audit(m, {
      actorId: actor.id,
      action: 'revision.discard',
      subjectKind: 'revision',
      subjectId: id,
      from: rev.state,
      to: null,
      meta: revMeta(doc, rev, { documentRemoved: wholeDocument }),
    });
    if (wholeDocument) await m.getRepository(DocumentEntity).delete({ id: doc.id });
    else await m.getRepository(RevisionEntity).delete({ id });
    return { documentRemoved: wholeDocument };
  });
}
