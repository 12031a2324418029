import type { DataSource, EntityManager } from 'typeorm';
import type { RunListItem } from '../../../shared/schemas/run';
import type { AppContext } from '../../context';
import { AppError, notFound } from '../../lib/errors';
import { DocumentEntity } from '../revisions/document.entity';
import { RevisionEntity } from '../revisions/revision.entity';
import { canSeeDocument, canSeeRevision, mayEdit, type Actor } from '../revisions/policy';
import { presentRunListItem } from './presenter';
import { RunEntity } from './run.entity';
import { runLabels } from './service';

type Db = DataSource | EntityManager;
/** A revision carries a few runs as evidence, not a logbook. */
export const MAX_EVIDENCE_RUNS = 5;

async function runsOf(db: Db, revisionId: string): Promise<RunEntity[]> {
  return db
    .getRepository(RunEntity)
    .createQueryBuilder('r')
    .innerJoin('run_evidence', 'e', 'e.run_id = r.id')
    .where('e.revision_id = :revisionId', { revisionId })
    .orderBy('e.created_at', 'ASC')
    .getMany();
}

async function present(db: Db, rows: RunEntity[], actor: Actor): Promise<RunListItem[]> {
  const labels = await runLabels(db, rows);
  return rows.map((r) => presentRunListItem(r, labels, actor));
}

/** The runs offered as evidence on a revision, for whoever may see that revision (404 otherwise). */
export async function listEvidence(db: Db, actor: Actor, revisionId: string): Promise<RunListItem[]> {
  const revision = await db.getRepository(RevisionEntity).findOneBy({ id: revisionId });
  if (!revision || !canSeeRevision(actor, revision)) throw notFound('That revision');
  const doc = await db.getRepository(DocumentEntity).findOneBy({ id: revision.documentId });
  if (!doc || !canSeeDocument(actor, doc)) throw notFound('That revision');
  return present(db, await runsOf(db, revisionId), actor);
}

/** The author's own editable guide revision, locked, or the refusal (the revision rules decide 404 or 403). */
async function ownEditableGuideRevision(m: EntityManager, actor: Actor, revisionId: string) {
  const revision = await m.getRepository(RevisionEntity).findOne({ where: { id: revisionId }, lock: { mode: 'pessimistic_write' } });
  if (!revision) throw notFound('That revision');
  const decision = mayEdit(actor, revision);
  if (!decision.ok) throw new AppError(decision.status, decision.code, decision.message);
  const doc = await m.getRepository(DocumentEntity).findOneByOrFail({ id: revision.documentId });
  if (doc.kind !== 'guide') throw new AppError(409, 'not_a_guide', 'Only guide revisions carry runs as evidence.');
  return revision;
}

/** Offers one of the author's own runs as evidence on their draft; it stays private until that revision is live. */
export async function attachEvidence(ctx: AppContext, actor: Actor, revisionId: string, runId: string): Promise<RunListItem[]> {
  return ctx.dataSource.transaction(async (m) => {
    const revision = await ownEditableGuideRevision(m, actor, revisionId);
    const run = await m.getRepository(RunEntity).findOneBy({ id: runId, ownerId: actor!.id });
    if (!run) throw notFound('That run');
    const current = await runsOf(m, revision.id);
    if (!current.some((r) => r.id === run.id)) {
      if (current.length >= MAX_EVIDENCE_RUNS) throw new AppError(409, 'too_many_runs', `A revision carries at most ${MAX_EVIDENCE_RUNS} runs as evidence.`);
      await m.query('INSERT INTO run_evidence (revision_id, run_id) VALUES ($1, $2)', [revision.id, run.id]);
    }
    return present(m, await runsOf(m, revision.id), actor);
  });
}

/** Takes a run off the author's draft. */
export async function detachEvidence(ctx: AppContext, actor: Actor, revisionId: string, runId: string): Promise<void> {
  await ctx.dataSource.transaction(async (m) => {
    const revision = await ownEditableGuideRevision(m, actor, revisionId);
    await m.query('DELETE FROM run_evidence WHERE revision_id = $1 AND run_id = $2', [revision.id, runId]);
  });
}

/** The evidence on a visible guide's live revision: public from the moment that revision is published. */
export async function guideEvidence(db: Db, actor: Actor, slug: string): Promise<RunListItem[]> {
  const doc = await db.getRepository(DocumentEntity).findOneBy({ kind: 'guide', slug });
  if (!doc || doc.hiddenAt || !doc.publishedRevisionId) throw notFound('That guide');
  return present(db, await runsOf(db, doc.publishedRevisionId), actor);
}

/**
 * A new draft starts with its base revision's evidence, so a proposal never drops a run silently: the author
 * takes one off (the review shows it as removed) or keeps it. Called by the revisions module inside the
 * transaction that creates the draft; the order the runs were offered in is kept.
 */
export async function copyEvidence(m: EntityManager, fromRevisionId: string, toRevisionId: string): Promise<void> {
  await m.query(
    `INSERT INTO run_evidence (revision_id, run_id, created_at)
     SELECT $2, run_id, created_at FROM run_evidence WHERE revision_id = $1
     ON CONFLICT DO NOTHING`,
    [fromRevisionId, toRevisionId],
  );
}
