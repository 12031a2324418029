import { In, type EntityManager } from 'typeorm';
import type { Person } from '../../../shared/schemas/revision';
import { UserEntity } from '../auth/user.entity';
import { DocumentEntity } from './document.entity';
import { RevisionEntity } from './revision.entity';

/** A revision with what presenting it needs: its document, people and the base revision's number. */
export type RevisionView = {
  rev: RevisionEntity;
  doc: DocumentEntity;
  author: Person;
  reviewer: Person | null;
  baseNumber: number | null;
  /** Images this revision uses that a moderator has hidden (its pages show a notice in their place). */
  hiddenImages: string[];
};

async function people(m: EntityManager, ids: Array<string | null>): Promise<Map<string, Person>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  const rows = wanted.length ? await m.getRepository(UserEntity).find({ where: { id: In(wanted) }, select: { id: true, displayName: true } }) : [];
  return new Map(rows.map((u) => [u.id, { id: u.id, displayName: u.displayName }]));
}

/** Builds presentable views of revisions (documents, authors, reviewers, base numbers, hidden images) in three or four queries. */
export async function views(m: EntityManager, revs: RevisionEntity[], knownDocs: DocumentEntity[] = []): Promise<RevisionView[]> {
  if (!revs.length) return [];
  const docs = new Map(knownDocs.map((d) => [d.id, d]));
  const missingDocs = [...new Set(revs.map((r) => r.documentId))].filter((id) => !docs.has(id));
  if (missingDocs.length) for (const d of await m.getRepository(DocumentEntity).findBy({ id: In(missingDocs) })) docs.set(d.id, d);
  const who = await people(
    m,
    revs.flatMap((r) => [r.authorId, r.reviewedBy]),
  );
  const baseIds = [...new Set(revs.map((r) => r.baseRevisionId).filter((x): x is string => !!x))];
  const baseRows = baseIds.length ? await m.getRepository(RevisionEntity).find({ where: { id: In(baseIds) }, select: { id: true, number: true } }) : [];
  const baseNumbers = new Map(baseRows.map((r) => [r.id, r.number]));
  // Only revisions whose text refers to one of our images can have hidden ones (most have none: no query).
  const withImages = revs.filter((r) => JSON.stringify(r.content ?? {}).includes('/api/images/')).map((r) => r.id);
  const hiddenRows: Array<{ revision_id: string; image_id: string }> = withImages.length
    ? await m.query(
        `SELECT ri.revision_id, ri.image_id FROM revision_images ri JOIN images i ON i.id = ri.image_id
          WHERE ri.revision_id = ANY($1::uuid[]) AND i.hidden_at IS NOT NULL ORDER BY ri.image_id`,
        [withImages],
      )
    : [];
  const hidden = new Map<string, string[]>();
  for (const row of hiddenRows) hidden.set(row.revision_id, [...(hidden.get(row.revision_id) ?? []), row.image_id]);
  const unknown = (id: string): Person => ({ id, displayName: 'Former member' });
  return revs.map((rev) => ({
    rev,
    doc: docs.get(rev.documentId)!,
    author: who.get(rev.authorId) ?? unknown(rev.authorId),
    reviewer: rev.reviewedBy ? (who.get(rev.reviewedBy) ?? unknown(rev.reviewedBy)) : null,
    baseNumber: rev.baseRevisionId ? (baseNumbers.get(rev.baseRevisionId) ?? null) : null,
    hiddenImages: hidden.get(rev.id) ?? [],
  }));
}

export async function view(m: EntityManager, rev: RevisionEntity, doc?: DocumentEntity): Promise<RevisionView> {
  return (await views(m, [rev], doc ? [doc] : []))[0];
}

/** The revision as it stands now (after an update in the same transaction). */
export async function reload(m: EntityManager, id: string, doc: DocumentEntity): Promise<RevisionView> {
  return view(m, await m.getRepository(RevisionEntity).findOneByOrFail({ id }), doc);
}
