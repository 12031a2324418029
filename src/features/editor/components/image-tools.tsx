import { useEffect, useId, useRef, useState } from 'react';
import { toast } from '@/lib/toast';
import { IMAGE_LIMITS, imageMarkdown, imageUrl, markdownImages } from '@shared/markdown/images';
import { ApiError } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { useUploadImage } from '../api/images';

const ACCEPT = 'image/jpeg,image/png,image/webp';

/** Images among dropped or pasted data (files only; pasted text is left to the editor). */
export const imageFiles = (data: DataTransfer | null) => [...(data?.files ?? [])].filter((f) => /^image\//.test(f.type));

/** Puts `insert` into the body at the textarea's caret (or at the end), on lines of its own. */
export function insertAtCaret(body: string, insert: string, textareaId: string) {
  const el = typeof document !== 'undefined' ? (document.getElementById(textareaId) as HTMLTextAreaElement | null) : null;
  const at = el && document.activeElement === el ? el.selectionEnd : body.length;
  const before = body.slice(0, at).replace(/\n*$/, '');
  const after = body.slice(at).replace(/^\n*/, '');
  return `${before}${before ? '\n\n' : ''}${insert}\n\n${after}`;
}

/** Uploads files into the draft (with progress) and inserts each as Markdown at the caret. */
export function useImageInsert({
  revisionId,
  body,
  textareaId,
  onChange,
}: {
  revisionId: string | null;
  body: string;
  textareaId: string;
  onChange: (b: string) => void;
}) {
  const upload = useUploadImage();
  const [progress, setProgress] = useState<number | null>(null);
  const bodyRef = useRef(body);
  useEffect(() => {
    bodyRef.current = body;
  }, [body]);
  const handleFiles = async (files: File[]) => {
    if (!revisionId) {
      toast.error('Give the guide a title first: images are added to a saved draft.');
      return;
    }
    for (const file of files) {
      if (file.size > IMAGE_LIMITS.fileBytes) {
        toast.error(`${file.name} is larger than ${IMAGE_LIMITS.fileBytes / 1024 / 1024} MB.`);
        continue;
      }
      setProgress(0);
      try {
        const img = await upload.mutateAsync({ revisionId, file, onProgress: setProgress });
        const next = insertAtCaret(bodyRef.current, imageMarkdown(img), textareaId);
        bodyRef.current = next;
        onChange(next);
        toast.success('Image added: say what it shows in the alt text field below the editor.');
      } catch (err) {
        const detail = err instanceof ApiError && Array.isArray(err.details) ? (err.details[0] as { message?: string })?.message : undefined;
        toast.error([(err as Error).message, detail].filter(Boolean).join(' '));
      } finally {
        setProgress(null);
      }
    }
  };
  return { handleFiles, progress, bodyRef };
}

/**
 * The image controls under the body: pick a file (drop and paste go through the same upload), the
 * progress bar, and the alt-text prompt: every image in the body without alt text is listed with a field
 * asking for it; the draft cannot be submitted until each has one.
 */
export function ImageTools({
  revisionId,
  body,
  progress,
  onFiles,
  onChange,
}: {
  revisionId: string | null;
  body: string;
  progress: number | null;
  onFiles: (files: File[]) => void;
  onChange: (body: string) => void;
}) {
  const picker = useRef<HTMLInputElement>(null);
  const missing = markdownImages(body)
    .map((img, index) => ({ ...img, index }))
    .filter((img) => img.ref && !img.alt);

  return (
    <div className="flex flex-col gap-2" data-testid="image-tools">
      <div className="flex flex-wrap items-center gap-3">
        <Button variant="secondary" size="sm" type="button" onClick={() => picker.current?.click()} disabled={!revisionId || progress !== null}>
          Add image
        </Button>
        <input
          ref={picker}
          type="file"
          accept={ACCEPT}
          className="sr-only"
          tabIndex={-1}
          aria-label="Choose an image to add"
          onChange={(e) => {
            onFiles([...(e.target.files ?? [])]);
            e.target.value = '';
          }}
        />
        <span className="text-xs text-ink-muted">
          {revisionId
            ? `JPEG, PNG or WebP, up to ${IMAGE_LIMITS.fileBytes / 1024 / 1024} MB; drop or paste into the editor too.`
            : 'Images can be added once the draft is saved.'}
        </span>
        {progress !== null && (
          <label className="flex items-center gap-2 text-sm">
            Uploading
            <progress max={1} value={progress} aria-label="Upload progress" />
          </label>
        )}
      </div>
      {missing.map((img) => (
        <AltPrompt key={`${img.src}-${img.index}`} src={img.src} thumb={imageUrl(img.ref!.id, 480)} onSave={(alt) => onChange(withAlt(body, img.index, alt))} />
      ))}
    </div>
  );
}

/** The body with the n-th image's alt text set. */
function withAlt(body: string, n: number, alt: string) {
  let i = -1;
  return body.replace(/!\[([^\]\n]*)\]\(/g, (whole) => (++i === n ? `![${alt.replace(/[[\]\\\n]/g, ' ').trim()}](` : whole));
}

function AltPrompt({ src, thumb, onSave }: { src: string; thumb: string; onSave: (alt: string) => void }) {
  const id = useId();
  const [alt, setAlt] = useState('');
  return (
    <form
      className="flex flex-wrap items-end gap-3 rounded-md border border-caution-line bg-caution-wash p-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (alt.trim()) onSave(alt);
      }}
    >
      <img src={thumb} alt="" width={96} height={72} className="h-[72px] w-24 rounded object-cover" />
      <div className="flex min-w-[14rem] flex-1 flex-col gap-1">
        <label htmlFor={id} className="text-sm font-medium">
          Alt text needed: what does this image show?
        </label>
        <input
          id={id}
          data-image-src={src}
          className="rounded-md border border-ink/25 bg-white px-2 py-1 text-sm"
          value={alt}
          maxLength={IMAGE_LIMITS.altMax}
          onChange={(e) => setAlt(e.target.value)}
          placeholder="e.g. Endbell with the timing mark one notch above the centre line"
          autoFocus
        />
      </div>
      <Button type="submit" disabled={!alt.trim()}>
        Save alt text
      </Button>
    </form>
  );
}
