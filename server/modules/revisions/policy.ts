import { hasRole, type RevisionState, type Role } from '../../../shared/constants';

/**
 * Who may do what to a revision or document. Pure functions over plain data: each returns
 * `ALLOW` or the refusal the API answers with, so the rules can be read (and tested) in one place.
 */
export type Actor = { id: string; role: Role } | null;
export type RevisionFacts = { authorId: string; state: RevisionState };
export type DocumentFacts = { hiddenAt: Date | null; publishedRevisionId: string | null; createdBy: string | null };

export type Decision = { ok: true } | { ok: false; status: 403 | 404 | 409; code: string; message: string };

export const ALLOW: Decision = { ok: true };
const deny = (status: 403 | 404 | 409, code: string, message: string): Decision => ({ ok: false, status, code, message });
const NOT_FOUND = deny(404, 'not_found', 'That revision was not found');

/** States anyone may read: the live revision and the ones it superseded. */
export const PUBLIC_STATES: readonly RevisionState[] = ['published', 'archived'];
/** States the author can still change (their workbench): a returned revision is editable and can be resubmitted. */
export const EDITABLE_STATES: readonly RevisionState[] = ['draft', 'returned'];

export const isModerator = (actor: Actor) => hasRole(actor, 'moderator');
export const isAuthor = (actor: Actor, rev: RevisionFacts) => actor !== null && actor.id === rev.authorId;

/** Readers see published and archived revisions; authors see their own; moderators see every revision. */
export function canSeeRevision(actor: Actor, rev: RevisionFacts): boolean {
  return PUBLIC_STATES.includes(rev.state) || isAuthor(actor, rev) || isModerator(actor);
}

/**
 * A hidden document is gone for everyone but moderators; one that has never been live exists only for
 * its author and the moderators (anyone else is told exactly what an unused slug would tell them).
 */
export function canSeeDocument(actor: Actor, doc: DocumentFacts): boolean {
  if (isModerator(actor)) return true;
  if (doc.hiddenAt !== null) return false;
  return doc.publishedRevisionId !== null || (actor !== null && actor.id === doc.createdBy);
}

/**
 * Author-only actions: whoever cannot see the revision is told nothing exists (404, the same answer as
 * for an id that was never used); whoever can see it (moderators, anyone for a live one) gets 403.
 */
export function authorOnly(actor: Actor, rev: RevisionFacts): Decision {
  if (isAuthor(actor, rev)) return ALLOW;
  if (!canSeeRevision(actor, rev)) return NOT_FOUND;
  return deny(403, 'not_own_revision', 'Only the author can change this revision');
}

/** Autosave and rebase: the author's own draft or returned revision. */
export function mayEdit(actor: Actor, rev: RevisionFacts): Decision {
  const who = authorOnly(actor, rev);
  if (!who.ok) return who;
  if (rev.state === 'in_review') return deny(409, 'revision_in_review', 'This revision is waiting for review; withdraw it to edit it again');
  if (!EDITABLE_STATES.includes(rev.state)) return deny(409, 'immutable_revision', 'A published or superseded revision never changes; propose an edit instead');
  return ALLOW;
}

/** Submit for review: the author, from draft or returned. */
export function maySubmit(actor: Actor, rev: RevisionFacts): Decision {
  const who = authorOnly(actor, rev);
  if (!who.ok) return who;
  if (!EDITABLE_STATES.includes(rev.state)) return deny(409, 'invalid_transition', `A revision that is ${rev.state.replace('_', ' ')} cannot be submitted`);
  return ALLOW;
}

/**
 * Discard: the author throws away their draft or a sent-back version. Anything submitted and waiting,
 * live or superseded is part of the history and stays (withdraw a waiting one first).
 */
export function mayDiscard(actor: Actor, rev: RevisionFacts): Decision {
  const who = authorOnly(actor, rev);
  if (!who.ok) return who;
  if (rev.state === 'in_review') return deny(409, 'revision_in_review', 'This revision is waiting for review; withdraw it first to discard it');
  if (!EDITABLE_STATES.includes(rev.state))
    return deny(409, 'immutable_revision', 'A published or superseded version stays in the history; it cannot be discarded');
  return ALLOW;
}

/** Withdraw a proposal: the author, while it waits for review. */
export function mayWithdraw(actor: Actor, rev: RevisionFacts): Decision {
  const who = authorOnly(actor, rev);
  if (!who.ok) return who;
  if (rev.state !== 'in_review') return deny(409, 'invalid_transition', 'Only a revision waiting for review can be withdrawn');
  return ALLOW;
}

/** Publish or return: a moderator who is not the author, while it waits for review. */
export function mayReview(actor: Actor, rev: RevisionFacts): Decision {
  if (!isModerator(actor)) return deny(403, 'forbidden', 'Only moderators can review revisions');
  if (isAuthor(actor, rev)) return deny(403, 'own_revision', 'You cannot review your own revision; another moderator has to');
  if (rev.state !== 'in_review') return deny(409, 'invalid_transition', 'Only a revision waiting for review can be published or returned');
  return ALLOW;
}

/** Restore an older version as a new live revision: a moderator, from a superseded revision. */
export function mayRestore(actor: Actor, target: RevisionFacts): Decision {
  if (!isModerator(actor)) return deny(403, 'forbidden', 'Only moderators can restore a version');
  if (target.state === 'published') return deny(409, 'already_live', 'That version is already the live one');
  if (target.state !== 'archived') return deny(409, 'invalid_transition', 'Only a superseded version can be restored');
  return ALLOW;
}

/** Hide or unhide a document: moderators. */
export function mayHide(actor: Actor, doc: DocumentFacts, hide: boolean): Decision {
  if (!isModerator(actor)) return deny(403, 'forbidden', 'Only moderators can hide content');
  if (hide && doc.hiddenAt) return deny(409, 'invalid_transition', 'It is already hidden');
  if (!hide && !doc.hiddenAt) return deny(409, 'invalid_transition', 'It is not hidden');
  return ALLOW;
}

/** Propose an edit: any member, on a live document they can see. */
export function mayProposeEdit(actor: Actor, doc: DocumentFacts): Decision {
  if (!actor) return deny(403, 'forbidden', 'Sign in to propose an edit');
  if (!canSeeDocument(actor, doc)) return deny(404, 'not_found', 'That page was not found');
  if (!doc.publishedRevisionId) return deny(409, 'no_published_revision', 'This has no live version yet; only its author can work on it until it is published');
  return ALLOW;
}

/** A revision's baseline changes only in its author's draft; refusals follow the revision rules (404 or 403). */
export function mayChangeBaseline(actor: Actor, rev: RevisionFacts): Decision {
  const who = authorOnly(actor, rev);
  if (!who.ok) return who;
  // A sent-back revision is the author's to fix, baseline included (it becomes a draft again).
  if (!EDITABLE_STATES.includes(rev.state))
    return {
      ok: false,
      status: 409,
      code: 'not_draft',
      message: 'The baseline can only change while the revision is a draft or sent back; start a new draft to change it.',
    };
  return ALLOW;
}
