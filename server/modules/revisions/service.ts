import { In, type EntityManager, type QueryDeepPartialEntity } from 'typeorm';
import type { z } from 'zod';
import type { DocumentKind, RevisionState } from '../../../shared/constants';
import { contentSchemaFor, proposeEditSchema, revisionPatchSchema, type Person } from '../../../shared/schemas/revision';
import type { AppContext } from '../../context';
import { notifyDocumentChanged, type DocumentChange } from '../../lib/document-events';
import { AppError, notFound, validationFailed } from '../../lib/errors';
import { toFieldIssues } from '../../lib/route';
import { AuditLogEntity } from '../audit/audit-log.entity';
import { UserEntity } from '../auth/user.entity';
import { bodyOf, changedFields, checkWorkedExamples, threeWayMerge } from './compare';
import { bodyDiffOffThread } from './body-diff-pool';
import { diffSetupFields } from '../../../shared/setup/compare';
import { computeSetup } from '../../../shared/setup/computed';
import type { SetupRecord } from '../../../shared/schemas/setup-record';
import { DocumentEntity } from './document.entity';
import { reviewRequestMail, publishedMail, returnedMail } from './mail';
import {
  canSeeDocument,
  canSeeRevision,
  isAuthor,
  isModerator,
  mayEdit,
  mayHide,
  mayProposeEdit,
  mayRestore,
  mayReview,
  maySubmit,
  mayWithdraw,
  PUBLIC_STATES,
  type Actor,
  type Decision,
} from './policy';
import { presentRevision, titleOf, type RevisionView } from './presenter';
import { publishedCache } from './read-cache';
import { RevisionEntity } from './revision.entity';
import { hasBlockingChecks } from '../../../shared/content-checks/run';
import { checkRevisionContent, contentCheckFailed } from './checks';
import { approvalState, approveOrPublish, clearApprovals, type ApprovalState } from './approvals';

type Content = Record<string, unknown>;

const UNIQUE_VIOLATION = '23505';

/** Throws the refusal a policy decided on. */
function check(decision: Decision) {
  if (!decision.ok) throw new AppError(decision.status, decision.code, decision.message);
}

/** Kebab-case slug from a title: ASCII letters and digits, single hyphens, cut at a word boundary. */
export function slugify(text: string, max = 80): string {
  const s = text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/['’]/g, '')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
  if (s.length <= max) return s;
  const cut = s.slice(0, max);
  return cut.includes('-') ? cut.slice(0, cut.lastIndexOf('-')) : cut;
}

/** Validates content against the kind's schema; problems come back as 400 with paths under `where`. */
function parseContent(kind: DocumentKind, value: unknown, where: string): Content {
  const result = contentSchemaFor(kind).safeParse(value);
  if (!result.success) throw validationFailed(toFieldIssues(result.error, where));
  return result.data as Content;
}

function parseOrFail<S extends z.ZodType>(schema: S, value: unknown): z.output<S> {
  const result = schema.safeParse(value ?? {});
  if (!result.success) throw validationFailed(toFieldIssues(result.error, 'body'));
  return result.data;
}

function splitInput(input: Record<string, unknown>) {
  const { note, baseRevisionId, ...fields } = input as { note?: string; baseRevisionId?: string } & Content;
  return { note, baseRevisionId, fields };
}

async function people(m: EntityManager, ids: Array<string | null>): Promise<Map<string, Person>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  const rows = wanted.length ? await m.getRepository(UserEntity).find({ where: { id: In(wanted) }, select: { id: true, displayName: true } }) : [];
  return new Map(rows.map((u) => [u.id, { id: u.id, displayName: u.displayName }]));
}

/** Builds presentable views of revisions (documents, authors, reviewers, base numbers) in three queries. */
async function views(m: EntityManager, revs: RevisionEntity[], knownDocs: DocumentEntity[] = []): Promise<RevisionView[]> {
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
  const unknown = (id: string): Person => ({ id, displayName: 'Former member' });
  return revs.map((rev) => ({
    rev,
    doc: docs.get(rev.documentId)!,
    author: who.get(rev.authorId) ?? unknown(rev.authorId),
    reviewer: rev.reviewedBy ? (who.get(rev.reviewedBy) ?? unknown(rev.reviewedBy)) : null,
    baseNumber: rev.baseRevisionId ? (baseNumbers.get(rev.baseRevisionId) ?? null) : null,
  }));
}

