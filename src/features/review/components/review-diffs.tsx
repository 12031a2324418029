import { useState } from 'react';
import { diffArrays, diffWords } from 'diff';
import type { ReactNode } from 'react';
import { classLabel, showValue, surfaceLabel } from '@shared/setup/show-value';
import { labelForSlug, type SetupLeafValue } from '@shared/setup/fields';
import type { BodyDiffDetail } from '@shared/schemas/revision';
import { FIELD_LABELS, WordDiffView, type FieldChange, type WordChange } from '@/components/diff/word-diff-view';
import { Markdown } from '@/lib/markdown';
import type { SetupChange } from '../api/reviews';

/** A metadata value in words: classes and surfaces by their labels, setting slugs by name, lists joined. */
function fieldText(field: string, v: unknown): string {
  if (v === null || v === undefined || v === '') return '';
  if (field === 'class') return classLabel(String(v));
  if (field === 'surface') return surfaceLabel(String(v));
  if (Array.isArray(v)) return v.map((x) => (field === 'parameters' || field === 'related' ? labelForSlug(String(x)) : String(x))).join(', ');
  if (field === 'range' && typeof v === 'object') {
    const r = v as { min?: number; max?: number; step?: number };
    return `${r.min}–${r.max}, step ${r.step}`;
  }
  return typeof v === 'object' ? JSON.stringify(v) : String(v);
}

function Words({ parts }: { parts: WordChange[] }) {
  return (
    <>
      {parts.map((p, i) =>
        p.added ? (
          <ins key={i} className="rounded-sm bg-ok-wash text-ok">
            <span className="sr-only">[added: </span>
            {p.value}
            <span className="sr-only">]</span>
          </ins>
        ) : p.removed ? (
          <del key={i} className="rounded-sm bg-danger-wash text-danger">
            <span className="sr-only">[removed: </span>
            {p.value}
            <span className="sr-only">]</span>
          </del>
        ) : (
          <span key={i}>{p.value}</span>
        ),
      )}
    </>
  );
}

/** Changed metadata by its labels, with the changed words highlighted inside each field. */
export function MetadataChanges({ changes }: { changes: FieldChange[] }) {
  if (changes.length === 0) return <p className="text-sm text-ink-soft">No details changed besides the text.</p>;
  return (
    <dl className="flex flex-col gap-3" data-testid="metadata-changes">
      {changes.map((c) => {
        const from = fieldText(c.field, c.from);
        const to = fieldText(c.field, c.to);
        return (
          <div key={c.field} className="rounded-md border border-paper-line bg-paper-card px-3 py-2">
            <dt className="text-xs font-semibold tracking-wide text-ink-muted uppercase">{c.label ?? FIELD_LABELS[c.field] ?? c.field}</dt>
            <dd className="mt-1 text-sm break-words">
              {from === '' ? (
                <Words parts={[{ value: to, added: true }]} />
              ) : to === '' ? (
                <Words parts={[{ value: from, removed: true }]} />
              ) : (
                <Words parts={diffWords(from, to)} />
              )}
            </dd>
          </div>
        );
      })}
    </dl>
  );
}

/**
 * Markdown blocks: paragraphs, headings, list runs, tables and fenced blocks, each whole, so a
 * changed block can be drawn as readers will see it.
 */
export function markdownBlocks(body: string): string[] {
  const blocks: string[] = [];
  let current: string[] = [];
  let fence: string | null = null;
  const flush = () => {
    if (current.length) blocks.push(current.join('\n'));
    current = [];
  };
  for (const line of body.replace(/\r\n?/g, '\n').split('\n')) {
    if (fence) {
      current.push(line);
      if (line.trim().startsWith(fence)) {
        fence = null;
        flush();
      }
      continue;
    }
    const open = /^\s*(```+|~~~+)/.exec(line);
    if (open) {
      flush();
      fence = open[1];
      current.push(line);
      continue;
    }
    if (line.trim() === '') flush();
    else if (/^#{1,6}\s/.test(line)) {
      flush();
      blocks.push(line);
    } else current.push(line);
  }
  flush();
  return blocks;
}

type Block = { text: string; kind: 'same' | 'added' | 'removed' };

/** The body change as readers will see it: changed blocks drawn (headings, lists, tables), unchanged ones folded. */
function RenderedBodyDiff({ from, to, renderWorkedExample }: { from: string; to: string; renderWorkedExample?: (body: string, index: number) => ReactNode }) {
  const blocks: Block[] = diffArrays(markdownBlocks(from), markdownBlocks(to)).flatMap((part) =>
    part.value.map((text): Block => ({ text, kind: part.added ? 'added' : part.removed ? 'removed' : 'same' })),
  );
  if (!blocks.some((b) => b.kind !== 'same')) return <p className="text-sm text-ink-soft">The text is unchanged.</p>;
  const out: ReactNode[] = [];
  let folded = 0;
  const fold = (key: string) => {
    if (folded)
      out.push(
        <p key={key} className="my-2 text-xs text-ink-muted">
          … {folded} unchanged {folded === 1 ? 'block' : 'blocks'} …
        </p>,
      );
    folded = 0;
  };
  blocks.forEach((b, i) => {
    if (b.kind === 'same') {
      folded++;
      return;
    }
    fold(`fold-${i}`);
    out.push(
      <div
        key={i}
        data-diff={b.kind}
        className={`my-2 border-l-4 pl-3 ${b.kind === 'added' ? 'border-ok bg-ok-wash/40' : 'border-danger bg-danger-wash/40 line-through decoration-danger/50'}`}
      >
        <p className={`text-[0.65rem] font-semibold tracking-wider uppercase no-underline ${b.kind === 'added' ? 'text-ok' : 'text-danger'}`}>
          {b.kind === 'added' ? 'Added' : 'Removed'}
        </p>
        <Markdown renderWorkedExample={b.kind === 'added' ? renderWorkedExample : undefined}>{b.text}</Markdown>
      </div>,
    );
  });
  fold('fold-end');
  return <div data-testid="rendered-body-diff">{out}</div>;
}

/** The body diff, drawn as readers will see it or as raw Markdown word by word. */
export function BodyDiff(props: {
  from: string;
  to: string;
  changes: WordChange[];
  detail: BodyDiffDetail;
  fromLabel: string;
  toLabel: string;
  renderWorkedExample?: (body: string, index: number) => ReactNode;
}) {
  const [raw, setRaw] = useState(false);
  return (
    <div className="flex flex-col gap-3">
      <div role="group" aria-label="Show the text change" className="flex gap-1 text-sm">
        <button type="button" aria-pressed={!raw} onClick={() => setRaw(false)} className={`rounded px-2 py-1 ${!raw ? 'bg-ink text-paper' : 'bg-paper-deep'}`}>
          As readers see it
        </button>
        <button type="button" aria-pressed={raw} onClick={() => setRaw(true)} className={`rounded px-2 py-1 ${raw ? 'bg-ink text-paper' : 'bg-paper-deep'}`}>
          Raw Markdown
        </button>
      </div>
      {raw ? (
        <WordDiffView changes={props.changes} detail={props.detail} fromLabel={props.fromLabel} toLabel={props.toLabel} />
      ) : (
        <RenderedBodyDiff from={props.from} to={props.to} renderWorkedExample={props.renderWorkedExample} />
      )}
    </div>
  );
}

/** A baseline value as a reader sees it: choices by name, units written out. */
export function setupValueText(c: SetupChange, v: unknown): string {
  if (v === null || v === undefined || v === '') return '—';
  if (typeof v === 'object') return JSON.stringify(v);
  return showValue(c.path, v as SetupLeafValue, c.unit);
}
