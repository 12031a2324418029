import { useQuery } from '@tanstack/react-query';
import { Link, useSearchParams } from 'react-router-dom';
import { AUDIT_ACTION_LABELS, AUDIT_CSV_MAX_ROWS, AUDIT_SUBJECT_LABELS, type AuditEntry, type AuditFilter } from '@shared/schemas/audit';
import { ROLE_LABELS, type Role } from '@shared/constants';
import { Button } from '@/components/ui/button';
import { Spinner } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { auditCsvHref, auditQueries } from '../api/audit';

const PAGE_SIZE = 50;
const when = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', second: '2-digit' });
const FILTER_KEYS = ['actor', 'action', 'targetType', 'targetId', 'since', 'until'] as const;

/** A from/to value in words: role names as we say them, states as they are. */
function valueText(v: string | null) {
  if (v === null) return '—';
  return (ROLE_LABELS as Record<string, string>)[v] ?? (v as Role | string);
}

function Change({ e }: { e: AuditEntry }) {
  if (e.from === null && e.to === null) return <span className="text-ink-muted">—</span>;
  return (
    <span className="whitespace-nowrap">
      {valueText(e.from)} <span aria-label="to">→</span> {valueText(e.to)}
    </span>
  );
}

function About({ e, onTarget }: { e: AuditEntry; onTarget: (e: AuditEntry) => void }) {
  return (
    <span className="flex flex-col items-start gap-0.5">
      {e.targetHref ? <Link to={e.targetHref}>{e.target}</Link> : <span>{e.target}</span>}
      <button
        type="button"
        className="text-xs text-copper-dark underline decoration-copper/40 underline-offset-2 hover:decoration-copper"
        onClick={() => onTarget(e)}
        aria-label={`Only rows about ${e.target}`}
      >
        Only rows about this
      </button>
    </span>
  );
}

function Who({ e, onActor }: { e: AuditEntry; onActor: (e: AuditEntry) => void }) {
  if (!e.actor) return <span className="text-ink-muted">No account</span>;
  return (
    <button
      type="button"
      className="text-left font-medium text-copper-dark underline decoration-copper/40 underline-offset-2 hover:decoration-copper"
      onClick={() => onActor(e)}
      aria-label={`Only rows by ${e.actor.displayName}`}
    >
      {e.actor.displayName}
    </button>
  );
}

/**
 * The audit log for moderators and administrators: every transition with who, when, what and why,
 * newest first; filters live in the address, so a filtered view can be shared with another moderator.
 */
