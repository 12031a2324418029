import { useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { CLASSES, SURFACES } from '@shared/constants';
import type { SetupBaseline } from '@shared/schemas/setup';
import { guideSetupLinks } from '../api/setups';
import { formatQuantity, formatRatio } from '@shared/units';
import { useUnits } from '@/lib/preferences';
import { classLabel, surfaceLabel } from './labels';
import { TableScroll } from '@/components/ui/table-scroll';

const col = createColumnHelper<SetupBaseline>();

/** Published baselines in a sortable, filterable table. */
export function BaselinesTable({ baselines }: { baselines: SetupBaseline[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'class', desc: false }]);
  // The filters live in the URL (q, class, surface), so a filtered list can be linked, bookmarked and come back on Back.
  const [params, setParams] = useSearchParams();
  const search = params.get('q') ?? '';
  const cls = params.get('class') ?? '';
  const surface = params.get('surface') ?? '';
  const setParam = (key: string) => (value: string) =>
    setParams(
      (prev) => {
        const next = new URLSearchParams(prev);
        if (value) next.set(key, value);
        else next.delete(key);
        return next;
      },
      { replace: true },
    );
  const setSearch = setParam('q');
  const setCls = setParam('class');
  const setSurface = setParam('surface');
  const units = useUnits();

  const columns = useMemo(
    () => [
      col.accessor((b) => b.guideTitle, {
        id: 'guide',
        header: 'Guide',
        cell: (c) => (
          <Link to={`/guides/${c.row.original.guideSlug}`} className="inline-block min-w-48 font-medium">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('revisionNumber', { header: 'Version', cell: (c) => `v${c.getValue()}` }),
      col.accessor((b) => classLabel(b.summary.class), { id: 'class', header: 'Class' }),
      col.accessor((b) => surfaceLabel(b.summary.surface), { id: 'surface', header: 'Surface' }),
      col.accessor((b) => b.summary.motor, { id: 'motor', header: 'Motor', enableSorting: false }),
      col.accessor((b) => b.summary.finalDriveRatio, {
        id: 'fdr',
        header: 'Final drive',
        cell: (c) => formatRatio(c.getValue()),
        sortUndefined: 'last',
      }),
      col.accessor((b) => b.summary.rolloutMm, { id: 'rollout', header: 'Rollout', cell: (c) => formatQuantity('rollout', c.getValue(), units) }),
      col.display({
        id: 'actions',
        header: () => <span className="sr-only">Downloads and compare</span>,
        cell: (c) => {
          const links = guideSetupLinks(c.row.original.guideSlug);
          return (
            <div className="flex flex-wrap gap-x-3 gap-y-1 text-sm whitespace-nowrap">
              <a href={links.json} download aria-label={`Download ${c.row.original.guideTitle} baseline as JSON`}>
                JSON
              </a>
              <a href={links.csv} download aria-label={`Download ${c.row.original.guideTitle} baseline as CSV`}>
                CSV
              </a>
              <Link to={links.print}>Print</Link>
              <Link to={`/setups/compare?a=guide:${c.row.original.guideSlug}`}>Compare</Link>
            </div>
          );
        },
      }),
    ],
    [units],
  );

  const data = useMemo(
    () => baselines.filter((b) => (!cls || b.summary.class === cls) && (!surface || b.summary.surface === surface)),
    [baselines, cls, surface],
  );
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter: search },
    onSortingChange: setSorting,
    onGlobalFilterChange: (v: unknown) => setSearch(typeof v === 'string' ? v : ''),
    globalFilterFn: 'includesString',
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const rows = table.getRowModel().rows;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap gap-3" role="group" aria-label="Filter baselines">
        <label className="flex min-w-48 flex-1 flex-col text-sm font-medium">
          Search
          <input
            type="search"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            placeholder="Guide, motor, class…"
            className="mt-1 rounded-md border border-ink/25 bg-white/80 px-3 py-1.5 font-normal"
          />
        </label>
        <label className="flex flex-col text-sm font-medium">
          Class
          <select value={cls} onChange={(e) => setCls(e.target.value)} className="mt-1 rounded-md border border-ink/25 bg-white/80 px-2 py-1.5 font-normal">
            <option value="">All classes</option>
            {CLASSES.map((c) => (
              <option key={c.slug} value={c.slug}>
                {c.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col text-sm font-medium">
          Surface
          <select
            value={surface}
            onChange={(e) => setSurface(e.target.value)}
            className="mt-1 rounded-md border border-ink/25 bg-white/80 px-2 py-1.5 font-normal"
          >
            <option value="">All surfaces</option>
            {SURFACES.map((s) => (
              <option key={s.slug} value={s.slug}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
      </div>
      <TableScroll label="Published baseline setups" className="rounded-lg border border-paper-line bg-paper-card">
        <table className="w-full min-w-[52rem] border-collapse text-sm" data-testid="baselines-table">
          <caption className="sr-only">Published baseline setups, {rows.length} shown</caption>
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id} className="border-b-2 border-ink/20 bg-paper-deep">
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      className="px-3 py-2 text-left font-semibold whitespace-nowrap"
                    >
                      {h.column.getCanSort() ? (
                        <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:text-copper-dark">
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden className="text-xs text-ink-faint">
                            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                          </span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className="border-b border-paper-line align-top">
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="px-3 py-2">
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-muted">
                  No baseline matches these filters.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </TableScroll>
    </div>
  );
}
