import type { DocumentKind, RevisionState } from '../../../shared/constants';
import type { SetupRecord } from '../../../shared/schemas/setup-record';
import { computeSetup } from '../../../shared/setup/computed';
import { diffSetupFields } from '../../../shared/setup/compare';
import type { AppContext } from '../../context';
import { AppError, notFound } from '../../lib/errors';
import type { EntityManager } from 'typeorm';
import { approvalState } from './approvals';
import { bodyDiffOffThread } from './body-diff-pool';
import { checkRevisionContent } from './checks';
import { bodyOf, changedFields, checkWorkedExamples, threeWayMerge } from './compare';
import { DocumentEntity } from './document.entity';
import { canSeeDocument, canSeeRevision, isAuthor, isModerator, mayEdit, PUBLIC_STATES, type Actor } from './policy';
import { publishedCache } from './read-cache';
import { RevisionEntity } from './revision.entity';
import { check, documentNotFound, type Member } from './transition';
import { view, views, type RevisionView } from './views';

/** What readers, authors and moderators read about revisions; nothing here changes anything. */
export function revisionQueries(ctx: AppContext) {
  const cache = publishedCache(ctx);

  async function visibleDocument(m: EntityManager, actor: Actor, kind: DocumentKind, slug: string) {
    const doc = await m.getRepository(DocumentEntity).findOneBy({ kind, slug });
    if (!doc || !canSeeDocument(actor, doc)) throw documentNotFound(kind);
    return doc;
  }

  const queries = {
    /**
     * What readers get for a live document, presented by `present`. Readers are served from the
     * cache (keyed by `viewName`); moderators read through, and also see hidden documents.
     */
    async readLive<T>(actor: Actor, kind: DocumentKind, slug: string, viewName: string, present: (v: RevisionView) => T): Promise<T> {
      const load = async (asModerator: boolean): Promise<T | null> => {
        const m = ctx.dataSource.manager;
        const doc = await m.getRepository(DocumentEntity).findOneBy({ kind, slug });
        if (!doc?.publishedRevisionId || (doc.hiddenAt && !asModerator)) return null;
        const rev = await m.getRepository(RevisionEntity).findOneBy({ id: doc.publishedRevisionId });
        return rev ? present(await view(m, rev, doc)) : null;
      };
      const result = isModerator(actor) ? await load(true) : await cache.read(viewName, kind, slug, () => load(false));
      if (result === null) throw documentNotFound(kind);
      return result;
    },

    /** Live, visible guides, newest first, with simple filters. */
    async listLiveGuides(q: { class?: string; surface?: string; parameter?: string; tag?: string; q?: string; page: number; pageSize: number }) {
      const m = ctx.dataSource.manager;
      const qb = m
        .getRepository(RevisionEntity)
        .createQueryBuilder('r')
        .innerJoin(DocumentEntity, 'd', 'd.published_revision_id = r.id')
        .where("d.kind = 'guide' AND d.hidden_at IS NULL AND r.state = 'published'");
      if (q.class) qb.andWhere("r.content->>'class' = :cls", { cls: q.class });
      if (q.surface) qb.andWhere("r.content->>'surface' = :surface", { surface: q.surface });
      if (q.parameter) qb.andWhere("r.content->'parameters' @> :param::jsonb", { param: JSON.stringify([q.parameter]) });
      if (q.tag) qb.andWhere("r.content->'tags' @> :tag::jsonb", { tag: JSON.stringify([q.tag]) });
      if (q.q) {
        const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
        qb.andWhere("(r.content->>'title' ILIKE :like OR r.content->>'summary' ILIKE :like)", { like });
      }
      const [revs, total] = await qb
        .orderBy('r.published_at', 'DESC')
        .addOrderBy('r.id', 'ASC')
        .skip((q.page - 1) * q.pageSize)
        .take(q.pageSize)
        .getManyAndCount();
      return { views: await views(m, revs), total };
    },

    /** A document's history: readers see live and superseded revisions; authors also their own; moderators all. */
    async history(actor: Actor, kind: DocumentKind, slug: string) {
      const m = ctx.dataSource.manager;
      const doc = await visibleDocument(m, actor, kind, slug);
      const qb = m.getRepository(RevisionEntity).createQueryBuilder('r').where('r.document_id = :doc', { doc: doc.id });
      if (!isModerator(actor))
        qb.andWhere('(r.state IN (:...states) OR r.author_id = :me)', { states: PUBLIC_STATES, me: actor?.id ?? '00000000-0000-0000-0000-000000000000' });
      const revs = await qb.orderBy('r.number', 'DESC').getMany();
      return { doc, views: await views(m, revs, [doc]) };
    },

    /** One revision by its number (the permalink), if the caller may see it. */
    async byNumber(actor: Actor, kind: DocumentKind, slug: string, number: number) {
      const m = ctx.dataSource.manager;
      const doc = await visibleDocument(m, actor, kind, slug);
      const rev = await m.getRepository(RevisionEntity).findOneBy({ documentId: doc.id, number });
      if (!rev || !canSeeRevision(actor, rev)) throw notFound(`Version ${number}`);
      return view(m, rev, doc);
    },

    /** Two revisions side by side: changed metadata and a word-level diff of the body. */
    async compare(actor: Actor, kind: DocumentKind, slug: string, from: number, to: number) {
      const [a, b] = [await queries.byNumber(actor, kind, slug, from), await queries.byNumber(actor, kind, slug, to)];
      const diff = await bodyDiffOffThread(bodyOf(a.rev.content), bodyOf(b.rev.content));
      return { from: a, to: b, changedFields: changedFields(a.rev.content, b.rev.content), bodyDiff: diff.parts, bodyDiffDetail: diff.detail };
    },

    /** A revision by id, for its author and moderators only (404 for anyone else). */
    async getRevision(actor: Actor, id: string) {
      const m = ctx.dataSource.manager;
      const rev = await m.getRepository(RevisionEntity).findOneBy({ id });
      if (!rev || !(isAuthor(actor, rev) || isModerator(actor))) throw notFound('That revision');
      const v = await view(m, rev);
      const live = v.doc.publishedRevisionId
        ? await m.getRepository(RevisionEntity).findOne({ where: { id: v.doc.publishedRevisionId }, select: { id: true, number: true } })
        : null;
      return { view: v, publishedNumber: live?.number ?? null };
    },

    /** The signed-in member's own revisions (drafts, proposals and what became of them), latest first. */
    async myRevisions(actor: Member, q: { state?: RevisionState; kind?: DocumentKind }) {
      const m = ctx.dataSource.manager;
      const qb = m.getRepository(RevisionEntity).createQueryBuilder('r').where('r.author_id = :me', { me: actor.id });
      if (q.state) qb.andWhere('r.state = :state', { state: q.state });
      if (q.kind) qb.innerJoin(DocumentEntity, 'd', 'd.id = r.document_id').andWhere('d.kind = :kind', { kind: q.kind });
      const revs = await qb.orderBy('r.updated_at', 'DESC').limit(500).getMany();
      return views(m, revs);
    },

    /** Proposals waiting for review, oldest first. */
    async reviewQueue(q: { kind?: DocumentKind; class?: string }) {
      const m = ctx.dataSource.manager;
      const qb = m.getRepository(RevisionEntity).createQueryBuilder('r').innerJoin(DocumentEntity, 'd', 'd.id = r.document_id').where("r.state = 'in_review'");
      if (q.kind) qb.andWhere('d.kind = :kind', { kind: q.kind });
      if (q.class) qb.andWhere("d.kind = 'guide' AND r.content->>'class' = :cls", { cls: q.class });
      const revs = await qb.orderBy('r.submitted_at', 'ASC', 'NULLS FIRST').addOrderBy('r.created_at', 'ASC').getMany();
      return views(m, revs);
    },

    /** How many proposals this moderator can review (their own are not counted). */
    async reviewCount(actor: Member) {
      return ctx.dataSource
        .getRepository(RevisionEntity)
        .createQueryBuilder('r')
        .where("r.state = 'in_review' AND r.author_id <> :me", { me: actor.id })
        .getCount();
    },

    /** A proposal against the live revision: diff, changed metadata and what the calculators say about its worked examples. */
    async reviewDetail(actor: Member, id: string) {
      const m = ctx.dataSource.manager;
      const rev = await m.getRepository(RevisionEntity).findOneBy({ id });
      // Drafts are not proposals; a moderator sees them only through the author's revision routes.
      if (!rev || rev.state === 'draft') throw notFound('That proposal');
      const v = await view(m, rev);
      const liveRev =
        v.doc.publishedRevisionId && v.doc.publishedRevisionId !== rev.id
          ? await m.getRepository(RevisionEntity).findOneBy({ id: v.doc.publishedRevisionId })
          : null;
      const live = liveRev ? await view(m, liveRev, v.doc) : null;
      // A waiting proposal is judged against what readers see now; one already decided, against its own base.
      const baseRev = rev.state !== 'in_review' && rev.baseRevisionId ? await m.getRepository(RevisionEntity).findOneBy({ id: rev.baseRevisionId }) : null;
      const before = (rev.state === 'in_review' ? live?.rev.content : baseRev?.content) ?? {};
      const beforeSetup = ((rev.state === 'in_review' ? live?.rev.setup : baseRev?.setup) ?? null) as SetupRecord | null;
      const proposedSetup = (rev.setup ?? null) as SetupRecord | null;
      const diff = await bodyDiffOffThread(bodyOf(before), bodyOf(rev.content));
      return {
        sinceReturn: await sinceReturn(rev),
        setupChanges:
          beforeSetup || proposedSetup
            ? diffSetupFields(beforeSetup, proposedSetup)
                .filter((d) => d.changed)
                .map((d) => ({ path: d.path, label: d.label, unit: d.unit, from: d.a, to: d.b }))
            : null,
        setupWarnings: proposedSetup ? computeSetup(proposedSetup).cautions.filter((c) => c.level !== 'info') : null,
        view: v,
        live,
        changedFields: changedFields(before, rev.content),
        bodyDiff: diff.parts,
        bodyDiffDetail: diff.detail,
        workedExamples: checkWorkedExamples(String(rev.content.body ?? '')),
        checks: await checkRevisionContent(m, v.doc.kind, rev.content, rev.setup),
        approval: await approvalState(m, rev, v.doc),
        own: rev.authorId === actor.id,
        stale: (rev.baseRevisionId ?? null) !== (v.doc.publishedRevisionId ?? null) && rev.state === 'in_review',
      };
    },

    /**
     * Three-way merge of a stale draft with the live revision (against the draft's base). Changes
     * nothing: the client shows conflicts, then PATCHes the resolved content with the new base.
     */
    async rebase(actor: Member, id: string) {
      const m = ctx.dataSource.manager;
      const rev = await m.getRepository(RevisionEntity).findOneBy({ id });
      if (!rev) throw notFound('That revision');
      check(mayEdit(actor, rev));
      const doc = await m.getRepository(DocumentEntity).findOneByOrFail({ id: rev.documentId });
      if (!doc.publishedRevisionId) throw new AppError(409, 'no_published_revision', 'There is no live version to merge with yet');
      const live = await m.getRepository(RevisionEntity).findOneByOrFail({ id: doc.publishedRevisionId });
      const base = rev.baseRevisionId ? await m.getRepository(RevisionEntity).findOneBy({ id: rev.baseRevisionId }) : null;
      const result = threeWayMerge(base?.content ?? {}, rev.content, live.content);
      return { ...result, currentRevisionId: live.id, currentNumber: live.number, stale: rev.baseRevisionId !== live.id };
    },
  };
  return queries;
}

/**
 * A proposal that was sent back and submitted again: the moderator's reason and what the author changed
 * since (fields, body words, baseline), so the next review starts where the last one stopped.
 */
async function sinceReturn(rev: RevisionEntity) {
  const snap = rev.returnedSnapshot;
  if (!snap || rev.state !== 'in_review') return null;
  const fields = changedFields(snap.content, rev.content);
  const body = await bodyDiffOffThread(bodyOf(snap.content), bodyOf(rev.content));
  const setupChanged = JSON.stringify(snap.setup ?? null) !== JSON.stringify(rev.setup ?? null);
  const bodyChanged = body.parts.some((p) => p.added || p.removed);
  return {
    reason: snap.reason,
    returnedAt: snap.returnedAt,
    changed: fields.length > 0 || bodyChanged || setupChanged,
    changedFields: fields,
    bodyDiff: bodyChanged ? body.parts : [],
    setupChanged,
  };
}
