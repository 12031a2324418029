import { lazy, Suspense, useId, useRef, useState, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { imageFiles, ImageTools, useImageInsert } from './image-tools';
import { MarkdownHelp } from './markdown-help';

const MarkdownEditor = lazy(() => import('./markdown-editor'));
const InsertExampleDialog = lazy(() => import('./insert-example-dialog').then((m) => ({ default: m.InsertExampleDialog })));

/** Puts a block at a position, on lines of its own. */
export function insertBlock(text: string, at: number, block: string): string {
  const pos = Math.max(0, Math.min(at, text.length));
  const before = text.slice(0, pos);
  const after = text.slice(pos);
  const lead = before === '' || before.endsWith('\n\n') ? '' : before.endsWith('\n') ? '\n' : '\n\n';
  const trail = after === '' || after.startsWith('\n') ? '' : '\n';
  return `${before}${lead}${block}${trail}${after}`;
}

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
  const [exampleAt, setExampleAt] = useState<number | null>(null);
  const [helpOpen, setHelpOpen] = useState(false);
  // The latest text, so a block inserted after the form closes goes into what is there now.
  const latest = useRef(value);
  latest.current = value;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        Body
      </label>
      <p id={hintId} className="text-xs text-ink-muted">
        Markdown: headings, emphasis, lists, links, tables, cautions and worked examples (live calculator cards).{' '}
        <Button type="button" variant="ghost" size="sm" className="inline px-1 py-0 align-baseline" onClick={() => setHelpOpen(true)}>
          How to write them
        </Button>
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
          <MarkdownEditor
            id={id}
            value={value}
            onChange={onChange}
            renderWorkedExample={renderWorkedExample}
            describedBy={hintId}
            onInsertExample={(at) => setExampleAt(at)}
            onHelp={() => setHelpOpen(true)}
          />
        </Suspense>
      </div>
      <ImageTools revisionId={revisionId} body={value} progress={images.progress} onFiles={(f) => void images.handleFiles(f)} onChange={onChange} />
      {exampleAt !== null && (
        <Suspense fallback={null}>
          <InsertExampleDialog
            open
            onClose={() => setExampleAt(null)}
            onInsert={(block) => {
              onChange(insertBlock(latest.current, exampleAt, block));
              setExampleAt(null);
            }}
          />
        </Suspense>
      )}
      <MarkdownHelp open={helpOpen} onClose={() => setHelpOpen(false)} />
      {error && (
        <p role="alert" className="text-sm text-danger">
          {error}
        </p>
      )}
    </div>
  );
}
