import { useId, useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { toast } from '@/lib/toast';
import type { FieldIssue } from '@shared/schemas/common';
import type { SetupUpload } from '@shared/schemas/setup';
import { LIMITS } from '@shared/constants';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { useUploadSetup } from '../api/setups';

/** Upload one of our .json or .csv setup files, with a progress bar and every refusal listed by path. */
export function UploadForm({ onUploaded }: { onUploaded?: (upload: SetupUpload) => void }) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [problem, setProblem] = useState<{ message: string; details: FieldIssue[] } | null>(null);
  const [done, setDone] = useState<SetupUpload | null>(null);
  const uploadSetup = useUploadSetup();

  const handleSubmit = async (e: FormEvent) => {
    e.preventDefault();
    const file = input.current?.files?.[0];
    setProblem(null);
    setDone(null);
    if (!file) {
      setProblem({ message: 'Choose a file first.', details: [] });
      return;
    }
    if (file.size > LIMITS.uploadBytes) {
      setProblem({ message: 'That file is too large.', details: [{ path: 'file', message: `Setup files are at most ${LIMITS.uploadBytes / 1024} KB` }] });
      return;
    }
    setProgress(0);
    try {
      const uploaded = await uploadSetup.mutateAsync({ file, onProgress: setProgress });
      setDone(uploaded);
      toast.success(`Uploaded ${uploaded.originalName}`);
      if (input.current) input.current.value = '';
      onUploaded?.(uploaded);
    } catch (err) {
      const details = err instanceof ApiError && Array.isArray(err.details) ? (err.details as FieldIssue[]) : [];
      setProblem({ message: err instanceof Error ? err.message : 'The upload failed.', details });
    } finally {
      setProgress(null);
    }
  };

  return (
    <form onSubmit={handleSubmit} className="flex flex-col gap-3" aria-describedby={`${id}-hint`}>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-file`} className="text-sm font-medium">
          Setup file
        </label>
        <input
          ref={input}
          id={`${id}-file`}
          name="file"
          type="file"
          accept=".json,.csv,application/json,text/csv"
          className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-ink/25 file:bg-paper-card file:px-3 file:py-1.5 file:font-medium"
        />
        <p id={`${id}-hint`} className="text-xs text-ink-muted">
          A Tunewright setup record (.json) or our CSV layout (.csv), up to {LIMITS.uploadBytes / 1024} KB. Download a baseline to start from, or{' '}
          <Link to="/setups/new">build one</Link>.
        </p>
      </div>
      {progress !== null && (
        <div className="flex items-center gap-3">
          <progress max={1} value={progress} className="h-2 flex-1 accent-copper" aria-label="Upload progress" />
          <span className="w-12 text-right text-sm tabular-nums">{Math.round(progress * 100)} %</span>
        </div>
      )}
      <div>
        <Button type="submit" pending={uploadSetup.isPending}>
          Upload
        </Button>
      </div>
      {problem && (
        <Notice tone="danger" title={problem.message}>
          {problem.details.length > 0 && (
            <ul className="mt-1 list-disc space-y-1 pl-5" data-testid="upload-errors">
              {problem.details.map((d, i) => (
                <li key={i}>
                  <code className="rounded bg-white/60 px-1">{d.path}</code> {d.message}
                </li>
              ))}
            </ul>
          )}
          <p className="mt-1">Nothing was stored.</p>
        </Notice>
      )}
      {done && (
        <Notice tone="ok" title={`Uploaded ${done.originalName}`}>
          <Link to={`/setups/compare?b=${done.id}`}>Compare it with a baseline</Link>
        </Notice>
      )}
    </form>
  );
}