async function view(m: EntityManager, rev: RevisionEntity, doc?: DocumentEntity) {
  return (await views(m, [rev], doc ? [doc] : []))[0];
}

function lockDocument(m: EntityManager, where: { id: string } | { kind: DocumentKind; slug: string }) {
  const qb = m.getRepository(DocumentEntity).createQueryBuilder('d').setLock('pessimistic_write');
  if ('id' in where) qb.where('d.id = :id', { id: where.id });
  else qb.where('d.kind = :kind AND d.slug = :slug', where);
  return qb.getOne();
}

async function audit(
  m: EntityManager,
  row: {
    actorId: string;
    action: string;
    subjectKind: 'revision' | 'document';
    subjectId: string;
    from: string | null;
    to: string | null;
    reason?: string | null;
    meta?: Record<string, unknown>;
  },
) {
  await m.getRepository(AuditLogEntity).insert({ ...row, reason: row.reason ?? null, meta: row.meta ?? {} } as QueryDeepPartialEntity<AuditLogEntity>);
}

const revMeta = (doc: DocumentEntity, rev: RevisionEntity, extra: Record<string, unknown> = {}) => ({
  documentId: doc.id,
  kind: doc.kind,
  slug: doc.slug,
  number: rev.number,
  ...extra,
});

/**
 * A sent-back revision becomes a draft again on the author's first change to it (text, fields or
 * baseline), audited; the moderator's reason stays with it until it is submitted again. Call inside
 * the transaction that makes the change, with the revision row locked.
 */
export async function reopenIfReturned(m: EntityManager, actorId: string, rev: RevisionEntity, doc: DocumentEntity) {
  if (rev.state !== 'returned') return;
  await m.getRepository(RevisionEntity).update({ id: rev.id }, { state: 'draft' });
  await audit(m, { actorId, action: 'revision.reopen', subjectKind: 'revision', subjectId: rev.id, from: 'returned', to: 'draft', meta: revMeta(doc, rev) });
}

async function nextNumber(m: EntityManager, documentId: string): Promise<number> {
  const [row] = await m.query('SELECT COALESCE(MAX(number), 0) + 1 AS n FROM revisions WHERE document_id = $1', [documentId]);
  return Number(row.n);
}

/** 409 stale_base carrying the live revision, so the client can offer a merge against it. */
async function staleBase(m: EntityManager, doc: DocumentEntity): Promise<AppError> {
  const live = doc.publishedRevisionId ? await m.getRepository(RevisionEntity).findOneBy({ id: doc.publishedRevisionId }) : null;
  const current = live ? presentRevision(await view(m, live, doc)) : null;
  return new AppError(
    409,
    'stale_base',
    'The live version changed after this draft was started. Merge your changes into the current version first; your text is kept.',
    { current },
  );
}

async function assertFreshBase(m: EntityManager, rev: RevisionEntity, doc: DocumentEntity) {
  if ((rev.baseRevisionId ?? null) !== (doc.publishedRevisionId ?? null)) throw await staleBase(m, doc);
}

/**
 * The one revision state machine, for guides and parameters alike. Every transition runs in one
 * transaction that first locks the document row, writes an audit-log row, and queues its mail in
 * the same transaction (so a mail exists exactly when the change does).
 */
