import { useId, useState } from 'react';
import type { BodyDiffDetail } from '@shared/schemas/revision';

/** One run of a word diff as the API sends it (the `diff` package's change objects). */
export type WordChange = { value: string; added?: boolean; removed?: boolean; count?: number };

/** One changed metadata field between two revisions. */
export type FieldChange = { field: string; label?: string; from: unknown; to: unknown };

export type DiffLayout = 'inline' | 'side-by-side';

function Added({ text }: { text: string }) {
  return (
    <ins className="rounded-sm bg-ok-wash text-ok no-underline decoration-ok/60 [text-decoration-line:underline]">
      <span className="sr-only">[added: </span>
      {text}
      <span className="sr-only">]</span>
    </ins>
  );
}

function Removed({ text }: { text: string }) {
  return (
    <del className="rounded-sm bg-danger-wash text-danger decoration-danger/70">
      <span className="sr-only">[removed: </span>
      {text}
      <span className="sr-only">]</span>
    </del>
  );
}

/** Counts words added and removed, for the summary line above a diff. */
export function countChangedWords(changes: WordChange[]) {
  let added = 0;
  let removed = 0;
  for (const c of changes) {
    const words = c.value.split(/\s+/).filter(Boolean).length;
    if (c.added) added += words;
    else if (c.removed) removed += words;
  }
  return { added, removed };
}

function InlineDiff({ changes }: { changes: WordChange[] }) {
  return (
    <div className="font-serif text-[0.98rem] leading-8 whitespace-pre-wrap text-ink">
      {changes.map((c, i) => (c.added ? <Added key={i} text={c.value} /> : c.removed ? <Removed key={i} text={c.value} /> : <span key={i}>{c.value}</span>))}
    </div>
  );
}

function SideBySideDiff({ changes, fromLabel, toLabel }: { changes: WordChange[]; fromLabel: string; toLabel: string }) {
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <section aria-label={fromLabel} className="min-w-0 rounded-md border border-paper-line bg-paper-card p-4">
        <h4 className="mb-2 font-sans text-xs font-semibold tracking-wider text-ink-muted uppercase">{fromLabel}</h4>
        <div className="font-serif text-[0.95rem] leading-7 break-words whitespace-pre-wrap">
          {changes.map((c, i) => (c.added ? null : c.removed ? <Removed key={i} text={c.value} /> : <span key={i}>{c.value}</span>))}
        </div>
      </section>
      <section aria-label={toLabel} className="min-w-0 rounded-md border border-paper-line bg-paper-card p-4">
        <h4 className="mb-2 font-sans text-xs font-semibold tracking-wider text-ink-muted uppercase">{toLabel}</h4>
        <div className="font-serif text-[0.95rem] leading-7 break-words whitespace-pre-wrap">
          {changes.map((c, i) => (c.removed ? null : c.added ? <Added key={i} text={c.value} /> : <span key={i}>{c.value}</span>))}
        </div>
      </section>
    </div>
  );
}

const COARSE_NOTE: Record<Exclude<BodyDiffDetail, 'words'>, string> = {
  sentences: 'Some passages differ too much to compare word by word; they are compared sentence by sentence.',
  lines: 'Some passages differ too much to compare word by word; they are shown as whole lines removed and added.',
  whole: 'The two texts have almost nothing in common, so they are shown whole: the old text removed and the new one added.',
};

/**
 * A word-level diff of prose, inline or side by side. Pure rendering of the server's diff:
 * it pulls in no diff library, so reader pages stay small.
 */
export function WordDiffView({
  changes,
  fromLabel,
  toLabel,
  initialLayout = 'inline',
  detail = 'words',
}: {
  changes: WordChange[];
  fromLabel: string;
  toLabel: string;
  initialLayout?: DiffLayout;
  /** How finely the server could compare the texts (long, very different texts are compared more coarsely). */
  detail?: BodyDiffDetail;
}) {
  const [layout, setLayout] = useState<DiffLayout>(initialLayout);
  const groupId = useId();
  const { added, removed } = countChangedWords(changes);
  const unchanged = changes.every((c) => !c.added && !c.removed);
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-sm text-ink-soft" id={`${groupId}-summary`}>
          {unchanged ? (
            'The text is the same in both versions.'
          ) : (
            <>
              <span className="font-medium text-ok">{added} words added</span> · <span className="font-medium text-danger">{removed} words removed</span>
            </>
          )}
        </p>
        <div role="group" aria-label="Diff layout" className="inline-flex overflow-hidden rounded-md border border-ink/25 text-sm">
          {(['inline', 'side-by-side'] as const).map((l) => (
            <button
              key={l}
              type="button"
              aria-pressed={layout === l}
              onClick={() => setLayout(l)}
              className={`px-3 py-1.5 font-medium ${layout === l ? 'bg-ink text-paper' : 'bg-paper-card text-ink hover:bg-paper-deep'}`}
            >
              {l === 'inline' ? 'Inline' : 'Side by side'}
            </button>
          ))}
        </div>
      </div>
      {detail !== 'words' && (
        <p role="note" className="rounded-md border border-caution-line bg-caution-wash px-3 py-2 text-sm">
          {COARSE_NOTE[detail]}
        </p>
      )}
      {layout === 'inline' ? (
        <div className="rounded-md border border-paper-line bg-paper-card p-4">
          <InlineDiff changes={changes} />
        </div>
      ) : (
        <SideBySideDiff changes={changes} fromLabel={fromLabel} toLabel={toLabel} />
      )}
    </div>
  );
}

function show(value: unknown): string {
  if (value === null || value === undefined || value === '') return '—';
  if (Array.isArray(value)) return value.length ? value.map(show).join(', ') : '—';
  if (typeof value === 'object')
    return Object.entries(value as Record<string, unknown>)
      .map(([k, v]) => `${k}: ${show(v)}`)
      .join(', ');
  return String(value);
}

/** The names readers see for a document's fields, in every diff and merge view. */
export const FIELD_LABELS: Record<string, string> = {
  title: 'Title',
  summary: 'Summary',
  class: 'Class',
  surface: 'Surface',
  conditions: 'Conditions',
  tags: 'Tags',
  parameters: 'Settings discussed',
  name: 'Name',
  aliases: 'Also called',
  category: 'Category',
  unit: 'Unit',
  range: 'Typical range',
  related: 'Related settings',
  calculator: 'Calculator',
};

/** The metadata fields that differ between two revisions, as a calm table. */
export function FieldChangesTable({
  changes,
  fromLabel,
  toLabel,
  caption = 'Changed details',
}: {
  changes: FieldChange[];
  fromLabel: string;
  toLabel: string;
  caption?: string;
}) {
  if (changes.length === 0) return <p className="text-sm text-ink-soft">No details changed besides the text.</p>;
  return (
    <div className="table-scroll">
      <table className="w-full border-collapse text-sm">
        <caption className="mb-2 text-left text-sm font-semibold text-ink">{caption}</caption>
        <thead>
          <tr className="border-b-2 border-ink/30 bg-paper-deep text-left">
            <th scope="col" className="px-3 py-2 font-semibold">
              Field
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              {fromLabel}
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              {toLabel}
            </th>
          </tr>
        </thead>
        <tbody>
          {changes.map((c) => (
            <tr key={c.field} className="border-b border-paper-line align-top">
              <th scope="row" className="px-3 py-2 text-left font-medium">
                {c.label ?? FIELD_LABELS[c.field] ?? c.field}
              </th>
              <td className="px-3 py-2 text-danger">{show(c.from)}</td>
              <td className="px-3 py-2 text-ok">{show(c.to)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
