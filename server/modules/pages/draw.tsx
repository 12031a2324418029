import type { ReactNode } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { renderToString } from 'react-dom/server';
import { Route, Routes, StaticRouter } from 'react-router-dom';
import { seedInitialData, type InitialData } from '../../../src/app/initial-data';
import '../../../src/app/nav-extras-setup';
import { AppLayout } from '../../../src/components/layout/app-layout';
import { createQueryClient } from '../../../src/lib/query-client';

/** The app's own layout and page components, drawn to HTML from the reads the browser would make. */
export function drawApp(url: string, data: InitialData, pages: ReactNode): string {
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

/**
 * Finished pages for visitors (everyone without a session gets the same page), kept per URL while the
 * reads they were drawn from are the very objects the read cache still holds (identity says "current").
 */
export function anonymousPages(max = 500) {
  const pages = new Map<string, { reads: object[]; html: string }>();
  return {
    get(url: string, reads: object[]) {
      const hit = pages.get(url);
      return hit && hit.reads.length === reads.length && hit.reads.every((r, i) => r === reads[i]) ? hit.html : undefined;
    },
    set(url: string, reads: object[], html: string) {
      if (!pages.has(url) && pages.size >= max) pages.delete(pages.keys().next().value as string);
      pages.set(url, { reads, html });
    },
  };
}
