import { useEffect, useRef, useState } from 'react';
import { FieldChangesTable, WordDiffView } from '@/components/diff/word-diff-view';
import { Button } from '@/components/ui/button';
import { Card, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { patchRevision, useRebaseRevision, type RebaseResult } from '../api/revisions';
import { aroundChanges, handEditStart, resolveBody, resolveFields, type ConflictChoice, type ConflictRegion, type WordPart } from '../lib/merge';
import { writeLocalDraft } from '../lib/autosave';
import { FIELD_LABELS } from '@/components/diff/word-diff-view';

function show(v: unknown) {
  if (Array.isArray(v)) return v.join(', ') || '—';
  if (v && typeof v === 'object') return JSON.stringify(v);
  return v === null || v === undefined || v === '' ? '—' : String(v);
}

/**
 * One side of a conflict (or the merged text). With `words` (live → draft) the words only this side
 * has are marked, so a one-number difference inside a long paragraph is found at a glance.
 */
function Lines({ lines, tone, words, label }: { lines: string[]; tone?: 'theirs' | 'ours'; words?: WordPart[]; label: string }) {
  const cls =
    tone === 'theirs'
      ? 'border-ink/30 bg-paper-card'
      : tone === 'ours'
        ? 'border-copper/50 bg-copper-wash/40'
        : 'border-paper-line bg-paper-deep/60 text-ink-soft';
  const mine = tone === 'theirs' ? (w: WordPart) => !!w.removed : (w: WordPart) => !!w.added;
  const other = tone === 'theirs' ? (w: WordPart) => !!w.added : (w: WordPart) => !!w.removed;
  const marked = words && tone && lines.length > 0 && words.some((w) => w.added || w.removed);
  return (
    // Focusable and named: a long passage scrolls inside its box, and keyboard users must be able to scroll it too.
    <pre
      tabIndex={0}
      role="region"
      aria-label={label}
      className={`max-h-72 overflow-auto rounded-md border p-3 font-mono text-[0.8rem] leading-6 whitespace-pre-wrap ${cls}`}
    >
      {!lines.length
        ? '(nothing — removed on this side)'
        : marked
          ? words
              .filter((w) => !other(w))
              .map((w, i) =>
                mine(w) ? (
                  <mark key={i} className={`rounded-sm px-0.5 font-semibold text-ink ${tone === 'theirs' ? 'bg-ink/15' : 'bg-copper/30'}`}>
                    {w.value}
                  </mark>
                ) : (
                  <span key={i}>{w.value}</span>
                ),
              )
          : lines.join('\n')}
    </pre>
  );
}

function Hunk({
  region,
  number,
  liveNumber,
  choice,
  onChoose,
}: {
  region: ConflictRegion;
  number: number;
  liveNumber: number;
  choice?: ConflictChoice;
  onChoose: (c: ConflictChoice) => void;
}) {
  const picked = choice?.pick;
  return (
    <section aria-label={`Overlapping change ${number}`} className="flex flex-col gap-3 rounded-lg border-2 border-caution-line bg-caution-wash/40 p-4">
      <h4 className="text-sm font-semibold">
        Overlapping change {number}{' '}
        {picked ? (
          <span className="font-normal text-ok">— {picked === 'theirs' ? 'live text kept' : picked === 'ours' ? 'your text kept' : 'edited by hand'}</span>
        ) : (
          <span className="font-normal text-caution">— choose what to keep</span>
        )}
      </h4>
      {region.words?.some((w) => w.added || w.removed) && <p className="text-xs text-ink-soft">Marked: the words that differ between the two sides.</p>}
      <div className="grid gap-3 md:grid-cols-2">
        <div className="flex min-w-0 flex-col gap-2">
          <p className="text-xs font-semibold tracking-wider text-ink-muted uppercase">Live version {liveNumber} (theirs)</p>
          <Lines lines={region.theirs} tone="theirs" words={region.words} label={`Overlapping change ${number}, live version ${liveNumber}`} />
          <Button
            size="sm"
            variant={picked === 'theirs' ? 'primary' : 'secondary'}
            aria-pressed={picked === 'theirs'}
            onClick={() => onChoose({ pick: 'theirs' })}
          >
            Keep the live text
          </Button>
        </div>
        <div className="flex min-w-0 flex-col gap-2">
          <p className="text-xs font-semibold tracking-wider text-ink-muted uppercase">Your draft (yours)</p>
          <Lines lines={region.ours} tone="ours" words={region.words} label={`Overlapping change ${number}, your draft`} />
          <Button size="sm" variant={picked === 'ours' ? 'primary' : 'secondary'} aria-pressed={picked === 'ours'} onClick={() => onChoose({ pick: 'ours' })}>
            Keep my text
          </Button>
        </div>
      </div>
      {picked === 'custom' ? (
        <label className="flex flex-col gap-1 text-sm font-medium">
          Your combined text
          <textarea
            className="min-h-40 rounded-md border border-ink/25 bg-white/90 p-3 font-mono text-[0.8rem] leading-6"
            value={choice?.pick === 'custom' ? choice.text : ''}
            onChange={(e) => onChoose({ pick: 'custom', text: e.target.value })}
          />
        </label>
      ) : (
        <Button size="sm" variant="ghost" className="self-start" onClick={() => onChoose({ pick: 'custom', text: handEditStart(region) })}>
          Edit by hand (start from both)
        </Button>
      )}
    </section>
  );
}

/**
 * The three-way merge screen after the live revision moved on: clean changes are already merged,
 * each overlapping change is shown side by side to resolve. Saving replaces the draft's content and
 * moves its base to the live revision; until then the draft (and a browser copy) keep the author's text.
 */
export function MergeScreen({
  revisionId,
  kindLabel,
  yours,
  onSaved,
  onCancel,
}: {
  revisionId: string;
  kindLabel: string;
  yours: Record<string, unknown>;
  onSaved: (content: Record<string, unknown>, currentRevisionId: string) => void;
  onCancel: () => void;
}) {
  const rebase = useRebaseRevision();
  const [bodyChoices, setBodyChoices] = useState<Record<number, ConflictChoice>>({});
  const [fieldChoices, setFieldChoices] = useState<Record<string, 'theirs' | 'ours'>>({});
  const [saving, setSaving] = useState(false);
  const [error, setError] = useState<string>();
  const headingRef = useRef<HTMLHeadingElement>(null);

  useEffect(() => {
    // The author's text as it stood before merging, kept whatever happens next.
    writeLocalDraft(window.localStorage, `tw:premerge:${revisionId}`, { content: yours, editedAt: Date.now(), savedAt: null });
    rebase.mutate(revisionId);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [revisionId]);

  // The screen replaces the editor (the submit dialog just closed): take focus to its heading, so a
  // keyboard or screen-reader user starts reading from the top of the merge rather than from nowhere.
  useEffect(() => {
    if (rebase.isSuccess) headingRef.current?.focus();
  }, [rebase.isSuccess]);

  if (rebase.isPending || rebase.isIdle) return <Spinner label="Merging your draft with the live version…" />;
  if (rebase.isError)
    return (
      <Notice tone="danger" title="The merge could not be prepared">
        {rebase.error.message} Your draft is unchanged.{' '}
        <button type="button" className="underline" onClick={onCancel}>
          Back to the editor
        </button>
      </Notice>
    );
  const result: RebaseResult = rebase.data;
  const fieldConflicts = result.conflicts.filter((c) => c.field !== 'body');
  const hunks: ConflictRegion[] = result.bodyRegions.flatMap((r) => (r.kind === 'conflict' ? [r] : []));
  const body = resolveBody(result.bodyRegions, bodyChoices);
  const fields = resolveFields(result.merged, fieldConflicts, fieldChoices);
  const unresolved = body.unresolved + fields.unresolved;
  const overlaps = hunks.length + fieldConflicts.length;
  const incomingText = result.incoming.bodyDiff.some((w) => w.added || w.removed);
  const incomingFields = result.incoming.changedFields;

  const handleSave = async () => {
    setSaving(true);
    setError(undefined);
    const content = { ...fields.content, body: body.body };
    try {
      await patchRevision(revisionId, { ...(content as { body: string }), baseRevisionId: result.currentRevisionId });
      onSaved(content, result.currentRevisionId);
    } catch (err) {
      setError(`${(err as Error).message} Your draft is unchanged on the server; try again.`);
    } finally {
      setSaving(false);
    }
  };

  return (
    <div className="flex flex-col gap-6">
      <h2 ref={headingRef} tabIndex={-1} className="font-serif text-2xl font-bold outline-none">
        Merge your draft with the live {kindLabel}
      </h2>
      <Notice tone="caution" title={`The live ${kindLabel} moved on to version ${result.currentNumber} while you were writing`}>
        {overlaps === 0
          ? 'Your changes and the live version’s do not overlap, so they are merged: check the result below, save it, then submit again.'
          : 'Changes that do not overlap are merged already. Where you and the live version changed the same thing, choose what to keep, then save and submit again.'}{' '}
        Until you save, your draft keeps your own text, and a copy stays in this browser.
      </Notice>
      <section aria-labelledby="merge-incoming" className="flex flex-col gap-3">
        <h3 id="merge-incoming" className="text-base font-semibold">
          What the live version brings into your draft
        </h3>
        {incomingText || incomingFields.length > 0 ? (
          <>
            <p className="text-sm text-ink-soft">
              Where version {result.currentNumber} changed something you had not touched, its text is taken. Green is new; struck through is what it replaces in
              your draft.
            </p>
            {incomingFields.length > 0 && (
              <FieldChangesTable changes={incomingFields} fromLabel="Your draft" toLabel="After the merge" caption="Details taken from the live version" />
            )}
            {incomingText && <WordDiffView changes={aroundChanges(result.incoming.bodyDiff)} fromLabel="Your draft" toLabel="After the merge" />}
          </>
        ) : (
          <p className="text-sm text-ink-soft">Nothing merges by itself this time: each change in the live version overlaps one of yours (below).</p>
        )}
      </section>
      {fieldConflicts.length > 0 && (
        <Card className="p-4">
          <h3 className="mb-3 text-base font-semibold">Details changed on both sides</h3>
          <div className="flex flex-col gap-3">
            {fieldConflicts.map((c) => (
              <fieldset key={c.field} className="grid gap-2 rounded-md border border-caution-line p-3 sm:grid-cols-[10rem_1fr_1fr] sm:items-start">
                <legend className="sr-only">{FIELD_LABELS[c.field] ?? c.field}</legend>
                <p className="text-sm font-semibold" aria-hidden>
                  {FIELD_LABELS[c.field] ?? c.field}
                </p>
                {(['theirs', 'ours'] as const).map((side) => (
                  <label
                    key={side}
                    className={`flex cursor-pointer gap-2 rounded-md border p-2 text-sm ${fieldChoices[c.field] === side ? 'border-copper bg-copper-wash/50' : 'border-paper-line bg-paper-card'}`}
                  >
                    <input
                      type="radio"
                      name={`field-${c.field}`}
                      className="mt-1 accent-copper"
                      checked={fieldChoices[c.field] === side}
                      onChange={() => setFieldChoices((f) => ({ ...f, [c.field]: side }))}
                    />
                    <span>
                      <span className="block text-xs font-semibold text-ink-muted uppercase">
                        {side === 'theirs' ? `Live version ${result.currentNumber}` : 'Your draft'}
                      </span>
                      {show(side === 'theirs' ? c.theirs : c.ours)}
                    </span>
                  </label>
                ))}
              </fieldset>
            ))}
          </div>
        </Card>
      )}
      {hunks.length > 0 ? (
        <div className="flex flex-col gap-4">
          <h3 className="text-base font-semibold">Overlapping changes in the text ({hunks.length})</h3>
          {hunks.map((h, i) => (
            <Hunk
              key={h.hunk}
              region={h}
              number={i + 1}
              liveNumber={result.currentNumber}
              choice={bodyChoices[h.hunk]}
              onChoose={(c) => setBodyChoices((b) => ({ ...b, [h.hunk]: c }))}
            />
          ))}
        </div>
      ) : (
        fieldConflicts.length > 0 && <p className="text-sm text-ink-soft">The text merged without overlaps.</p>
      )}
      <details className="rounded-md border border-paper-line bg-paper-card p-3">
        <summary className="cursor-pointer text-sm font-semibold">The merged text as it will be saved</summary>
        <Lines lines={body.body.split('\n')} label="The merged text" />
      </details>
      {error && <Notice tone="danger">{error}</Notice>}
      <div className="flex flex-wrap items-center gap-3">
        <Button onClick={handleSave} pending={saving} disabled={unresolved > 0}>
          Save the merged draft
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Back to my draft unchanged
        </Button>
        {unresolved > 0 && <span className="text-sm text-caution">{unresolved} left to decide</span>}
      </div>
    </div>
  );
}
