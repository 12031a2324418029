import { useState, type FormEvent } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { REVISION_STATE_LABELS } from '@shared/constants';
import { Button } from '@/components/ui/button';
import { Spinner } from '@/components/ui/card';
import { Dialog } from '@/components/ui/dialog';
import { TextAreaField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { guideQueries, useRestoreRevision, type HistoryItem } from '../api/guides';
import { formatDate } from '../lib/format';

function stateTone(state: HistoryItem['state']) {
  if (state === 'published') return 'bg-ok-wash text-ok border-ok-line';
  if (state === 'in_review') return 'bg-caution-wash text-caution border-caution-line';
  if (state === 'returned') return 'bg-danger-wash text-danger border-danger-line';
  return 'bg-paper-deep text-ink-soft border-paper-line';
}

/** A revision state in our words, as a small badge. */
export function StateBadge({ state }: { state: HistoryItem['state'] }) {
  return (
    <span className={`inline-flex rounded-full border px-2 py-0.5 text-xs font-medium whitespace-nowrap ${stateTone(state)}`}>
      {REVISION_STATE_LABELS[state]}
    </span>
  );
}

function ComparePicker({ slug, numbers, defaultFrom, defaultTo }: { slug: string; numbers: number[]; defaultFrom: number; defaultTo: number }) {
  const navigate = useNavigate();
  const [from, setFrom] = useState(defaultFrom);
  const [to, setTo] = useState(defaultTo);
  const handleSubmit = (e: FormEvent) => {
    e.preventDefault();
    navigate(`/guides/${slug}/compare?from=${from}&to=${to}`);
  };
  return (
    // A real GET form, so it also works on a server-drawn page before the app has started.
    <form action={`/guides/${slug}/compare`} method="get" onSubmit={handleSubmit} className="flex flex-wrap items-end gap-2 text-sm">
      <VersionSelect label="Compare version" name="from" numbers={numbers} value={from} onChange={setFrom} />
      <VersionSelect label="with version" name="to" numbers={numbers} value={to} onChange={setTo} />
      <Button type="submit" variant="secondary" size="sm" disabled={from === to}>
        Compare
      </Button>
    </form>
  );
}

/** What can be done with one version from the history: compare it with the live one, restore it (moderators). */
function RowActions({
  slug,
  row,
  live,
  canModerate,
  onRestore,
}: {
  slug: string;
  row: HistoryItem;
  live: HistoryItem | undefined;
  canModerate: boolean;
  onRestore: (r: HistoryItem) => void;
}) {
  if (!live || row.number === live.number) return null;
  return (
    <div className="flex flex-wrap gap-x-3 gap-y-1 whitespace-nowrap sm:justify-end sm:gap-2">
      <Link
        to={`/guides/${slug}/compare?from=${Math.min(row.number, live.number)}&to=${Math.max(row.number, live.number)}`}
        aria-label={`Compare with live (version ${row.number})`}
      >
        Compare with live
      </Link>
      {canModerate && row.state === 'archived' && (
        <button
          type="button"
          className="text-copper-dark underline decoration-copper/40 underline-offset-2 hover:decoration-copper"
          onClick={() => onRestore(row)}
          aria-label={`Restore version ${row.number}`}
        >
          Restore
        </button>
      )}
    </div>
  );
}

function RowNote({ row }: { row: HistoryItem }) {
  return (
    <>
      {row.note || '—'}
      {row.restoredFromNumber != null && (
        <span className="block text-xs text-ink-muted">
          Restores version {row.restoredFromNumber}
          {row.restoredBy && <>, brought back by {row.restoredBy.displayName}</>}
        </span>
      )}
    </>
  );
}

const rowDate = (r: HistoryItem) => formatDate(r.publishedAt ?? r.submittedAt ?? r.createdAt);

/** Every public revision of a guide, with links to each permalink, comparisons and (moderators) restore. */
export function RevisionHistory({ slug, canModerate, currentNumber }: { slug: string; canModerate: boolean; currentNumber?: number }) {
  const revisions = useQuery(guideQueries.revisions(slug));
  const restore = useRestoreRevision(slug);
  const [restoring, setRestoringRow] = useState<HistoryItem | null>(null);
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string>();
  const setRestoring = (row: HistoryItem | null) => {
    setRestoringRow(row);
    setReason('');
    setReasonError(undefined);
  };
  if (revisions.isPending) return <Spinner label="Loading history…" />;
  if (revisions.isError)
    return (
      <Notice tone="danger" title="The history could not be loaded">
        {revisions.error.message}
      </Notice>
    );
  const rows = [...revisions.data].sort((a, b) => b.number - a.number);
  const live = rows.find((r) => r.state === 'published');
  const numbers = rows.map((r) => r.number).sort((a, b) => a - b);
  const handleRestore = async () => {
    if (!restoring) return;
    if (reason.trim().length < 10) {
      setReasonError('Say why this version is restored (at least 10 characters): its author is sent the reason.');
      return;
    }
    try {
      const res = await restore.mutateAsync({ number: restoring.number, reason: reason.trim() });
      toast.success(`Version ${restoring.number} restored as version ${res.revision.number}`);
      setRestoring(null);
    } catch (err) {
      if (err instanceof ApiError && err.fieldErrors.reason) setReasonError(err.fieldErrors.reason);
      else toast.error((err as Error).message);
    }
  };
  return (
    <div className="flex flex-col gap-4">
      {/* On a phone and at 200 % zoom (640 CSS px) the versions stack as a list, so each edit note reads in full
          and every action stays in view; from the md breakpoint up they line up in a table. */}
      <ol className="flex flex-col divide-y divide-paper-line border-y border-paper-line md:hidden" aria-label="Versions of this guide, newest first">
        {rows.map((r) => (
          <li key={r.id} className={`flex flex-col gap-1 px-1 py-3 text-sm ${r.number === currentNumber ? 'bg-copper-wash/50' : ''}`}>
            <div className="flex items-center justify-between gap-2">
              <Link to={`/guides/${slug}/v/${r.number}`} className="font-semibold">
                Version {r.number}
              </Link>
              <StateBadge state={r.state} />
            </div>
            <p className="text-xs text-ink-muted">
              {r.author.displayName} · {rowDate(r)}
            </p>
            <p className="text-ink-soft">
              <RowNote row={r} />
            </p>
            <RowActions slug={slug} row={r} live={live} canModerate={canModerate} onRestore={setRestoring} />
          </li>
        ))}
      </ol>
      <div className="table-scroll hidden md:block">
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Versions of this guide, newest first</caption>
          <thead>
            <tr className="border-b-2 border-ink/30 bg-paper-deep text-left">
              {['Version', 'State', 'Author', 'Date', 'Edit note'].map((h) => (
                <th key={h} scope="col" className="px-3 py-2 font-semibold">
                  {h}
                </th>
              ))}
              <th scope="col" className="px-3 py-2 font-semibold">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className={`border-b border-paper-line align-top ${r.number === currentNumber ? 'bg-copper-wash/50' : ''}`}>
                <th scope="row" className="px-3 py-2 text-left font-semibold whitespace-nowrap">
                  <Link to={`/guides/${slug}/v/${r.number}`}>
                    <span aria-hidden>v</span>
                    <span className="sr-only">Version </span>
                    {r.number}
                  </Link>
                </th>
                <td className="px-3 py-2">
                  <StateBadge state={r.state} />
                </td>
                <td className="px-3 py-2 whitespace-nowrap">{r.author.displayName}</td>
                <td className="px-3 py-2 whitespace-nowrap">{rowDate(r)}</td>
                <td className="max-w-md px-3 py-2 text-ink-soft">
                  <RowNote row={r} />
                </td>
                <td className="px-3 py-2">
                  <RowActions slug={slug} row={r} live={live} canModerate={canModerate} onRestore={setRestoring} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {numbers.length > 1 && <ComparePicker slug={slug} numbers={numbers} defaultFrom={numbers[numbers.length - 2]} defaultTo={numbers[numbers.length - 1]} />}
      <Dialog
        open={!!restoring}
        onClose={() => setRestoring(null)}
        title={`Restore version ${restoring?.number ?? ''}?`}
        footer={
          <>
            <Button variant="secondary" onClick={() => setRestoring(null)}>
              Cancel
            </Button>
            <Button onClick={handleRestore} pending={restore.isPending}>
              Publish a copy of version {restoring?.number}
            </Button>
          </>
        }
      >
        <div className="flex flex-col gap-3">
          <p className="text-sm text-ink-soft">
            This publishes a new version with the text and details of version {restoring?.number}. The current live version {live?.number} becomes superseded;
            nothing is deleted, and the history notes which version was restored.
          </p>
          {restoring && (
            <p className="text-sm text-ink-soft">
              It stays credited to {restoring.author.displayName}, who wrote version {restoring.number}; you are named as the moderator who brought it back.
            </p>
          )}
          <TextAreaField
            label="Reason"
            hint={`Kept in the audit log and sent to ${restoring?.author.displayName ?? 'the author'}.`}
            rows={3}
            value={reason}
            onChange={(e) => {
              setReason(e.target.value);
              setReasonError(undefined);
            }}
            error={reasonError}
            maxLength={1000}
            required
          />
        </div>
      </Dialog>
    </div>
  );
}

function VersionSelect({
  label,
  name,
  numbers,
  value,
  onChange,
}: {
  label: string;
  name: string;
  numbers: number[];
  value: number;
  onChange: (n: number) => void;
}) {
  return (
    <label className="flex flex-col gap-1">
      <span className="font-medium">{label}</span>
      <select
        name={name}
        className="rounded-md border border-ink/25 bg-white/80 px-2 py-1.5 text-sm"
        value={value}
        onChange={(e) => onChange(Number(e.target.value))}
      >
        {numbers.map((n) => (
          <option key={n} value={n}>
            {n}
          </option>
        ))}
      </select>
    </label>
  );
}
