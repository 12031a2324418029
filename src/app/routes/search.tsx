import { useEffect } from 'react';
import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/card';
import { searchParamsFrom } from '@/features/search/api/search';
import { SearchResults, type SearchFilterKey } from '@/features/search/components/search-results';

/** /search?q=…&type=…&class=…&surface=…&parameter=… — everything lives in the URL, so a search can be shared. */
export function SearchPage() {
  const [sp, setSp] = useSearchParams();
  const params = searchParamsFrom(sp);
  useEffect(() => {
    // The same title the server gives the page it draws.
    document.title = `${params.q ? `Search: ${params.q}` : 'Search'} · Tunewright`;
  }, [params.q]);
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
