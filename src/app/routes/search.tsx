import { useSearchParams } from 'react-router-dom';
import { CLASS_SLUGS, SURFACE_SLUGS } from '@shared/constants';
import { SEARCH_TYPES, type SearchType } from '@shared/schemas/search';
import { PageHeader } from '@/components/ui/card';
import { SearchResults, type SearchFilterKey } from '@/features/search/components/search-results';

const pick = <T extends string>(value: string | null, allowed: readonly T[]) =>
  value && (allowed as readonly string[]).includes(value) ? (value as T) : undefined;

/** /search?q=…&type=…&class=…&surface=…&parameter=… — everything lives in the URL, so a search can be shared. */
export function SearchPage() {
  const [sp, setSp] = useSearchParams();
  const params = {
    q: (sp.get('q') ?? '').trim(),
    type: pick<SearchType>(sp.get('type'), SEARCH_TYPES),
    class: pick(sp.get('class'), CLASS_SLUGS),
    surface: pick(sp.get('surface'), SURFACE_SLUGS),
    parameter: /^[a-z0-9-]{1,80}$/.test(sp.get('parameter') ?? '') ? sp.get('parameter')! : undefined,
  };
  const handleChange = (next: Partial<Record<'q' | SearchFilterKey, string | undefined>>) => {
    const out = new URLSearchParams(sp);
    for (const [k, v] of Object.entries(next)) {
      if (v) out.set(k, v);
      else out.delete(k);
    }
    setSp(out);
  };
  return (
    <div>
      <PageHeader eyebrow="Search" title={params.q ? `“${params.q}”` : 'Search the notebook'}>
        Settings by any name, guides by class, surface and track, and their baseline setups. Only reviewed, live pages appear.
      </PageHeader>
      <SearchResults params={params} onChange={handleChange} />
    </div>
  );
}
