import { useQuery } from '@tanstack/react-query';
import { Link, useSearchParams } from 'react-router-dom';
import { CLASSES } from '@shared/constants';
import { SelectField } from '@/components/ui/field';
import { Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { checkPathLabel } from '@shared/content-checks/path-label';
import type { ContentCheckItem } from '@shared/schemas/content-check';
import { reviewQueries, type ReviewFilters } from '../api/reviews';

/** The automatic findings of one proposal: the count, then each titled by the setting or example it concerns. */
function Findings({ checks }: { checks: ContentCheckItem[] }) {
  if (checks.length === 0) return <span className="text-ink-muted">None</span>;
  const errors = checks.filter((c) => c.severity === 'error').length;
  return (
    <details>
      <summary className="cursor-pointer font-medium whitespace-nowrap">
        {checks.length} {checks.length === 1 ? 'finding' : 'findings'}
        {errors > 0 && (
          <span className="text-danger">
            {' '}
            · {errors} error{errors === 1 ? '' : 's'}
          </span>
        )}
      </summary>
      <ul className="mt-1 flex list-disc flex-col gap-1 pl-4 text-xs">
        {checks.map((c, i) => (
          <li key={`${c.rule}-${c.path}-${i}`} className={c.severity === 'error' ? 'text-danger' : undefined}>
            <span className="font-semibold">{checkPathLabel(c.path)}:</span> {c.message}
          </li>
        ))}
      </ul>
    </details>
  );
}

const since = new Intl.RelativeTimeFormat('en-GB', { numeric: 'auto' });
function waitingFor(iso: string | null) {
  if (!iso) return '—';
  const hours = (Date.now() - new Date(iso).getTime()) / 3_600_000;
  return hours < 24 ? since.format(-Math.max(0, Math.round(hours)), 'hour') : since.format(-Math.round(hours / 24), 'day');
}

/** Proposals waiting for a moderator, oldest first, filterable by kind and class (in the URL). */
export function ReviewQueue() {
  const [params, setParams] = useSearchParams();
  const filters: ReviewFilters = { kind: params.get('kind') || undefined, class: params.get('class') || undefined };
  const queue = useQuery(reviewQueries.queue(filters));
  const set = (key: keyof ReviewFilters, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };
  const rows = [...(queue.data ?? [])].sort((a, b) => String(a.submittedAt).localeCompare(String(b.submittedAt)));
  return (
    <div className="flex flex-col gap-5">
      <div className="grid gap-3 sm:max-w-xl sm:grid-cols-2">
        <SelectField label="Kind" value={filters.kind ?? ''} onChange={(e) => set('kind', e.target.value)}>
          <option value="">Guides and settings</option>
          <option value="guide">Guides</option>
          <option value="parameter">Settings (parameter library)</option>
        </SelectField>
        <SelectField label="Class" value={filters.class ?? ''} onChange={(e) => set('class', e.target.value)}>
          <option value="">All classes</option>
          {CLASSES.map((c) => (
            <option key={c.slug} value={c.slug}>
              {c.name}
            </option>
          ))}
        </SelectField>
      </div>
      {queue.isPending ? (
        <Spinner label="Loading the queue…" />
      ) : queue.isError ? (
        <Notice tone="danger" title="The queue could not be loaded">
          {queue.error.message}
        </Notice>
      ) : rows.length === 0 ? (
        <Notice tone="ok" title="Nothing waiting">
          Every proposal matching these filters has been reviewed.
        </Notice>
      ) : (
        <div className="table-scroll">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">Proposals waiting for review, oldest first</caption>
            <thead>
              <tr className="border-b-2 border-ink/30 bg-paper-deep text-left">
                <th scope="col" className="px-3 py-2 font-semibold">
                  Proposal
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Kind
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Author
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Waiting
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Automatic findings
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Edit note
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.revisionId} className="border-b border-paper-line align-top">
                  <th scope="row" className="px-3 py-2 text-left font-medium">
                    <Link to={`/review/${r.revisionId}`}>{r.title}</Link>
                    <span className="block text-xs font-normal text-ink-muted">
                      Version {r.number}
                      {r.baseNumber ? ` · edit of version ${r.baseNumber}` : ' · new'}
                      {r.stale && ' · based on an older version'}
                      {r.own && ' · yours'}
                    </span>
                  </th>
                  <td className="px-3 py-2">{r.kind === 'guide' ? 'Guide' : 'Setting'}</td>
                  <td className="px-3 py-2 whitespace-nowrap">{r.author.displayName}</td>
                  <td className="px-3 py-2 whitespace-nowrap">{waitingFor(r.submittedAt)}</td>
                  <td className="min-w-40 px-3 py-2" data-testid="queue-findings">
                    <Findings checks={r.checks ?? []} />
                  </td>
                  <td className="max-w-md px-3 py-2 text-ink-soft">{r.note || '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
