import { In, type EntityManager, type QueryDeepPartialEntity } from 'typeorm';
import { safetyRelevantChanges, type SafetyChange } from '../../../shared/content-checks/safety-changes';
import type { Person } from '../../../shared/schemas/revision';
import type { SetupRecord } from '../../../shared/schemas/setup-record';
import { conflict } from '../../lib/errors';
import { AuditLogEntity } from '../audit/audit-log.entity';
import { UserEntity } from '../auth/user.entity';
import type { DocumentEntity } from './document.entity';
import { ReviewApprovalEntity } from './review-approval.entity';
import { RevisionEntity } from './revision.entity';

/** How many moderators a proposal needs, why, and who has approved it so far. */
export type ApprovalState = { needed: 1 | 2; rules: SafetyChange[]; approvals: Array<{ moderator: Person; at: string }> };

async function liveSetup(m: EntityManager, rev: RevisionEntity, doc: DocumentEntity): Promise<SetupRecord | null> {
  // A waiting proposal is judged against what readers see now; one already decided, against its base.
  const againstId = rev.state === 'in_review' ? doc.publishedRevisionId : rev.baseRevisionId;
  if (!againstId || againstId === rev.id) return null;
  const live = await m.getRepository(RevisionEntity).findOne({ where: { id: againstId }, select: { id: true, setup: true } });
  return (live?.setup ?? null) as SetupRecord | null;
}

/** The approval state of a revision (for the review screen and the publish answer). */
export async function approvalState(m: EntityManager, rev: RevisionEntity, doc: DocumentEntity): Promise<ApprovalState> {
  const rules = safetyRelevantChanges(await liveSetup(m, rev, doc), (rev.setup ?? null) as SetupRecord | null);
  const rows = await m.getRepository(ReviewApprovalEntity).find({ where: { revisionId: rev.id }, order: { createdAt: 'ASC' } });
  const users = rows.length
    ? await m.getRepository(UserEntity).find({ where: { id: In(rows.map((r) => r.moderatorId)) }, select: { id: true, displayName: true } })
    : [];
  const names = new Map(users.map((u) => [u.id, u.displayName]));
  return {
    needed: rules.length ? 2 : 1,
    rules,
    approvals: rows.map((r) => ({ moderator: { id: r.moderatorId, displayName: names.get(r.moderatorId) ?? 'Former member' }, at: r.createdAt.toISOString() })),
  };
}

/**
 * Called by publish with the document locked. A proposal that needs one moderator publishes. One that
 * needs two records this moderator's approval: the first approval leaves it in review (`publish: false`),
 * the second, from a different moderator, publishes. The author can never approve (the review policy
 * refuses them before this), and the same moderator twice is refused with 409, not counted twice.
 */
export async function approveOrPublish(
  m: EntityManager,
  actorId: string,
  rev: RevisionEntity,
  doc: DocumentEntity,
): Promise<{ publish: boolean; state: ApprovalState }> {
  const state = await approvalState(m, rev, doc);
  if (state.needed === 1) return { publish: true, state };
  const others = state.approvals.filter((a) => a.moderator.id !== rev.authorId);
  if (others.some((a) => a.moderator.id === actorId)) {
    throw conflict(
      'already_approved',
      'You have already approved this proposal. It changes the baseline in a way that needs a second, different moderator to publish it.',
      { rules: state.rules },
    );
  }
  await m.getRepository(ReviewApprovalEntity).insert({ revisionId: rev.id, moderatorId: actorId });
  if (others.length >= 1) return { publish: true, state: await approvalState(m, rev, doc) };
  await m.getRepository(AuditLogEntity).insert({
    actorId,
    action: 'revision.approve',
    subjectKind: 'revision',
    subjectId: rev.id,
    from: 'in_review',
    to: 'in_review',
    reason: null,
    meta: { documentId: doc.id, kind: doc.kind, slug: doc.slug, number: rev.number, needed: 2, rules: state.rules.map((r) => r.rule) },
  } as QueryDeepPartialEntity<AuditLogEntity>);
  return { publish: false, state: await approvalState(m, rev, doc) };
}

/** Forgets the approvals of a revision whose text may change again (withdrawn, returned, submitted anew). */
export async function clearApprovals(m: EntityManager, revisionId: string) {
  await m.getRepository(ReviewApprovalEntity).delete({ revisionId });
}
