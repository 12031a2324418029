import { lazy, Suspense, useId, type ReactNode } from 'react';

const MarkdownEditor = lazy(() => import('./markdown-editor'));

/** The body field: a plain textarea until the Markdown editor's chunk arrives, then the editor. */
export function BodyField({
  value,
  onChange,
  error,
  renderWorkedExample,
}: {
  value: string;
  onChange: (v: string) => void;
  error?: string;
  renderWorkedExample?: (body: string, index: number) => ReactNode;
}) {
  const id = useId();
  const hintId = `${id}-hint`;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        Body
      </label>
      <p id={hintId} className="text-xs text-ink-muted">
        Markdown. A worked example is a fenced block with the info string <code>worked-example</code>: a <code>calc:</code> line naming the calculator, then its
        inputs, one per line.
      </p>
      <Suspense
        fallback={
          <textarea
            id={id}
            aria-describedby={hintId}
            className="min-h-[520px] w-full rounded-md border border-ink/25 bg-white/80 p-3 font-mono text-sm"
            value={value}
            onChange={(e) => onChange(e.target.value)}
          />
        }
      >
        <MarkdownEditor id={id} value={value} onChange={onChange} renderWorkedExample={renderWorkedExample} describedBy={hintId} />
      </Suspense>
      {error && (
        <p role="alert" className="text-sm text-danger">
          {error}
        </p>
      )}
    </div>
  );
}
