import { guideListQuerySchema } from '../../../shared/schemas/guide';
import { searchQuerySchema } from '../../../shared/schemas/search';
import type { User } from '../../../shared/schemas/user';
import {
  drawGuidesPage,
  drawHomePage,
  drawParametersPage,
  drawSearchPage,
  guideFiltersFrom,
  INITIAL_DATA_ID,
  RESULTS_PAGE_SIZE,
  searchParamsFrom,
} from '../../../src/entry-server';
import type { InitialData } from '../../../shared/schemas/initial-data';
import type { AppContext } from '../../context';
import type { Shell } from '../../lib/html-shell';
import { liveGuideList } from '../guides/routes';
import { liveParameterSummaries } from '../parameters/routes';
import { searchAnswer } from '../search/routes';
import { anonymousPages, type DrawnPage } from './anonymous-pages';

// Visitors' finished pages, each kept while the reads it was drawn from are the read cache's current objects.
const anonymous = anonymousPages(50);

const queryOf = (url: string) => new URLSearchParams(url.includes('?') ? url.slice(url.indexOf('?') + 1) : '');

/** Kept for visitors only at its plain address (no query: every visitor asking for it gets the same page). */
function keep(user: User | null, url: string, reads: object[], draw: () => string): DrawnPage {
  const cacheable = user === null && !url.includes('?');
  const cached = cacheable ? anonymous.get(url, reads) : undefined;
  if (cached) return cached;
  const html = draw();
  return cacheable ? anonymous.set(url, reads, html) : { html };
}

/** The home page (/): nothing to read but who is signing in. */
export function homePageHtml(_ctx: AppContext, shell: Shell, user: User | null, url: string): DrawnPage {
  const data: InitialData = { me: user };
  return keep(user, url, [], () => shell.render({ appHtml: drawHomePage(url, data), data, dataId: INITIAL_DATA_ID, preload: ['src/app/routes/home.tsx'] }));
}

/** The parameter library (/parameters) from the list GET /api/parameters answers with. */
export async function parametersPageHtml(ctx: AppContext, shell: Shell, user: User | null, url: string): Promise<DrawnPage> {
  const library = await liveParameterSummaries(ctx);
  const data: InitialData = { me: user, library };
  return keep(user, url, [library], () =>
    shell.render({
      appHtml: drawParametersPage(url, data),
      data,
      dataId: INITIAL_DATA_ID,
      title: 'Parameter library',
      preload: ['src/app/routes/parameters.tsx'],
    }),
  );
}

/**
 * The guides list (/guides?class=…&surface=…&parameter=…) from what GET /api/guides answers for those
 * filters; null (the browser draws it, and shows the API's own message) when the filters are not valid.
 */
export async function guidesPageHtml(ctx: AppContext, shell: Shell, user: User | null, url: string): Promise<DrawnPage | null> {
  const filters = guideFiltersFrom(queryOf(url));
  const query = guideListQuerySchema.safeParse(filters);
  if (!query.success) return null;
  const [{ list }, parameters] = await Promise.all([liveGuideList(ctx, query.data), liveParameterSummaries(ctx)]);
  const data: InitialData = { me: user, guides: { filters, list, parameters } };
  return keep(user, url, [list, parameters], () =>
    shell.render({ appHtml: drawGuidesPage(url, data), data, dataId: INITIAL_DATA_ID, title: 'Guides', preload: ['src/app/routes/guides.tsx'] }),
  );
}

/**
 * The search results page (/search?q=…) with the first page of results GET /api/search answers for the
 * query in its URL. Not kept: every query is its own page, and searching is cheaper than a cache entry
 * per query would be (a few milliseconds; see DEVELOPERS.md). Null when the query is not one the API
 * accepts (too long): the browser draws it and shows the API's message.
 */
export function searchPageHtml(ctx: AppContext, shell: Shell, user: User | null, url: string): DrawnPage | null {
  const params = searchParamsFrom(queryOf(url));
  const data: InitialData = { me: user };
  if (params.q) {
    const query = searchQuerySchema.safeParse({ ...params, limit: RESULTS_PAGE_SIZE, offset: 0 });
    if (!query.success) return null;
    const page = searchAnswer(ctx, query.data);
    // How long the search took is left out (no reader sees it), so the same results make the same page and ETag (304s).
    data.search = { params, page: { ...page, meta: { ...page.meta, tookMs: 0 } } };
  }
  return {
    html: shell.render({
      appHtml: drawSearchPage(url, data),
      data,
      dataId: INITIAL_DATA_ID,
      title: params.q ? `Search: ${params.q}` : 'Search',
      preload: ['src/app/routes/search.tsx'],
    }),
  };
}
