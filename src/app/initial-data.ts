import type { QueryClient } from '@tanstack/react-query';
import type { InitialData } from '@shared/schemas/initial-data';
import { authQueries } from '@/features/auth/api/auth';
import { guideQueries } from '@/features/guides/api/guides';
import { parameterQueries } from '@/features/parameters/api/parameters';
import { searchQueries } from '@/features/search/api/search';

/** The id of the JSON block the server puts in a pre-rendered page (main.tsx looks for it by name too). */
export const INITIAL_DATA_ID = 'tw-initial-data';

/** What the server sends with a pre-rendered page: one schema in shared/, used by both sides. */
export type { InitialData } from '@shared/schemas/initial-data';

/** Puts the server's reads into the query cache under the keys the pages use (server and browser alike). */
export function seedInitialData(qc: QueryClient, data: InitialData) {
  qc.setQueryData(authQueries.me().queryKey, data.me);
  const g = data.guide;
  if (g) {
    qc.setQueryData(guideQueries.detail(g.slug).queryKey, g.detail);
    qc.setQueryData(guideQueries.parameterOptions().queryKey, g.parameters);
    // The permalink query selects the revision out of the `{ revision }` envelope it fetches.
    if (g.version) qc.setQueryData(guideQueries.revision(g.slug, g.version.number).queryKey, { revision: g.version.revision });
  }
  if (data.parameter) qc.setQueryData(parameterQueries.detail(data.parameter.slug).queryKey, data.parameter.detail);
  if (data.library) qc.setQueryData(parameterQueries.list().queryKey, data.library);
  if (data.guides) {
    qc.setQueryData(guideQueries.list(data.guides.filters).queryKey, data.guides.list);
    qc.setQueryData(guideQueries.parameterOptions().queryKey, data.guides.parameters);
  }
  if (data.search) qc.setQueryData(searchQueries.page(data.search.params).queryKey, { pages: [data.search.page], pageParams: [0] });
}

/** The JSON block of a pre-rendered page, if this page is one. */
export function readInitialData(doc: Document = document): InitialData | null {
  const el = doc.getElementById(INITIAL_DATA_ID);
  if (!el?.textContent) return null;
  try {
    return JSON.parse(el.textContent) as InitialData;
  } catch {
    return null; // a broken block only costs the head start; the page loads its data itself
  }
}
