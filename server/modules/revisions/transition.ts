import type { EntityManager, QueryDeepPartialEntity } from 'typeorm';
import type { DocumentKind } from '../../../shared/constants';
import type { AppContext } from '../../context';
import type { DocumentChange } from '../../lib/document-events';
import { AppError, notFound } from '../../lib/errors';
import { AuditLogEntity } from '../audit/audit-log.entity';
import { UserEntity } from '../auth/user.entity';
import { DocumentEntity } from './document.entity';
import type { Actor, Decision } from './policy';
import { presentRevision } from './presenter';
import { publishedCache } from './read-cache';
import { RevisionEntity } from './revision.entity';
import { view } from './views';

/**
 * What every revision command shares: the lock, the audit row, the refusal a policy decided on, the
 * stale-base answer and the cache drop after commit. A command is one function in commands/, which
 * runs its transition inside `inRevisionTx` or `inDocumentTx`, so the document row is always locked
 * first and every state change writes its audit row in the same transaction as the change.
 */

/** A signed-in person: what a route whose access is member or above hands its command. */
export type Member = NonNullable<Actor>;

/** Throws the refusal a policy decided on. */
export function check(decision: Decision) {
  if (!decision.ok) throw new AppError(decision.status, decision.code, decision.message);
}

export const documentNotFound = (kind: DocumentKind) => notFound(kind === 'guide' ? 'That guide' : 'That parameter');

export function lockDocument(m: EntityManager, where: { id: string } | { kind: DocumentKind; slug: string }) {
  const qb = m.getRepository(DocumentEntity).createQueryBuilder('d').setLock('pessimistic_write');
  if ('id' in where) qb.where('d.id = :id', { id: where.id });
  else qb.where('d.kind = :kind AND d.slug = :slug', where);
  return qb.getOne();
}

export type AuditRow = {
  actorId: string;
  action: string;
  subjectKind: 'revision' | 'document';
  subjectId: string;
  from: string | null;
  to: string | null;
  reason?: string | null;
  meta?: Record<string, unknown>;
};

export async function audit(m: EntityManager, row: AuditRow) {
  await m.getRepository(AuditLogEntity).insert({ ...row, reason: row.reason ?? null, meta: row.meta ?? {} } as QueryDeepPartialEntity<AuditLogEntity>);
}

/** The audit row's description of a revision: which document, which number. */
export const revMeta = (doc: DocumentEntity, rev: RevisionEntity, extra: Record<string, unknown> = {}) => ({
  documentId: doc.id,
  kind: doc.kind,
  slug: doc.slug,
  number: rev.number,
  ...extra,
});

/**
 * A sent-back revision becomes a draft again on the author's first change to it (text, fields,
 * baseline or evidence), audited; the moderator's reason stays with it until it is submitted again.
 * Call inside the transaction that makes the change, with the document row locked.
 */
export async function reopenIfReturned(m: EntityManager, actorId: string, rev: RevisionEntity, doc: DocumentEntity) {
  if (rev.state !== 'returned') return;
  await m.getRepository(RevisionEntity).update({ id: rev.id }, { state: 'draft' });
  await audit(m, { actorId, action: 'revision.reopen', subjectKind: 'revision', subjectId: rev.id, from: 'returned', to: 'draft', meta: revMeta(doc, rev) });
}

export async function nextNumber(m: EntityManager, documentId: string): Promise<number> {
  const [row] = await m.query('SELECT COALESCE(MAX(number), 0) + 1 AS n FROM revisions WHERE document_id = $1', [documentId]);
  return Number(row.n);
}

/** 409 stale_base carrying the live revision, so the client can offer a merge against it. */
export async function staleBase(m: EntityManager, doc: DocumentEntity): Promise<AppError> {
  const live = doc.publishedRevisionId ? await m.getRepository(RevisionEntity).findOneBy({ id: doc.publishedRevisionId }) : null;
  const current = live ? presentRevision(await view(m, live, doc)) : null;
  return new AppError(
    409,
    'stale_base',
    'The live version changed after this draft was started. Merge your changes into the current version first; your text is kept.',
    { current },
  );
}

export async function assertFreshBase(m: EntityManager, rev: RevisionEntity, doc: DocumentEntity) {
  if ((rev.baseRevisionId ?? null) !== (doc.publishedRevisionId ?? null)) throw await staleBase(m, doc);
}

/** Runs `fn` in one transaction with the revision's document locked and the revision read after the lock (404 if either is missing). */
export function inRevisionTx<T>(
  ctx: AppContext,
  revisionId: string,
  fn: (m: EntityManager, rev: RevisionEntity, doc: DocumentEntity) => Promise<T>,
): Promise<T> {
  return ctx.dataSource.transaction(async (m) => {
    const pre = await m.getRepository(RevisionEntity).findOne({ where: { id: revisionId }, select: { id: true, documentId: true } });
    if (!pre) throw notFound('That revision');
    const doc = await lockDocument(m, { id: pre.documentId });
    const rev = await m.getRepository(RevisionEntity).findOneBy({ id: revisionId });
    if (!doc || !rev) throw notFound('That revision');
    return fn(m, rev, doc);
  });
}

/** Runs `fn` in one transaction with the document locked (404 if there is none). */
export function inDocumentTx<T>(ctx: AppContext, kind: DocumentKind, slug: string, fn: (m: EntityManager, doc: DocumentEntity) => Promise<T>): Promise<T> {
  return ctx.dataSource.transaction(async (m) => {
    const doc = await lockDocument(m, { kind, slug });
    if (!doc) throw documentNotFound(kind);
    return fn(m, doc);
  });
}

/** The account if it exists and is not disabled (mail goes only to those). */
export async function activeUser(m: EntityManager, id: string) {
  const u = await m.getRepository(UserEntity).findOneBy({ id });
  return u && !u.disabledAt ? u : null;
}

/** Drops cached reader copies once the transaction committed (other instances hear the NOTIFY). */
export function afterCommit(ctx: AppContext, change: Pick<DocumentChange, 'kind' | 'slug'>) {
  publishedCache(ctx).invalidate(change.kind, change.slug);
}
