import { useEffect, useState, type FormEvent } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { LIMITS } from '@shared/constants';
import type { FacetValue, SearchType } from '@shared/schemas/search';
import { Button } from '@/components/ui/button';
import { Card, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { searchQueries, type SearchParams } from '../api/search';
import { HighlightedSnippet } from './highlighted-snippet';
import { TypeBadge } from './type-badge';

export type SearchFilterKey = 'type' | 'class' | 'surface' | 'parameter';
const FACETS: Array<{ key: SearchFilterKey; label: string }> = [
  { key: 'type', label: 'Kind' },
  { key: 'class', label: 'Class' },
  { key: 'surface', label: 'Surface' },
  { key: 'parameter', label: 'Setting discussed' },
];
const STARTERS = ['drag brake', 'throttle punch', 'LVC', 'boost', 'final drive ratio', '17.5T buggy clay'];
const PAGE = 20;

type Props = {
  params: SearchParams;
  /** Changes the query or a filter (the page keeps them in the URL). */
  onChange: (next: Partial<Record<'q' | SearchFilterKey, string | undefined>>) => void;
};

function FacetList({
  label,
  values,
  selected,
  onSelect,
}: {
  label: string;
  values: FacetValue[];
  selected?: string;
  onSelect: (v: string | undefined) => void;
}) {
  const [more, setMore] = useState(false);
  if (!values.length && !selected) return null;
  const shown = more ? values : values.slice(0, 6);
  return (
    <fieldset className="border-b border-paper-line pb-4 last:border-b-0">
      <legend className="mb-2 text-xs font-semibold tracking-wider text-ink-muted uppercase">{label}</legend>
      <ul className="flex flex-col gap-0.5">
        {shown.map((v) => {
          const on = v.value === selected;
          return (
            <li key={v.value}>
              <button
                type="button"
                aria-pressed={on}
                onClick={() => onSelect(on ? undefined : v.value)}
                className={`flex w-full items-center justify-between gap-2 rounded px-2 py-1 text-left text-sm ${on ? 'bg-ink text-paper' : 'text-ink hover:bg-paper-deep'}`}
              >
                <span className="min-w-0 truncate">{v.label}</span>
                <span className={`tabular-nums text-xs ${on ? 'text-paper/80' : 'text-ink-muted'}`}>{v.count}</span>
              </button>
            </li>
          );
        })}
      </ul>
      {values.length > 6 && (
        <button type="button" className="mt-1 px-2 text-xs font-medium text-copper-dark underline" onClick={() => setMore((m) => !m)}>
          {more ? 'Show fewer' : `Show all ${values.length}`}
        </button>
      )}
    </fieldset>
  );
}

/** The search page body: query box, facet lists with counts, results with highlighted snippets, and an empty state. */
export function SearchResults({ params, onChange }: Props) {
  const [draft, setDraft] = useState(params.q);
  const [filtersOpen, setFiltersOpen] = useState(false);
  useEffect(() => setDraft(params.q), [params.q]);
  const results = useQuery(searchQueries.results({ ...params, limit: PAGE }));
  const page = results.data;
  const active = FACETS.filter((f) => params[f.key]);

  const handleSubmit = (e: FormEvent) => {
    e.preventDefault();
    if (draft.trim()) onChange({ q: draft.trim() });
  };

  return (
    <div className="flex flex-col gap-6">
      <form role="search" onSubmit={handleSubmit} className="flex flex-col gap-2 sm:flex-row">
        <label htmlFor="search-page-q" className="sr-only">
          Search for
        </label>
        <input
          id="search-page-q"
          type="search"
          value={draft}
          maxLength={LIMITS.searchQueryMax}
          onChange={(e) => setDraft(e.target.value)}
          placeholder="A setting, a class, a track…"
          className="w-full rounded-md border border-ink/25 bg-white/80 px-3 py-2 text-ink shadow-inner focus:border-copper"
        />
        <Button type="submit">Search</Button>
      </form>

      {!params.q && (
        <Card className="p-5">
          <p className="text-ink-soft">Type a setting by any name you know it by, a class or a track. Misspellings are fine.</p>
          <StarterLinks />
        </Card>
      )}

      {params.q && results.isPending && <Spinner label="Searching…" />}
      {params.q && results.isError && (
        <Notice tone="danger" title="The search did not go through">
          {results.error.message}
        </Notice>
      )}

      {params.q && page && (
        <div className={`grid gap-6 ${page.meta.total > 0 ? 'md:grid-cols-[15rem_1fr]' : ''}`}>
          {page.meta.total > 0 && (
            <aside aria-label="Filter results" className="flex flex-col gap-4">
              <button
                type="button"
                className="self-start rounded-md border border-ink/25 bg-paper-card px-3 py-1.5 text-sm md:hidden"
                aria-expanded={filtersOpen}
                aria-controls="search-facets"
                onClick={() => setFiltersOpen((o) => !o)}
              >
                {filtersOpen ? 'Hide filters' : `Filters${active.length ? ` (${active.length})` : ''}`}
              </button>
              {active.length > 0 && (
                <div className="flex flex-wrap gap-2">
                  {active.map((f) => (
                    <button
                      key={f.key}
                      type="button"
                      onClick={() => onChange({ [f.key]: undefined })}
                      className="rounded-full border border-ink/25 bg-paper-card px-2.5 py-0.5 text-xs hover:bg-paper-deep"
                      aria-label={`Remove filter ${f.label}: ${labelFor(page.data.facets[f.key], params[f.key]!)}`}
                    >
                      {f.label}: {labelFor(page.data.facets[f.key], params[f.key]!)} ✕
                    </button>
                  ))}
                </div>
              )}
              <div id="search-facets" className={`${filtersOpen ? 'flex' : 'hidden'} flex-col gap-4 md:flex`}>
                {FACETS.map((f) => (
                  <FacetList key={f.key} label={f.label} values={page.data.facets[f.key]} selected={params[f.key]} onSelect={(v) => onChange({ [f.key]: v })} />
                ))}
              </div>
            </aside>
          )}

          <section aria-labelledby="results-heading" className="min-w-0">
            <h2 id="results-heading" className="mb-3 text-sm text-ink-muted" aria-live="polite">
              {page.meta.total === 0 ? 'No results' : `${page.meta.total} result${page.meta.total === 1 ? '' : 's'}`} for “
              <span className="font-semibold text-ink">{params.q}</span>”
              {page.meta.total > page.data.hits.length && ` — the best ${page.data.hits.length} shown; narrow with the filters`}
            </h2>
            {page.data.hits.length === 0 ? (
              <Card className="p-5">
                {page.data.didYouMean ? (
                  <p className="text-lg">
                    Did you mean{' '}
                    <button
                      type="button"
                      className="font-semibold text-copper-dark underline"
                      onClick={() => onChange({ q: page.data.didYouMean, type: undefined, class: undefined, surface: undefined, parameter: undefined })}
                    >
                      {page.data.didYouMean}
                    </button>
                    ?
                  </p>
                ) : (
                  <p className="text-lg">Nothing matches that{active.length ? ' with these filters' : ''}.</p>
                )}
                {active.length > 0 && (
                  <p className="mt-2 text-sm text-ink-soft">
                    <button
                      type="button"
                      className="text-copper-dark underline"
                      onClick={() => onChange({ type: undefined, class: undefined, surface: undefined, parameter: undefined })}
                    >
                      Clear the filters
                    </button>{' '}
                    to search everything.
                  </p>
                )}
                <p className="mt-3 text-sm text-ink-soft">Try a setting by another name, fewer words, or one of these:</p>
                <StarterLinks />
              </Card>
            ) : (
              <>
                {page.data.didYouMean && (
                  <p className="mb-3 text-sm text-ink-soft">
                    Nothing matched exactly. Did you mean{' '}
                    <button type="button" className="font-semibold text-copper-dark underline" onClick={() => onChange({ q: page.data.didYouMean })}>
                      {page.data.didYouMean}
                    </button>
                    ?
                  </p>
                )}
                <ol className={`flex flex-col gap-3 ${results.isPlaceholderData ? 'opacity-60' : ''}`}>
                  {page.data.hits.map((h) => (
                    <li key={`${h.type}:${h.slug}`}>
                      <Card className="p-4">
                        <div className="flex flex-wrap items-center gap-2">
                          <TypeBadge type={h.type as SearchType} />
                          <Link to={h.url} className="font-semibold text-ink no-underline hover:underline">
                            {h.title}
                          </Link>
                        </div>
                        <HighlightedSnippet snippet={h.snippet} className="mt-2 text-sm leading-6 text-ink-soft" />
                      </Card>
                    </li>
                  ))}
                </ol>
              </>
            )}
          </section>
        </div>
      )}
    </div>
  );
}

function labelFor(values: FacetValue[], value: string) {
  return values.find((v) => v.value === value)?.label ?? value;
}

function StarterLinks() {
  return (
    <ul className="mt-3 flex flex-wrap gap-2">
      {STARTERS.map((s) => (
        <li key={s}>
          <Link
            to={`/search?q=${encodeURIComponent(s)}`}
            className="inline-block rounded-full border border-ink/20 bg-paper px-3 py-1 text-sm text-ink no-underline hover:bg-paper-deep"
          >
            {s}
          </Link>
        </li>
      ))}
    </ul>
  );
}
