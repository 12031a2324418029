import { describe, expect, it } from 'vitest';
import { REVISION_STATES, type RevisionState } from '../../../shared/constants';
import { canSeeRevision, mayEdit, mayRestore, mayReview, maySubmit, mayWithdraw, type Actor } from '../../../server/modules/revisions/policy';

const author: Actor = { id: 'author', role: 'member' };
const stranger: Actor = { id: 'stranger', role: 'member' };
const moderator: Actor = { id: 'mod', role: 'moderator' };
const admin: Actor = { id: 'admin', role: 'admin' };
const rev = (state: RevisionState, authorId = 'author') => ({ authorId, state });
const code = (d: { ok: boolean; code?: string }) => (d.ok ? 'ok' : d.code);

describe('revision policy', () => {
  it('lets only the author edit, and only drafts and returned revisions', () => {
    expect(Object.fromEntries(REVISION_STATES.map((s) => [s, code(mayEdit(author, rev(s)))]))).toEqual({
      draft: 'ok',
      returned: 'ok',
      in_review: 'revision_in_review',
      published: 'immutable_revision',
      archived: 'immutable_revision',
    });
    expect(code(mayEdit(stranger, rev('draft')))).toBe('not_found');
    expect(code(mayEdit(stranger, rev('published')))).toBe('not_own_revision');
    expect(code(mayEdit(moderator, rev('draft')))).toBe('not_own_revision');
    expect(code(mayEdit(null, rev('draft')))).toBe('not_found');
  });

  it('submits from draft or returned, withdraws only from in_review', () => {
    expect(REVISION_STATES.filter((s) => maySubmit(author, rev(s)).ok)).toEqual(['draft', 'returned']);
    expect(REVISION_STATES.filter((s) => mayWithdraw(author, rev(s)).ok)).toEqual(['in_review']);
    expect(code(mayWithdraw(stranger, rev('in_review')))).toBe('not_found');
  });

  it('lets another moderator or an admin review, never the author and never a member', () => {
    expect(code(mayReview(moderator, rev('in_review')))).toBe('ok');
    expect(code(mayReview(admin, rev('in_review')))).toBe('ok');
    expect(code(mayReview(moderator, rev('in_review', 'mod')))).toBe('own_revision');
    expect(code(mayReview(author, rev('in_review', 'someone')))).toBe('forbidden');
    expect(REVISION_STATES.filter((s) => mayReview(moderator, rev(s)).ok)).toEqual(['in_review']);
  });

  it('restores only a superseded revision, by a moderator', () => {
    expect(code(mayRestore(moderator, rev('archived')))).toBe('ok');
    expect(code(mayRestore(moderator, rev('published')))).toBe('already_live');
    expect(code(mayRestore(moderator, rev('draft')))).toBe('invalid_transition');
    expect(code(mayRestore(author, rev('archived')))).toBe('forbidden');
  });

  it('shows live and superseded revisions to anyone, work in progress to its author and moderators', () => {
    expect(REVISION_STATES.filter((s) => canSeeRevision(null, rev(s)))).toEqual(['published', 'archived']);
    expect(REVISION_STATES.every((s) => canSeeRevision(author, rev(s)) && canSeeRevision(moderator, rev(s)))).toBe(true);
  });
});
