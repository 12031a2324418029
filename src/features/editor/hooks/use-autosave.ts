import { useCallback, useEffect, useRef, useState } from 'react';
import { clearLocalDraft, readLocalDraft, sameContent, statusForError, writeLocalDraft, type SaveStatus } from '../lib/autosave';

type Options<C> = {
  /** localStorage key of this draft; when it changes the browser copy moves with it. */
  storageKey: string;
  content: C;
  /** The content the server already holds (nothing to save while they match). */
  savedContent: C | null;
  /** When the server last saved `savedContent` (an ISO date), for the status of a draft just opened. */
  savedAt?: string | null;
  /**
   * The server's text the editor opened with (the draft, or the live version an edit starts from). Only a
   * difference from it is an edit. It comes from the server, not from the field, so a change typed before
   * this hook first ran can never be taken for the starting point.
   */
  startingContent: C;
  /** Sends the content to the server; throw to report failure. */
  save: (content: C) => Promise<void>;
  /** False while the content cannot be sent yet (e.g. a new guide without a title); it is still kept locally. */
  canSave?: boolean;
  /** Why canSave is false, shown in the status. */
  cannotSaveReason?: string;
  delayMs?: number;
  retryMs?: number;
};

const storage = () => (typeof window === 'undefined' ? null : window.localStorage);

/**
 * Keeps a draft safe: every change goes to localStorage at once, and to the server a few seconds after
 * typing stops. A failed save keeps the browser copy and retries when the connection returns.
 */
export function useAutosave<C>({
  storageKey,
  content,
  savedContent,
  savedAt,
  startingContent,
  save,
  canSave = true,
  cannotSaveReason,
  delayMs = 2500,
  retryMs = 10_000,
}: Options<C>) {
  // A draft the server holds is saved (the effect below says "unsaved changes" as soon as the text differs):
  // never "no changes yet" on a draft with content, even when the field's normalised form differs from the stored one.
  const [status, setStatus] = useState<SaveStatus>(() =>
    savedContent !== null ? { kind: 'saved', at: savedAt ? Date.parse(savedAt) : Date.now() } : { kind: 'idle' },
  );
  const latest = useRef(content);
  latest.current = content;
  const lastSaved = useRef<C | null>(savedContent);
  const saveRef = useRef(save);
  saveRef.current = save;
  const canSaveRef = useRef(canSave);
  canSaveRef.current = canSave;
  const inFlight = useRef<Promise<void> | null>(null);
  const keyRef = useRef(storageKey);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const editedAt = useRef<number>(Date.now());

  // Moving from "new" to a real revision id: carry the browser copy over and drop the old key.
  useEffect(() => {
    const s = storage();
    if (s && keyRef.current !== storageKey) {
      const old = readLocalDraft<C>(s, keyRef.current);
      if (old) writeLocalDraft(s, storageKey, old);
      clearLocalDraft(s, keyRef.current);
    }
    keyRef.current = storageKey;
  }, [storageKey]);

  const run = useCallback(async (): Promise<boolean> => {
    if (inFlight.current) await inFlight.current;
    const c = latest.current;
    if (lastSaved.current !== null && sameContent(c, lastSaved.current)) return true;
    if (!canSaveRef.current) return false;
    setStatus({ kind: 'saving' });
    let ok = false;
    const attempt = (async () => {
      try {
        await saveRef.current(c);
        ok = true;
        lastSaved.current = c;
        const s = storage();
        if (s) writeLocalDraft(s, keyRef.current, { content: c, editedAt: editedAt.current, savedAt: Date.now() });
        setStatus(sameContent(latest.current, c) ? { kind: 'saved', at: Date.now() } : { kind: 'pending' });
      } catch (err) {
        setStatus(statusForError(err as { status?: number; code?: string; message?: string }));
      }
    })();
    inFlight.current = attempt;
    await attempt;
    inFlight.current = null;
    return ok && sameContent(latest.current, c);
  }, []);

  const serialized = JSON.stringify(content);
  const starting = useRef(startingContent);
  starting.current = startingContent;
  const touched = useRef(false);
  useEffect(() => {
    // The server's text the editor opened with is not an edit; nothing to keep or send until it changes.
    if (!touched.current && sameContent(latest.current, starting.current)) return;
    touched.current = true;
    if (lastSaved.current !== null && sameContent(latest.current, lastSaved.current)) return;
    editedAt.current = Date.now();
    const s = storage();
    if (s) {
      const prev = readLocalDraft<C>(s, keyRef.current);
      const stored = writeLocalDraft(s, keyRef.current, { content: latest.current, editedAt: editedAt.current, savedAt: prev?.savedAt ?? null });
      if (!stored && !canSaveRef.current) setStatus({ kind: 'error', message: 'This browser would not keep a copy; save soon.' });
    }
    if (!canSaveRef.current) {
      setStatus({ kind: 'local', message: cannotSaveReason ?? 'Kept in this browser' });
      return;
    }
    // Still offline: keep saying so (the next try is scheduled anyway) rather than a calmer "unsaved changes".
    setStatus((prev) => (prev.kind === 'offline' ? prev : { kind: 'pending' }));
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void run(), delayMs);
    return () => {
      if (timer.current) clearTimeout(timer.current);
    };
    // `serialized` stands for the content; the rest are stable refs.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [serialized, canSave, delayMs, run]);

  // Offline: try again when the browser says the network is back, and every few seconds meanwhile.
  useEffect(() => {
    if (status.kind !== 'offline') return;
    const retry = () => void run();
    window.addEventListener('online', retry);
    const t = setInterval(retry, retryMs);
    return () => {
      window.removeEventListener('online', retry);
      clearInterval(t);
    };
  }, [status.kind, run, retryMs]);

  /** Saves now (before submitting); resolves true when the server holds the latest content. */
  const flush = useCallback(async () => {
    if (timer.current) clearTimeout(timer.current);
    return run();
  }, [run]);

  /** Tells the hook the server now holds `c` (after a merge or a restore), without sending it again. */
  const markSaved = useCallback((c: C) => {
    lastSaved.current = c;
    const s = storage();
    if (s) writeLocalDraft(s, keyRef.current, { content: c, editedAt: Date.now(), savedAt: Date.now() });
    setStatus({ kind: 'saved', at: Date.now() });
  }, []);

  return { status, flush, markSaved };
}
