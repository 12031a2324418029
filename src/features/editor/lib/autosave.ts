/**
 * Pure pieces of draft autosaving: the copy kept in the browser between server saves, when to offer
 * it back, and how the save status reads. Kept free of React so it can be unit-tested.
 */

/** What the browser keeps for one draft. `savedAt` is when the server last confirmed this content. */
export type LocalDraft<C> = { content: C; editedAt: number; savedAt: number | null };

/** Where a draft lives in localStorage: per revision once it exists, per document (or "new") before. */
export function localDraftKey(scope: { revisionId?: string | null; kind: string; slug?: string | null }) {
  if (scope.revisionId) return `tw:draft:${scope.revisionId}`;
  return `tw:draft:${scope.kind}:${scope.slug ?? 'new'}`;
}

type StorageLike = Pick<Storage, 'getItem' | 'setItem' | 'removeItem'>;

export function readLocalDraft<C>(storage: StorageLike, key: string): LocalDraft<C> | null {
  try {
    const raw = storage.getItem(key);
    if (!raw) return null;
    const parsed = JSON.parse(raw) as LocalDraft<C>;
    if (!parsed || typeof parsed !== 'object' || !('content' in parsed) || typeof parsed.editedAt !== 'number') return null;
    return parsed;
  } catch {
    return null; // a corrupt entry is ignored rather than breaking the editor
  }
}

/** Writes the draft; returns false when the browser refuses (quota, private mode). */
export function writeLocalDraft<C>(storage: StorageLike, key: string, draft: LocalDraft<C>): boolean {
  try {
    storage.setItem(key, JSON.stringify(draft));
    return true;
  } catch {
    return false;
  }
}

export function clearLocalDraft(storage: StorageLike, key: string) {
  try {
    storage.removeItem(key);
  } catch {
    /* nothing to clear */
  }
}

/** Key order does not matter when deciding whether two contents are the same. */
export function sameContent(a: unknown, b: unknown): boolean {
  return stableJson(a) === stableJson(b);
}

function stableJson(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(stableJson).join(',')}]`;
  if (v && typeof v === 'object') {
    return `{${Object.keys(v as Record<string, unknown>)
      .sort()
      .filter((k) => (v as Record<string, unknown>)[k] !== undefined)
      .map((k) => `${JSON.stringify(k)}:${stableJson((v as Record<string, unknown>)[k])}`)
      .join(',')}}`;
  }
  return JSON.stringify(v ?? null);
}

/**
 * True when the browser holds text for this draft that the server does not have: edited after the
 * last confirmed save, edited after the server's copy was last written, and actually different.
 */
export function shouldOfferRestore<C>(local: LocalDraft<C> | null, server: { content: C; updatedAt?: string | null }): boolean {
  if (!local) return false;
  if (sameContent(local.content, server.content)) return false;
  const unsaved = local.savedAt === null || local.editedAt > local.savedAt;
  if (!unsaved) return false;
  const serverTime = server.updatedAt ? Date.parse(server.updatedAt) : 0;
  return local.editedAt > serverTime;
}

/** Where the draft stands, as the status line shows it. */
export type SaveStatus =
  | { kind: 'idle' }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'saved'; at: number }
  | { kind: 'offline' }
  | { kind: 'local'; message: string }
  | { kind: 'error'; message: string };

/** How a failed save should be reported: unreachable server → offline (retry later); otherwise the server's reason. */
export function statusForError(err: { status?: number; code?: string; message?: string; fieldErrors?: Record<string, string> } | null | undefined): SaveStatus {
  if (!err) return { kind: 'error', message: 'Not saved.' };
  if (err.status === 0 || err.code === 'network_error' || (err.status !== undefined && err.status >= 502 && err.status <= 504)) return { kind: 'offline' };
  if (err.code === 'validation_failed') {
    // The field's own reason ("Keep the title to 140 characters") says more than the summary line.
    const fields = Object.values(err.fieldErrors ?? {});
    return { kind: 'local', message: `Kept in this browser: ${fields.length ? fields.join('; ') : (err.message ?? 'some fields are not valid yet')}` };
  }
  return { kind: 'error', message: err.message ?? 'Not saved.' };
}

/** Whether a status means the latest text is only in the browser. */
export function isUnsavedStatus(s: SaveStatus) {
  return s.kind === 'pending' || s.kind === 'saving' || s.kind === 'offline' || s.kind === 'local' || s.kind === 'error';
}

const clock = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit' });

/** "Saved 10:42", "Saving…", "Offline — not saved to the server yet, kept in this browser". */
export function describeStatus(s: SaveStatus, format: (t: number) => string = (t) => clock.format(new Date(t))): string {
  switch (s.kind) {
    case 'idle':
      return 'No changes yet';
    case 'pending':
      return 'Unsaved changes — kept in this browser';
    case 'saving':
      return 'Saving…';
    case 'saved':
      return `Saved ${format(s.at)}`;
    case 'offline':
      return 'Offline — not saved to the server yet, kept in this browser';
    case 'local':
    case 'error':
      return s.message;
  }
}
