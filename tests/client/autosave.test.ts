import { describe, expect, it } from 'vitest';
import {
  clearLocalDraft,
  describeStatus,
  isUnsavedStatus,
  localDraftKey,
  readLocalDraft,
  sameContent,
  shouldOfferRestore,
  statusForError,
  writeLocalDraft,
} from '../../src/features/editor/lib/autosave';

function memoryStorage() {
  const m = new Map<string, string>();
  return {
    getItem: (k: string) => m.get(k) ?? null,
    setItem: (k: string, v: string) => void m.set(k, v),
    removeItem: (k: string) => void m.delete(k),
    raw: m,
  };
}

describe('localDraftKey', () => {
  it('names a draft by revision once it exists, by document before', () => {
    expect(localDraftKey({ revisionId: 'abc', kind: 'guide', slug: 'x' })).toBe('tw:draft:abc');
    expect(localDraftKey({ kind: 'guide', slug: null })).toBe('tw:draft:guide:new');
    expect(localDraftKey({ kind: 'parameter', slug: 'drag-brake' })).toBe('tw:draft:parameter:drag-brake');
  });
});

describe('local draft storage', () => {
  it('round-trips a draft and clears it', () => {
    const s = memoryStorage();
    const draft = { content: { title: 'Clay', tags: ['2S'] }, editedAt: 10, savedAt: null };
    expect(writeLocalDraft(s, 'k', draft)).toBe(true);
    expect(readLocalDraft(s, 'k')).toEqual(draft);
    clearLocalDraft(s, 'k');
    expect(readLocalDraft(s, 'k')).toBeNull();
  });

  it('ignores a corrupt entry instead of throwing', () => {
    const s = memoryStorage();
    s.setItem('k', '{not json');
    expect(readLocalDraft(s, 'k')).toBeNull();
    s.setItem('k', JSON.stringify({ content: 'x' }));
    expect(readLocalDraft(s, 'k')).toBeNull();
  });

  it('reports a storage that refuses to write', () => {
    const full = {
      getItem: () => null,
      setItem: () => {
        throw new Error('QuotaExceededError');
      },
      removeItem: () => {},
    };
    expect(writeLocalDraft(full, 'k', { content: 1, editedAt: 1, savedAt: null })).toBe(false);
  });
});

describe('sameContent', () => {
  it('ignores key order and undefined keys but not values', () => {
    expect(sameContent({ a: 1, b: [1, 2] }, { b: [1, 2], a: 1 })).toBe(true);
    expect(sameContent({ a: 1, c: undefined }, { a: 1 })).toBe(true);
    expect(sameContent({ a: [1, 2] }, { a: [2, 1] })).toBe(false);
    expect(sameContent({ body: 'x' }, { body: 'x ' })).toBe(false);
  });
});

describe('shouldOfferRestore', () => {
  const server = { content: { body: 'saved text' }, updatedAt: new Date(1_000).toISOString() };

  it('offers text edited after the server copy and never confirmed', () => {
    expect(shouldOfferRestore({ content: { body: 'newer text' }, editedAt: 2_000, savedAt: null }, server)).toBe(true);
    expect(shouldOfferRestore({ content: { body: 'newer text' }, editedAt: 2_000, savedAt: 1_500 }, server)).toBe(true);
  });

  it('does not offer what the server already has, what was confirmed, or what is older', () => {
    expect(shouldOfferRestore(null, server)).toBe(false);
    expect(shouldOfferRestore({ content: { body: 'saved text' }, editedAt: 2_000, savedAt: null }, server)).toBe(false);
    expect(shouldOfferRestore({ content: { body: 'other' }, editedAt: 2_000, savedAt: 2_000 }, server)).toBe(false);
    expect(shouldOfferRestore({ content: { body: 'other' }, editedAt: 500, savedAt: null }, server)).toBe(false);
  });

  it('offers a new guide typed before it ever reached the server', () => {
    expect(shouldOfferRestore({ content: { title: 'Oval on carpet' }, editedAt: 5, savedAt: null }, { content: { title: '' }, updatedAt: null })).toBe(true);
  });
});

describe('save status', () => {
  it('treats an unreachable server as offline and a rejected field as kept locally', () => {
    expect(statusForError({ status: 0, code: 'network_error', message: 'x' })).toEqual({ kind: 'offline' });
    expect(statusForError({ status: 503, code: 'db_unavailable' })).toEqual({ kind: 'offline' });
    expect(statusForError({ status: 400, code: 'validation_failed', message: 'Title too short' })).toEqual({
      kind: 'local',
      message: 'Kept in this browser: Title too short',
    });
    // The field's own reason wins over the summary line.
    expect(
      statusForError({
        status: 400,
        code: 'validation_failed',
        message: 'Some fields need attention',
        fieldErrors: { title: 'Keep the title to 140 characters' },
      }),
    ).toEqual({ kind: 'local', message: 'Kept in this browser: Keep the title to 140 characters' });
    expect(statusForError({ status: 409, code: 'immutable_revision', message: 'A published revision never changes' })).toEqual({
      kind: 'error',
      message: 'A published revision never changes',
    });
  });

  it('reads as the status line shows it', () => {
    expect(describeStatus({ kind: 'saved', at: 0 }, () => '10:42')).toBe('Saved 10:42');
    expect(describeStatus({ kind: 'saving' })).toBe('Saving…');
    expect(describeStatus({ kind: 'offline' })).toBe('Offline — not saved to the server yet, kept in this browser');
    expect(isUnsavedStatus({ kind: 'offline' })).toBe(true);
    expect(isUnsavedStatus({ kind: 'saved', at: 1 })).toBe(false);
  });
});