export function AuditLog() {
  const [params, setParams] = useSearchParams();
  const filters: AuditFilter = Object.fromEntries(FILTER_KEYS.map((k) => [k, params.get(k) || undefined]).filter((e) => e[1])) as AuditFilter;
  const offset = Math.max(0, Number(params.get('offset')) || 0);
  const list = useQuery(auditQueries.list({ ...filters, limit: PAGE_SIZE, offset }));
  const set = (changes: Record<string, string | null>) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(changes)) {
      if (v) next.set(k, v);
      else next.delete(k);
    }
    if (!('offset' in changes)) next.delete('offset');
    setParams(next, { replace: true });
  };
  const onActor = (e: AuditEntry) => set({ actor: e.actor?.id ?? null, actorName: e.actor?.displayName ?? null });
  const onTarget = (e: AuditEntry) => set({ targetType: e.targetType, targetId: e.targetId, targetName: e.target });
  const total = list.data?.meta.total ?? 0;
  const rows = list.data?.data ?? [];
  const badDates = !!filters.since && !!filters.until && filters.since > filters.until;

  return (
    <div className="flex flex-col gap-5">
      <form className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4 lg:items-end" onSubmit={(ev) => ev.preventDefault()} aria-label="Filter the audit log">
        <SelectField label="Action" value={filters.action ?? ''} onChange={(ev) => set({ action: ev.target.value || null })}>
          <option value="">Every action</option>
          {Object.entries(AUDIT_ACTION_LABELS).map(([code, label]) => (
            <option key={code} value={code}>
              {label}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="About"
          value={filters.targetType ?? ''}
          onChange={(ev) => set({ targetType: ev.target.value || null, targetId: null, targetName: null })}
        >
          <option value="">Anything</option>
          {Object.entries(AUDIT_SUBJECT_LABELS).map(([kind, label]) => (
            <option key={kind} value={kind}>
              {label}
            </option>
          ))}
        </SelectField>
        <TextField label="From (UTC day)" type="date" value={filters.since ?? ''} onChange={(ev) => set({ since: ev.target.value || null })} />
        <TextField
          label="To (UTC day, included)"
          type="date"
          value={filters.until ?? ''}
          onChange={(ev) => set({ until: ev.target.value || null })}
          error={badDates ? 'The end is before the start' : undefined}
        />
      </form>
      {(filters.actor || filters.targetId) && (
        <div className="flex flex-wrap items-center gap-3 text-sm">
          {filters.actor && (
            <span className="flex items-center gap-2">
              By <strong>{params.get('actorName') ?? 'one person'}</strong>
              <Button variant="ghost" size="sm" onClick={() => set({ actor: null, actorName: null })}>
                Everyone
              </Button>
            </span>
          )}
          {filters.targetId && (
            <span className="flex items-center gap-2">
              About <strong>{params.get('targetName') ?? 'one item'}</strong>
              <Button variant="ghost" size="sm" onClick={() => set({ targetId: null, targetName: null })}>
                Everything
              </Button>
            </span>
          )}
        </div>
      )}
      <div className="flex flex-wrap items-center justify-between gap-3 text-sm">
        <p className="text-ink-muted" aria-live="polite">
          {list.isPending ? 'Loading…' : `${total.toLocaleString('en-GB')} ${total === 1 ? 'entry' : 'entries'}`}
        </p>
        <p className="flex flex-col items-start gap-0.5 sm:items-end">
          <a href={auditCsvHref(filters)} download className="font-medium">
            Download these entries as CSV
          </a>
          <span className="text-xs text-ink-muted">
            Newest first, at most {AUDIT_CSV_MAX_ROWS.toLocaleString('en-GB')} rows. Cells that start like a formula get a leading apostrophe.
          </span>
        </p>
      </div>
      {list.isError && (
        <Notice tone="danger" title="The audit log could not be loaded">
          {list.error.message}
        </Notice>
      )}
      {list.isPending ? (
        <Spinner label="Loading the audit log…" />
      ) : rows.length === 0 ? (
        <p className="rounded-md border border-paper-line bg-paper-card px-4 py-6 text-center text-ink-muted">No entry matches these filters.</p>
      ) : (
        <>
          {/* On a phone each entry is a small block; from the medium breakpoint up they line up in a table. */}
          <ol className="flex flex-col divide-y divide-paper-line border-y border-paper-line md:hidden" aria-label="Audit entries, newest first">
            {rows.map((e) => (
              <li key={e.id} className="flex flex-col gap-1 px-1 py-3 text-sm">
                <p className="flex flex-wrap items-baseline justify-between gap-2">
                  <span className="font-semibold">{e.actionLabel}</span>
                  <time dateTime={e.at} className="text-xs text-ink-muted">
                    {when.format(new Date(e.at))}
                  </time>
                </p>
                <p>
                  <Who e={e} onActor={onActor} />
                </p>
                <About e={e} onTarget={onTarget} />
                {(e.from !== null || e.to !== null) && (
                  <p className="text-ink-soft">
                    <Change e={e} />
                  </p>
                )}
                {e.reason && <p className="break-words text-ink-soft">Reason: {e.reason}</p>}
              </li>
            ))}
          </ol>
          <div className="table-scroll hidden rounded-lg border border-paper-line bg-paper-card md:block">
            <table className="w-full text-left text-sm">
              <caption className="sr-only">Audit entries, newest first</caption>
              <thead className="bg-paper-deep">
                <tr>
                  {['When', 'Who', 'Action', 'About', 'Change', 'Reason'].map((h) => (
                    <th key={h} scope="col" className="px-3 py-2 font-semibold">
                      {h}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {rows.map((e) => (
                  <tr key={e.id} className="border-t border-paper-line align-top">
                    <td className="px-3 py-2 whitespace-nowrap">
                      <time dateTime={e.at}>{when.format(new Date(e.at))}</time>
                    </td>
                    <td className="px-3 py-2">
                      <Who e={e} onActor={onActor} />
                    </td>
                    <td className="px-3 py-2">{e.actionLabel}</td>
                    <td className="max-w-xs px-3 py-2">
                      <About e={e} onTarget={onTarget} />
                    </td>
                    <td className="px-3 py-2">
                      <Change e={e} />
                    </td>
                    <td className="max-w-sm px-3 py-2 break-words text-ink-soft">{e.reason ?? '—'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
      {total > PAGE_SIZE && (
        <nav aria-label="Audit log pages" className="flex items-center gap-3 text-sm">
          <Button size="sm" variant="secondary" disabled={offset <= 0} onClick={() => set({ offset: String(Math.max(0, offset - PAGE_SIZE)) || null })}>
            Newer
          </Button>
          <span>
            {offset + 1}–{Math.min(offset + PAGE_SIZE, total)} of {total.toLocaleString('en-GB')}
          </span>
          <Button size="sm" variant="secondary" disabled={offset + PAGE_SIZE >= total} onClick={() => set({ offset: String(offset + PAGE_SIZE) })}>
            Older
          </Button>
        </nav>
      )}
    </div>
  );
}
