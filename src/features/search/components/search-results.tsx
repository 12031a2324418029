import { useEffect, useState, type FormEvent } from 'react';
import { useInfiniteQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { LIMITS } from '@shared/constants';
import type { FacetValue, SearchType } from '@shared/schemas/search';
import { Button } from '@/components/ui/button';
import { Card, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { RESULTS_PAGE_SIZE as PAGE, searchQueries, type SearchParams } from '../api/search';
import { FacetList } from './facet-list';
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

type Props = {
  params: SearchParams;
  /** Changes the query or a filter (the page keeps them in the URL). */
  onChange: (next: Partial<Record<'q' | SearchFilterKey, string | undefined>>) => void;
};

/** The search page body: query box, facet lists with counts, results with highlighted snippets, and an empty state. */
export function SearchResults({ params, onChange }: Props) {
  const [draft, setDraft] = useState(params.q);
  const [filtersOpen, setFiltersOpen] = useState(false);
  useEffect(() => setDraft(params.q), [params.q]);
  const results = useInfiniteQuery(searchQueries.page(params));
  // Facets, the total and the corrections come with every page and are the same on each: read the first.
  const page = results.data?.pages[0];
  const hits = results.data?.pages.flatMap((p) => p.data.hits) ?? [];
  const total = page?.meta.total ?? 0;
  const searchedFor = page?.data.searchedFor;
  const didYouMean = page?.data.didYouMean && page.data.didYouMean.toLowerCase() !== searchedFor?.toLowerCase() ? page.data.didYouMean : undefined;
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
      {params.q && results.isError && !results.isFetchNextPageError && (
        <Notice tone="danger" title="The search did not go through">
          {results.error.message}
        </Notice>
      )}

      {params.q && page && (
        <div className={`grid gap-6 ${total > 0 ? 'md:grid-cols-[15rem_1fr]' : ''}`}>
          {total > 0 && (
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
              {total === 0 ? 'No results' : `${total} result${total === 1 ? '' : 's'}`} for “
              <span className="font-semibold text-ink">{searchedFor ?? params.q}</span>”
            </h2>
            {searchedFor && hits.length > 0 && (
              <p className="mb-3 text-sm text-ink-soft" data-testid="searched-for">
                Showing results for <strong className="font-semibold text-ink">{searchedFor}</strong> — you typed “{params.q}”.
              </p>
            )}
            {hits.length === 0 ? (
              <Card className="p-5">
                {didYouMean ? (
                  <p className="text-lg">
                    Did you mean{' '}
                    <button
                      type="button"
                      className="font-semibold text-copper-dark underline"
                      onClick={() => onChange({ q: didYouMean, type: undefined, class: undefined, surface: undefined, parameter: undefined })}
                    >
                      {didYouMean}
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
                {didYouMean && (
                  <p className="mb-3 text-sm text-ink-soft">
                    Nothing matched exactly. Did you mean{' '}
                    <button type="button" className="font-semibold text-copper-dark underline" onClick={() => onChange({ q: didYouMean })}>
                      {didYouMean}
                    </button>
                    ?
                  </p>
                )}
                <ol className={`flex flex-col gap-3 ${results.isPlaceholderData ? 'opacity-60' : ''}`}>
                  {hits.map((h) => (
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
                <div className="mt-4 flex flex-wrap items-center gap-3">
                  <p className="text-sm text-ink-muted" aria-live="polite">
                    {hits.length < total ? `Showing ${hits.length} of ${total}` : total > PAGE ? `All ${total} shown` : null}
                  </p>
                  {results.hasNextPage && (
                    <Button variant="secondary" size="sm" pending={results.isFetchingNextPage} onClick={() => void results.fetchNextPage()}>
                      Show {Math.min(PAGE, total - hits.length)} more
                    </Button>
                  )}
                </div>
                {results.isFetchNextPageError && (
                  <Notice tone="danger" title="The next results did not load">
                    {results.error?.message}
                  </Notice>
                )}
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
