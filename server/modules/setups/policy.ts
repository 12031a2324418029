import { ALLOW, authorOnly, EDITABLE_STATES, type Actor, type Decision, type RevisionFacts } from '../revisions/policy';

/** Uploaded setups are private: only their owner may read, download or delete them. */
export function canReadUpload(user: { id: string } | null, row: { ownerId: string }): boolean {
  return !!user && user.id === row.ownerId;
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
