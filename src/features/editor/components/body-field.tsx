import { lazy, Suspense, useId, type ReactNode } from 'react';
import { imageFiles, ImageTools, useImageInsert } from './image-tools';

const MarkdownEditor = lazy(() => import('./markdown-editor'));

/** The body field: a plain textarea until the Markdown editor's chunk arrives, then the editor. */
export function BodyField({
  value,
  onChange,
  error,
  renderWorkedExample,
  revisionId = null,
}: {
  /** The saved draft images are uploaded into (none yet: images wait until the draft exists). */
  revisionId?: string | null;
  value: string;
  onChange: (v: string) => void;
  error?: string;
  renderWorkedExample?: (body: string, index: number) => ReactNode;
}) {
  const id = useId();
  const hintId = `${id}-hint`;
  const images = useImageInsert({ revisionId, body: value, textareaId: id, onChange });
  const takeFiles = (e: React.ClipboardEvent | React.DragEvent, data: DataTransfer | null) => {
    const files = imageFiles(data);
    if (!files.length) return;
    e.preventDefault();
    void images.handleFiles(files);
  };
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        Body
      </label>
      <p id={hintId} className="text-xs text-ink-muted">
        Markdown. A worked example is a fenced block with the info string <code>worked-example</code>: a <code>calc:</code> line naming the calculator, then its
        inputs, one per line.
      </p>
      <div onPasteCapture={(e) => takeFiles(e, e.clipboardData)} onDropCapture={(e) => takeFiles(e, e.dataTransfer)} onDragOver={(e) => e.preventDefault()}>
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
      </div>
      <ImageTools revisionId={revisionId} body={value} progress={images.progress} onFiles={(f) => void images.handleFiles(f)} onChange={onChange} />
      {error && (
        <p role="alert" className="text-sm text-danger">
          {error}
        </p>
      )}
    </div>
  );
}