export function revisionService(ctx: AppContext) {
  const cache = publishedCache(ctx);

  /** Runs `fn` with the document locked and the revision read after the lock. */
  async function inRevisionTx<T>(revisionId: string, fn: (m: EntityManager, rev: RevisionEntity, doc: DocumentEntity) => Promise<T>): Promise<T> {
    return ctx.dataSource.transaction(async (m) => {
      const pre = await m.getRepository(RevisionEntity).findOne({ where: { id: revisionId }, select: { id: true, documentId: true } });
      if (!pre) throw notFound('That revision');
      const doc = await lockDocument(m, { id: pre.documentId });
      const rev = await m.getRepository(RevisionEntity).findOneBy({ id: revisionId });
      if (!doc || !rev) throw notFound('That revision');
      return fn(m, rev, doc);
    });
  }

  async function reload(m: EntityManager, id: string, doc: DocumentEntity) {
    return view(m, await m.getRepository(RevisionEntity).findOneByOrFail({ id }), doc);
  }

  async function visibleDocument(m: EntityManager, actor: Actor, kind: DocumentKind, slug: string) {
    const doc = await m.getRepository(DocumentEntity).findOneBy({ kind, slug });
    if (!doc || !canSeeDocument(actor, doc)) throw notFound(kind === 'guide' ? 'That guide' : 'That parameter');
    return doc;
  }

  async function mailModerators(m: EntityManager, rev: RevisionEntity, doc: DocumentEntity, authorName: string) {
    const moderators = await m
      .getRepository(UserEntity)
      .createQueryBuilder('u')
      .where("u.role IN ('moderator', 'admin') AND u.disabledAt IS NULL AND u.emailVerifiedAt IS NOT NULL AND u.id <> :author", { author: rev.authorId })
      .getMany();
    for (const mod of moderators) {
      await ctx.mailer.send(
        reviewRequestMail(mod, {
          appUrl: ctx.config.appUrl,
          kind: doc.kind,
          slug: doc.slug,
          title: titleOf(rev),
          number: rev.number,
          revisionId: rev.id,
          authorName,
          note: rev.note,
          isNew: doc.publishedRevisionId === null,
        }),
        m,
      );
    }
  }

  async function activeUser(m: EntityManager, id: string) {
    const u = await m.getRepository(UserEntity).findOneBy({ id });
    return u && !u.disabledAt ? u : null;
  }

  /** Drops cached reader copies once the transaction committed (other instances hear the NOTIFY). */
  function afterCommit(change: Pick<DocumentChange, 'kind' | 'slug'>) {
    cache.invalidate(change.kind, change.slug);
  }

  return {
    /** A new document with the author's draft as revision 1; for guides the slug comes from the title. */
    async createDocument(actor: NonNullable<Actor>, kind: DocumentKind, input: Record<string, unknown>) {
      const { note, fields } = splitInput(input);
      const content = parseContent(kind, fields, 'body');
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
            return view(m, rev, doc);
          });
        } catch (err) {
          // Two authors picked the same title at the same moment: choose the next free slug.
          if ((err as { code?: string; driverError?: { code?: string } }).driverError?.code === UNIQUE_VIOLATION && attempt < 5) continue;
          throw err;
        }
      }
    },

    /** A new draft of an existing document, based on its live revision; fields not sent are copied from it. */
    async createDraft(actor: NonNullable<Actor>, kind: DocumentKind, slug: string, input: Record<string, unknown>) {
      const parsed = parseOrFail(proposeEditSchema(kind), input);
      const { note, baseRevisionId, fields } = splitInput(parsed);
      return ctx.dataSource.transaction(async (m) => {
        const doc = await lockDocument(m, { kind, slug });
        // The same answer as visibleDocument's for a slug nobody used, whatever this one's state.
        if (!doc || !canSeeDocument(actor, doc)) throw notFound(kind === 'guide' ? 'That guide' : 'That parameter');
        check(mayProposeEdit(actor, doc));
        if (baseRevisionId !== doc.publishedRevisionId) throw await staleBase(m, doc);
        const base = await m.getRepository(RevisionEntity).findOneByOrFail({ id: doc.publishedRevisionId! });
        const content = parseContent(kind, { ...base.content, ...fields }, 'body');
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
        await audit(m, {
          actorId: actor.id,
          action: 'revision.create',
          subjectKind: 'revision',
          subjectId: rev.id,
          from: null,
          to: 'draft',
          meta: revMeta(doc, rev, { baseNumber: base.number }),
        });
        return view(m, rev, doc);
      });
    },

    /**
     * Autosave of the author's draft (or returned revision). `baseRevisionId` may move only to the
     * live revision: that is how a merged draft catches up after a 409 stale_base.
     */
    async updateDraft(actor: NonNullable<Actor>, id: string, input: unknown) {
      return inRevisionTx(id, async (m, rev, doc) => {
        check(mayEdit(actor, rev));
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
    },

    /** Draft (or returned) → in_review, with the edit note; the moderators are told. */
    async submit(actor: NonNullable<Actor>, id: string, note: string) {
      return inRevisionTx(id, async (m, rev, doc) => {
        check(maySubmit(actor, rev));
        const content = parseContent(doc.kind, rev.content, 'content');
        const checks = await checkRevisionContent(m, doc.kind, content, rev.setup);
        if (hasBlockingChecks(checks)) throw contentCheckFailed(checks);
        await assertFreshBase(m, rev, doc);
        const from = rev.state;
        await clearApprovals(m, id);
        await m.getRepository(RevisionEntity).update({ id }, {
          state: 'in_review',
          note,
          content,
          submittedAt: new Date(),
          reason: null,
          reviewedBy: null,
          reviewedAt: null,
        } as QueryDeepPartialEntity<RevisionEntity>);
        await audit(m, {
          actorId: actor.id,
          action: 'revision.submit',
          subjectKind: 'revision',
          subjectId: id,
          from,
          to: 'in_review',
          meta: revMeta(doc, rev, { note }),
        });
        const v = await reload(m, id, doc);
        await mailModerators(m, v.rev, doc, v.author.displayName);
        return v;
      });
    },

    /** in_review → draft, by the author. */
    async withdraw(actor: NonNullable<Actor>, id: string) {
      return inRevisionTx(id, async (m, rev, doc) => {
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
    },

    /**
     * in_review → published by another moderator; the previous live revision becomes archived. A
     * safety-relevant proposal needs two different moderators: the first call records an approval and
     * leaves it in review (`approval` is then set), the second publishes.
     */
    async publish(actor: NonNullable<Actor>, id: string): Promise<RevisionView & { approval: ApprovalState | null }> {
      const v = await inRevisionTx(id, async (m, rev, doc) => {
        check(mayReview(actor, rev));
        await assertFreshBase(m, rev, doc);
        const gate = await approveOrPublish(m, actor.id, rev, doc);
        if (!gate.publish) return { ...(await reload(m, id, doc)), approval: gate.state };
        const now = new Date();
        const previousId = doc.publishedRevisionId;
        if (previousId) {
          // Archive first: at most one published revision per document, checked row by row.
          await m.getRepository(RevisionEntity).update({ id: previousId }, { state: 'archived' });
          const prev = await m.getRepository(RevisionEntity).findOneByOrFail({ id: previousId });
          await audit(m, {
            actorId: actor.id,
            action: 'revision.archive',
            subjectKind: 'revision',
            subjectId: previousId,
            from: 'published',
            to: 'archived',
            meta: revMeta(doc, prev, { supersededBy: rev.number }),
          });
        }
        await m.getRepository(RevisionEntity).update({ id }, { state: 'published', publishedAt: now, reviewedBy: actor.id, reviewedAt: now });
        await m.getRepository(DocumentEntity).update({ id: doc.id }, { publishedRevisionId: id });
        await audit(m, {
          actorId: actor.id,
          action: 'revision.publish',
          subjectKind: 'revision',
          subjectId: id,
          from: 'in_review',
          to: 'published',
          meta: revMeta(doc, rev),
        });
        await notifyDocumentChanged(m, { kind: doc.kind, documentId: doc.id, slug: doc.slug, action: 'published' });
        const author = await activeUser(m, rev.authorId);
        const fresh = await reload(m, id, { ...doc, publishedRevisionId: id });
        if (author) {
          await ctx.mailer.send(
            publishedMail(author, {
              appUrl: ctx.config.appUrl,
              kind: doc.kind,
              slug: doc.slug,
              title: titleOf(rev),
              number: rev.number,
              revisionId: id,
              reviewerName: fresh.reviewer?.displayName ?? 'A moderator',
            }),
            m,
          );
        }
        return { ...fresh, approval: null };
      });
      if (!v.approval) afterCommit(v.doc);
      return v;
    },

    /** in_review → returned with the moderator's reason; the author is told and can edit and resubmit it. */
    async returnRevision(actor: NonNullable<Actor>, id: string, reason: string) {
      return inRevisionTx(id, async (m, rev, doc) => {
        check(mayReview(actor, rev));
        await clearApprovals(m, id);
        await m.getRepository(RevisionEntity).update({ id }, { state: 'returned', reason, reviewedBy: actor.id, reviewedAt: new Date() });
        await audit(m, {
          actorId: actor.id,
          action: 'revision.return',
          subjectKind: 'revision',
          subjectId: id,
          from: 'in_review',
          to: 'returned',
          reason,
          meta: revMeta(doc, rev),
        });
        const fresh = await reload(m, id, doc);
        const author = await activeUser(m, rev.authorId);
        if (author) {
          await ctx.mailer.send(
            returnedMail(author, {
              appUrl: ctx.config.appUrl,
              kind: doc.kind,
              slug: doc.slug,
              title: titleOf(rev),
              number: rev.number,
              revisionId: id,
              reviewerName: fresh.reviewer?.displayName ?? 'A moderator',
              reason,
              isNew: !rev.baseRevisionId,
            }),
            m,
          );
        }
        return fresh;
      });
    },

    /** A new live revision copying an older one's content (restored_from_number says which); the current one is archived. */
    async restore(actor: NonNullable<Actor>, kind: DocumentKind, slug: string, number: number, note?: string) {
      const v = await ctx.dataSource.transaction(async (m) => {
        const doc = await lockDocument(m, { kind, slug });
        if (!doc) throw notFound(kind === 'guide' ? 'That guide' : 'That parameter');
        const target = await m.getRepository(RevisionEntity).findOneBy({ documentId: doc.id, number });
        if (!target) throw notFound(`Version ${number}`);
        check(mayRestore(actor, target));
        const now = new Date();
        const current = doc.publishedRevisionId ? await m.getRepository(RevisionEntity).findOneByOrFail({ id: doc.publishedRevisionId }) : null;
        if (current) {
          await m.getRepository(RevisionEntity).update({ id: current.id }, { state: 'archived' });
          await audit(m, {
            actorId: actor.id,
            action: 'revision.archive',
            subjectKind: 'revision',
            subjectId: current.id,
            from: 'published',
            to: 'archived',
            meta: revMeta(doc, current),
          });
        }
        const rev = await m.getRepository(RevisionEntity).save(
          m.getRepository(RevisionEntity).create({
            documentId: doc.id,
            number: await nextNumber(m, doc.id),
            baseRevisionId: current?.id ?? null,
            authorId: actor.id,
            state: 'published',
            note: note?.trim() || `Restored version ${target.number}`,
            content: target.content,
            setup: target.setup,
            restoredFromNumber: target.number,
            submittedAt: now,
            reviewedBy: actor.id,
            reviewedAt: now,
            publishedAt: now,
          }),
        );
        await m.getRepository(DocumentEntity).update({ id: doc.id }, { publishedRevisionId: rev.id });
        await audit(m, {
          actorId: actor.id,
          action: 'revision.restore',
          subjectKind: 'revision',
          subjectId: rev.id,
          from: null,
          to: 'published',
          meta: revMeta(doc, rev, { restoredFromNumber: target.number }),
        });
        await notifyDocumentChanged(m, { kind, documentId: doc.id, slug, action: 'restored' });
        return view(m, rev, { ...doc, publishedRevisionId: rev.id });
      });
      afterCommit({ kind, slug });
      return v;
    },

    /** Hides a document from everyone but moderators (abuse), or shows it again. */
    async setHidden(actor: NonNullable<Actor>, kind: DocumentKind, slug: string, hide: boolean, reason: string | null) {
      const doc = await ctx.dataSource.transaction(async (m) => {
        const d = await lockDocument(m, { kind, slug });
        if (!d) throw notFound(kind === 'guide' ? 'That guide' : 'That parameter');
        check(mayHide(actor, d, hide));
        const patch = hide ? { hiddenAt: new Date(), hiddenBy: actor.id, hiddenReason: reason } : { hiddenAt: null, hiddenBy: null, hiddenReason: null };
        await m.getRepository(DocumentEntity).update({ id: d.id }, patch);
        await audit(m, {
          actorId: actor.id,
          action: hide ? 'document.hide' : 'document.unhide',
          subjectKind: 'document',
          subjectId: d.id,
          from: hide ? 'visible' : 'hidden',
          to: hide ? 'hidden' : 'visible',
          reason,
          meta: { kind, slug },
        });
        await notifyDocumentChanged(m, { kind, documentId: d.id, slug, action: hide ? 'hidden' : 'unhidden' });
        return m.getRepository(DocumentEntity).findOneByOrFail({ id: d.id });
      });
      afterCommit({ kind, slug });
      return doc;
    },

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
      if (result === null) throw notFound(kind === 'guide' ? 'That guide' : 'That parameter');
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
      const [a, b] = [await this.byNumber(actor, kind, slug, from), await this.byNumber(actor, kind, slug, to)];
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
    async myRevisions(actor: NonNullable<Actor>, q: { state?: RevisionState; kind?: DocumentKind }) {
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
    async reviewCount(actor: NonNullable<Actor>) {
      return ctx.dataSource
        .getRepository(RevisionEntity)
        .createQueryBuilder('r')
        .where("r.state = 'in_review' AND r.author_id <> :me", { me: actor.id })
        .getCount();
    },

    /** A proposal against the live revision: diff, changed metadata and what the calculators say about its worked examples. */
    async reviewDetail(actor: NonNullable<Actor>, id: string) {
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
    async rebase(actor: NonNullable<Actor>, id: string) {
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
}

export type RevisionService = ReturnType<typeof revisionService>;
