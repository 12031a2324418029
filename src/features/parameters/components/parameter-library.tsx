import { Fragment, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type FilterFn,
  type SortingState,
} from '@tanstack/react-table';
import { PARAMETER_CATEGORIES } from '@shared/constants';
import type { ParameterSummary } from '@shared/schemas/parameter';
import { CATEGORY_INFO, displayUnit, formatRange } from './parameter-format';
import { TableScroll } from '@/components/ui/table-scroll';

const col = createColumnHelper<ParameterSummary>();
const categoryRank = (c: string) => PARAMETER_CATEGORIES.indexOf(c as (typeof PARAMETER_CATEGORIES)[number]);
const fold = (s: string) =>
  s
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, ' ')
    .trim();

/** Matches every word of the filter against name, aliases (misspellings included), unit, category and summary. */
const matchesEntry: FilterFn<ParameterSummary> = (row, _columnId, value: string) => {
  const words = fold(value).split(' ').filter(Boolean);
  if (words.length === 0) return true;
  const p = row.original;
  const hay = fold([p.name, p.slug, ...p.aliases, p.category, p.summary].join(' '));
  const squashed = hay.replace(/ /g, '');
  return words.every((w) => hay.includes(w) || squashed.includes(w));
};

const DEFAULT_SORT: SortingState = [{ id: 'category', desc: false }];

/** The library: a filter box and one sortable table, grouped under category headings while sorted by category. */
export function ParameterLibrary({ parameters }: { parameters: ParameterSummary[] }) {
  const [sorting, setSorting] = useState<SortingState>(DEFAULT_SORT);
  const [filter, setFilter] = useState('');

  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Setting',
        sortingFn: (a, b) => a.original.name.localeCompare(b.original.name, 'en', { sensitivity: 'base' }),
        cell: (c) => (
          <div className="min-w-0">
            <Link to={`/parameters/${c.row.original.slug}`} className="font-semibold">
              {c.getValue()}
            </Link>
            <p className="mt-0.5 line-clamp-2 text-[0.82rem] leading-5 text-ink-muted">{c.row.original.summary}</p>
          </div>
        ),
      }),
      col.accessor('category', {
        header: 'Category',
        sortingFn: (a, b) =>
          categoryRank(a.original.category) - categoryRank(b.original.category) ||
          a.original.name.localeCompare(b.original.name, 'en', { sensitivity: 'base' }),
        cell: (c) => CATEGORY_INFO[c.getValue()].label,
      }),
      col.accessor('unit', {
        header: 'Unit',
        cell: (c) => displayUnit(c.getValue()) || <span className="text-ink-faint">—</span>,
      }),
      col.accessor((p) => p.range.max - p.range.min, {
        id: 'range',
        header: 'Typical range',
        sortingFn: (a, b) => a.original.range.min - b.original.range.min || a.original.range.max - b.original.range.max,
        cell: (c) => <span className="whitespace-nowrap font-mono text-[0.85rem]">{formatRange(c.row.original)}</span>,
      }),
    ],
    [],
  );

  const table = useReactTable({
    data: parameters,
    columns,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    globalFilterFn: matchesEntry,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    enableSortingRemoval: false,
  });

  const rows = table.getRowModel().rows;
  const grouped = sorting[0]?.id === 'category';
  const counts = useMemo(() => {
    const m = new Map<string, number>();
    for (const r of rows) m.set(r.original.category, (m.get(r.original.category) ?? 0) + 1);
    return m;
  }, [rows]);

  // Hidden below the sm breakpoint: category shows as the group heading and the unit is in the range.
  const narrowHidden = (id: string) => (id === 'category' || id === 'unit' ? 'hidden sm:table-cell' : '');

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-col gap-3 sm:flex-row sm:items-end sm:justify-between">
        <div className="flex w-full max-w-md flex-col gap-1">
          <label htmlFor="parameter-filter" className="text-sm font-medium text-ink">
            Filter the library
          </label>
          <input
            id="parameter-filter"
            type="search"
            value={filter}
            onChange={(e) => setFilter(e.target.value)}
            placeholder="e.g. drag brake, boost, cutoff, kV"
            className="w-full rounded-md border border-ink/25 bg-white/85 px-3 py-2 text-ink shadow-inner placeholder:text-ink-faint focus:border-copper"
            aria-describedby="parameter-filter-count"
          />
        </div>
        <p id="parameter-filter-count" className="text-sm text-ink-muted" aria-live="polite">
          {rows.length === parameters.length ? `${parameters.length} settings` : `${rows.length} of ${parameters.length} settings`}
        </p>
      </div>

      {grouped && !filter && (
        <nav aria-label="Categories" className="flex flex-wrap gap-1.5">
          {PARAMETER_CATEGORIES.filter((c) => counts.get(c)).map((c) => (
            <a
              key={c}
              href={`#category-${c}`}
              className="rounded-full border border-paper-line bg-paper-card px-2.5 py-0.5 text-xs font-medium text-ink no-underline hover:border-copper/50"
            >
              {CATEGORY_INFO[c].label} <span className="text-ink-muted">{counts.get(c)}</span>
            </a>
          ))}
        </nav>
      )}

      <TableScroll label="Parameter library" className="rounded-lg border border-paper-line bg-paper-card">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">Parameter library{grouped ? ', grouped by category' : ''}. Column headers sort the table.</caption>
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id} className="border-b-2 border-ink/25 bg-paper-deep">
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                      className={`px-3 py-2 font-semibold ${narrowHidden(h.id)} ${h.id === 'name' ? 'w-[58%]' : ''}`}
                    >
                      <button
                        type="button"
                        onClick={h.column.getToggleSortingHandler()}
                        className="inline-flex items-center gap-1 rounded text-left text-ink hover:text-copper-dark"
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden className={`text-xs ${sorted ? 'text-copper' : 'text-ink-faint'}`}>
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row, i) => {
              const newGroup = grouped && (i === 0 || rows[i - 1].original.category !== row.original.category);
              const info = CATEGORY_INFO[row.original.category];
              return (
                <Fragment key={row.id}>
                  {newGroup && (
                    <tr id={`category-${row.original.category}`} className="scroll-mt-4 bg-copper-wash/50">
                      <th colSpan={4} scope="colgroup" className="border-y border-copper/25 px-3 py-1.5 text-left">
                        <span className="font-serif text-[0.95rem] font-bold text-ink">{info.label}</span>
                        <span className="ml-2 text-xs font-normal text-ink-muted">{info.blurb}</span>
                      </th>
                    </tr>
                  )}
                  <tr className="border-b border-paper-line align-top last:border-b-0 hover:bg-white/50">
                    {row.getVisibleCells().map((cell) => (
                      <td key={cell.id} className={`px-3 py-2.5 ${narrowHidden(cell.column.id)}`}>
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    ))}
                  </tr>
                </Fragment>
              );
            })}
            {rows.length === 0 && (
              <tr>
                <td colSpan={4} className="px-3 py-6 text-center text-ink-muted">
                  Nothing matches “{filter}”. Try a shorter word, or another name for the setting.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </TableScroll>
    </div>
  );
}
