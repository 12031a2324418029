import type { EntityManager, QueryDeepPartialEntity } from 'typeorm';
import { revisionPatchSchema } from '../../../../shared/schemas/revision';
import type { AppContext } from '../../../context';
import { parseContent, parseOrFail, slugify, splitInput } from '../content';
import { DocumentEntity } from '../document.entity';
import { mayEdit } from '../policy';
import { RevisionEntity } from '../revision.entity';
import { audit, check, inRevisionTx, reopenIfReturned, revMeta, staleBase, type Member } from '../transition';
import { reload } from '../views';

/**
 * Autosave of the author's draft (or returned revision). `baseRevisionId` may move only to the
 * live revision: that is how a merged draft catches up after a 409 stale_base.
 */
export async function updateDraft(ctx: AppContext, actor: Member, id: string, input: unknown) {
  for (let attempt = 0; ; attempt++) {
    try {
      return await saveDraft(ctx, actor, id, input);
    } catch (err) {
      // Another new guide took the same address at the same moment: pick again (the transaction was rolled back whole).
      if ((err as { driverError?: { code?: string } }).driverError?.code === UNIQUE_VIOLATION && attempt < 5) continue;
      throw err;
    }
  }
}

const UNIQUE_VIOLATION = '23505';

/**
 * A guide that has never been live takes its address from its title as the title changes (autosave
 * saves a new guide as soon as it has one, so its first address would otherwise be whatever the
 * title was when typing first paused).
 */
async function followTitle(m: EntityManager, doc: DocumentEntity, title: string) {
  const wanted = slugify(title) || 'guide';
  if (doc.slug === wanted || new RegExp(`^${wanted}-\\d+$`).test(doc.slug)) return;
  const taken: Array<{ slug: string }> = await m.query(`SELECT slug FROM documents WHERE kind = $1 AND id <> $2 AND (slug = $3 OR slug LIKE $4)`, [
    doc.kind,
    doc.id,
    wanted,
    `${wanted}-%`,
  ]);
  const used = new Set(taken.map((r) => r.slug));
  let slug = wanted;
  for (let n = 2; used.has(slug); n++) slug = `${wanted}-${n}`;
  await m.getRepository(DocumentEntity).update({ id: doc.id }, { slug });
  doc.slug = slug;
}

async function saveDraft(ctx: AppContext, actor: Member, id: string, input: unknown) {
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
    if (Object.keys(fields).length) patch.content = parseContent(doc.kind, { ...rev.content, ...fields }, 'body', 'draft');
    if (note !== undefined) patch.note = note;
    if (doc.kind === 'guide' && doc.publishedRevisionId === null && patch.content && patch.content.title !== rev.content.title)
      await followTitle(m, doc, String(patch.content.title));
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
