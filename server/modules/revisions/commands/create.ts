import type { DocumentKind } from '../../../../shared/constants';
import type { AppContext } from '../../../context';
import { parseContent, slugify, splitInput } from '../content';
import { DocumentEntity } from '../document.entity';
import { RevisionEntity } from '../revision.entity';
import { audit, revMeta, type Member } from '../transition';
import { view } from '../views';
import { watchOwnWork } from '../../watches/notify';

const UNIQUE_VIOLATION = '23505';

/** A new document with the author's draft as revision 1; for guides the slug comes from the title. */
export async function createDocument(ctx: AppContext, actor: Member, kind: DocumentKind, input: Record<string, unknown>) {
  const { note, fields } = splitInput(input);
  const content = parseContent(kind, fields, 'body', 'draft');
  const wanted = slugify(String(content.title ?? content.name ?? '')) || kind;
  for (let attempt = 0; ; attempt++) {
    try {
      return await ctx.dataSource.transaction(async (m) => {
        const taken: Array<{ slug: string }> = await m.query(`SELECT slug FROM documents WHERE kind = $1 AND (slug = $2 OR slug LIKE $3)`, [
          kind,
          wanted,
          `${wanted}-%`,
        ]);
        const used = new Set(taken.map((r) => r.slug));
        let slug = wanted;
        for (let n = 2; used.has(slug); n++) slug = `${wanted}-${n}`;
        const doc = await m.getRepository(DocumentEntity).save(m.getRepository(DocumentEntity).create({ kind, slug, createdBy: actor.id }));
        const rev = await m
          .getRepository(RevisionEntity)
          .save(
            m
              .getRepository(RevisionEntity)
              .create({ documentId: doc.id, number: 1, baseRevisionId: null, authorId: actor.id, state: 'draft', note: note ?? '', content }),
          );
        await audit(m, {
          actorId: actor.id,
          action: 'document.create',
          subjectKind: 'document',
          subjectId: doc.id,
          from: null,
          to: 'created',
          meta: { kind, slug },
        });
        await audit(m, {
          actorId: actor.id,
          action: 'revision.create',
          subjectKind: 'revision',
          subjectId: rev.id,
          from: null,
          to: 'draft',
          meta: revMeta(doc, rev),
        });
        await watchOwnWork(m, actor.id, doc.id);
        return view(m, rev, doc);
      });
    } catch (err) {
      // Two authors picked the same title at the same moment: choose the next free slug.
      if ((err as { driverError?: { code?: string } }).driverError?.code === UNIQUE_VIOLATION && attempt < 5) continue;
      throw err;
    }
  }
}
