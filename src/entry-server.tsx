// The one entry the server draws pages through: `server/` imports nothing else from `src/`.
import type { ReactNode } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { renderToString } from 'react-dom/server';
import { Route, Routes, StaticRouter } from 'react-router-dom';
import { seedInitialData, type InitialData } from './app/initial-data';
import './app/nav-extras-setup';
import { GuidePage } from './app/routes/guide';
import { GuidesPage } from './app/routes/guides';
import { HomePage } from './app/routes/home';
import { ParameterPage } from './app/routes/parameter';
import { ParametersPage } from './app/routes/parameters';
import { SearchPage } from './app/routes/search';
import { AppLayout } from './components/layout/app-layout';
import { createQueryClient } from './lib/query-client';

// Data shapes come from shared/schemas (initial-data.ts, reading.ts); only behaviour is exported here.
export { INITIAL_DATA_ID } from './app/initial-data';
export { guideFiltersFrom } from './features/guides/api/guides';
export { RESULTS_PAGE_SIZE, searchParamsFrom } from './features/search/api/search';

/** The app's own layout and page components, drawn to HTML from the reads the browser would make. */
function drawApp(url: string, data: InitialData, pages: ReactNode): string {
  const qc = createQueryClient();
  seedInitialData(qc, data);
  return renderToString(
    <QueryClientProvider client={qc}>
      <StaticRouter location={url}>
        <Routes>
          <Route element={<AppLayout />}>{pages}</Route>
        </Routes>
      </StaticRouter>
    </QueryClientProvider>,
  );
}

/** A guide page (`/guides/:slug` or its permalink `/guides/:slug/v/:n`) as the browser's first render draws it. */
export function drawGuidePage(url: string, data: InitialData): string {
  return drawApp(
    url,
    data,
    <>
      <Route path="/guides/:slug" element={<GuidePage />} />
      <Route path="/guides/:slug/v/:n" element={<GuidePage />} />
    </>,
  );
}

/** A parameter entry's page (`/parameters/:slug`) as the browser's first render draws it. */
export function drawParameterPage(url: string, data: InitialData): string {
  return drawApp(url, data, <Route path="/parameters/:slug" element={<ParameterPage />} />);
}

/** The home page (`/`). */
export function drawHomePage(url: string, data: InitialData): string {
  return drawApp(url, data, <Route index element={<HomePage />} />);
}

/** The parameter library (`/parameters`). */
export function drawParametersPage(url: string, data: InitialData): string {
  return drawApp(url, data, <Route path="/parameters" element={<ParametersPage />} />);
}

/** The guides list (`/guides`, its filters in the query). */
export function drawGuidesPage(url: string, data: InitialData): string {
  return drawApp(url, data, <Route path="/guides" element={<GuidesPage />} />);
}

/** The search results page (`/search?q=…`, the search in the query). */
export function drawSearchPage(url: string, data: InitialData): string {
  return drawApp(url, data, <Route path="/search" element={<SearchPage />} />);
}
