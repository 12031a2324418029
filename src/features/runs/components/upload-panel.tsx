import { useId, useRef, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { RUNLOG_LIMITS } from '@shared/runlog/vocabulary';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { useUploadRun } from '../api/runs';
import { useRunPreview } from '../hooks/use-preview';
import { MappingEditor, toMapping, type DraftMapping } from './mapping-editor';

type Problem = { message: string; details: Array<{ path: string; message: string; row?: number; column?: string }> };

/** Choose a CSV → preview parsed in a worker → confirm the mapping on the first rows → upload with progress. */
export function UploadPanel({ setups }: { setups: Array<{ id: string; label: string }> }) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [title, setTitle] = useState('');
  const [setupId, setSetupId] = useState('');
  const [mapping, setMapping] = useState<DraftMapping | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [problem, setProblem] = useState<Problem | null>(null);
  const { preview, pending, run, clear } = useRunPreview();
  const upload = useUploadRun();
  const navigate = useNavigate();

  const handleFile = (f: File | undefined) => {
    setProblem(null);
    setMapping(null);
    clear();
    setFile(f ?? null);
    if (!f) return;
    if (f.size > RUNLOG_LIMITS.fileBytes) {
      setProblem({
        message: 'That file is too large.',
        details: [{ path: 'file', message: `Run logs are at most ${RUNLOG_LIMITS.fileBytes / 1024 / 1024} MB` }],
      });
      return;
    }
    setTitle(f.name.replace(/\.csv$/i, '').slice(0, RUNLOG_LIMITS.titleMax));
    run(f);
  };
  const draft = mapping ?? (preview?.mapping as DraftMapping | undefined) ?? {};
  const handleMapping = (next: DraftMapping) => {
    setMapping(next);
    if (file && next.time_s) run(file, toMapping(next));
  };

  const handleSubmit = async (e: FormEvent) => {
    e.preventDefault();
    if (!file) return setProblem({ message: 'Choose a run log first.', details: [] });
    setProblem(null);
    setProgress(0);
    try {
      const stored = await upload.mutateAsync({
        file,
        title: title.trim() || undefined,
        setupId: setupId || undefined,
        mapping: draft.time_s ? toMapping(draft) : undefined,
        onProgress: setProgress,
      });
      toast.success(`Stored ${stored.title}`);
      navigate(`/runs/${stored.id}`);
    } catch (err) {
      const details = err instanceof ApiError && Array.isArray(err.details) ? (err.details as Problem['details']) : [];
      setProblem({ message: err instanceof Error ? err.message : 'The upload failed.', details });
    } finally {
      setProgress(null);
    }
  };

  return (
    <form onSubmit={handleSubmit} className="flex flex-col gap-4">
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-file`} className="text-sm font-medium">
          Run log (CSV)
        </label>
        <input
          ref={input}
          id={`${id}-file`}
          type="file"
          accept=".csv,text/csv"
          onChange={(e) => handleFile(e.target.files?.[0])}
          className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-ink/25 file:bg-paper-card file:px-3 file:py-1.5 file:font-medium"
        />
        <p className="text-xs text-ink-muted">
          Our <code>tunewright.runlog</code> CSV, or any CSV export from a controller&apos;s data logging (you confirm which column is which). Up to{' '}
          {RUNLOG_LIMITS.fileBytes / 1024 / 1024} MB. Private to your account.
        </p>
      </div>
      {pending && <p className="text-sm text-ink-muted">Reading the file…</p>}
      {preview && (
        <div className="flex flex-col gap-3" data-testid="run-preview">
          <p className="text-sm">
            {preview.rowCount.toLocaleString('en-GB')} rows · {preview.ours ? 'our own vocabulary' : 'columns mapped from the header — check them'} · read in{' '}
            {Math.round(preview.parseMs)} ms
          </p>
          {preview.headers.length > 0 && <MappingEditor headers={preview.headers} mapping={draft} onChange={handleMapping} />}
          {preview.rows.length > 0 && (
            <div className="overflow-x-auto">
              <table className="min-w-full text-xs tabular-nums" aria-label="First rows of the file">
                <thead>
                  <tr>
                    {preview.headers.map((h) => (
                      <th key={h} className="whitespace-nowrap border-b border-ink/20 px-2 py-1 text-left font-medium">
                        {h}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {preview.rows.map((r, i) => (
                    <tr key={i}>
                      {preview.headers.map((_h, k) => (
                        <td key={k} className="whitespace-nowrap border-b border-ink/10 px-2 py-0.5">
                          {r[k] ?? ''}
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
          {preview.problem && (
            <Notice tone="danger" title="This file cannot be stored as it is">
              {preview.problem.row !== undefined && `Row ${preview.problem.row}${preview.problem.column ? `, column "${preview.problem.column}"` : ''}: `}
              {preview.problem.message}
            </Notice>
          )}
          {preview.notes.length > 0 && (
            <Notice tone="info" title="Changes made on reading">
              <ul className="list-disc pl-5" data-testid="import-notes">
                {preview.notes.map((n, i) => (
                  <li key={i}>{n.message}</li>
                ))}
              </ul>
            </Notice>
          )}
        </div>
      )}
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="flex flex-col gap-1 text-sm font-medium">
          Title
          <input
            className="rounded-md border border-ink/25 bg-white px-2 py-1.5 font-normal"
            value={title}
            maxLength={RUNLOG_LIMITS.titleMax}
            onChange={(e) => setTitle(e.target.value)}
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium">
          Setup used (for top speed and per-cell voltage)
          <select className="rounded-md border border-ink/25 bg-white px-2 py-1.5 font-normal" value={setupId} onChange={(e) => setSetupId(e.target.value)}>
            <option value="">— none —</option>
            {setups.map((s) => (
              <option key={s.id} value={s.id}>
                {s.label}
              </option>
            ))}
          </select>
        </label>
      </div>
      {progress !== null && (
        <div className="flex items-center gap-3">
          <progress max={1} value={progress} className="h-2 flex-1 accent-copper" aria-label="Upload progress" />
          <span className="w-12 text-right text-sm tabular-nums">{Math.round(progress * 100)} %</span>
        </div>
      )}
      <div>
        <Button type="submit" pending={upload.isPending} disabled={!file || !!preview?.problem}>
          Store this run
        </Button>
      </div>
      {problem && (
        <Notice tone="danger" title={problem.message}>
          {problem.details.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {problem.details.map((d, i) => (
                <li key={i}>{d.message}</li>
              ))}
            </ul>
          )}
          <p className="mt-1">Nothing was stored.</p>
        </Notice>
      )}
    </form>
  );
}
