import { useQuery } from '@tanstack/react-query';
import { useSearchParams } from 'react-router-dom';
import { SelectField } from '@/components/ui/field';
import { GUIDE_FILTER_KEYS as KEYS, guideFiltersFrom, guideQueries, type GuideFilters } from '../api/guides';

/** The list filters, read from the URL query so a filtered list can be linked and bookmarked. */
export function useGuideFilters(): [GuideFilters, (key: (typeof KEYS)[number], value: string) => void, () => void] {
  const [params, setParams] = useSearchParams();
  const filters = guideFiltersFrom(params);
  const set = (key: (typeof KEYS)[number], value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };
  const clear = () => setParams(new URLSearchParams(), { replace: true });
  return [filters, set, clear];
}

export function GuideFiltersBar() {
  const [filters, set, clear] = useGuideFilters();
  const taxonomy = useQuery(guideQueries.taxonomy()).data;
  const parameters = useQuery(guideQueries.parameterOptions()).data ?? [];
  const active = Object.keys(filters).length > 0;
  return (
    <form role="search" aria-label="Filter guides" className="grid gap-3 sm:grid-cols-[1fr_1fr_1fr_auto] sm:items-end" onSubmit={(e) => e.preventDefault()}>
      <SelectField label="Class" value={filters.class ?? ''} onChange={(e) => set('class', e.target.value)}>
        <option value="">All classes</option>
        {taxonomy?.classes.map((c) => (
          <option key={c.slug} value={c.slug}>
            {c.name}
          </option>
        ))}
      </SelectField>
      <SelectField label="Surface" value={filters.surface ?? ''} onChange={(e) => set('surface', e.target.value)}>
        <option value="">All surfaces</option>
        {taxonomy?.surfaces.map((s) => (
          <option key={s.slug} value={s.slug}>
            {s.name}
          </option>
        ))}
      </SelectField>
      <SelectField label="Setting discussed" value={filters.parameter ?? ''} onChange={(e) => set('parameter', e.target.value)}>
        <option value="">Any setting</option>
        {filters.parameter && !parameters.some((p) => p.slug === filters.parameter) && <option value={filters.parameter}>{filters.parameter}</option>}
        {parameters.map((p) => (
          <option key={p.slug} value={p.slug}>
            {p.name}
          </option>
        ))}
      </SelectField>
      {filters.tag && (
        <p className="text-sm sm:col-span-4">
          Tagged <span className="font-semibold">“{filters.tag}”</span>{' '}
          <button type="button" onClick={() => set('tag', '')} className="ml-1 underline" aria-label={`Remove the tag filter ${filters.tag}`}>
            remove
          </button>
        </p>
      )}
      <button
        type="button"
        onClick={clear}
        disabled={!active}
        className="rounded-md border border-ink/25 bg-paper-card px-3 py-2 text-sm font-medium hover:bg-paper-deep disabled:opacity-50"
      >
        Clear filters
      </button>
    </form>
  );
}
