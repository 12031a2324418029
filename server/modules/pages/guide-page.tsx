import { QueryClientProvider } from '@tanstack/react-query';
import { renderToString } from 'react-dom/server';
import { Route, Routes, StaticRouter } from 'react-router-dom';
import type { User } from '../../../shared/schemas/user';
import type { GuideDetail, ReadableGuideRevision } from '../../../src/features/guides/api/guides';
import { INITIAL_DATA_ID, seedInitialData, type InitialData } from '../../../src/app/initial-data';
import '../../../src/app/nav-extras-setup';
import { GuidePage } from '../../../src/app/routes/guide';
import { AppLayout } from '../../../src/components/layout/app-layout';
import { createQueryClient } from '../../../src/lib/query-client';
import type { AppContext } from '../../context';
import { AppError } from '../../lib/errors';
import type { Shell } from '../../lib/html-shell';
import { liveParameterSummaries } from '../parameters/routes';
import { isModerator } from '../revisions/policy';
import { presentGuideRecord, presentReadableRevision } from '../revisions/presenter';
import { revisionService } from '../revisions/service';

const CACHE_MAX = 500;
// Visitors all get the same page for a live guide, so it is kept until the guide (or the library) changes.
const anonymous = new Map<string, { detail: object; parameters: object; html: string }>();

function draw(url: string, data: InitialData): string {
  const qc = createQueryClient();
  seedInitialData(qc, data);
  return renderToString(
    <QueryClientProvider client={qc}>
      <StaticRouter location={url}>
        <Routes>
          <Route element={<AppLayout />}>
            <Route path="/guides/:slug" element={<GuidePage />} />
            <Route path="/guides/:slug/v/:n" element={<GuidePage />} />
          </Route>
        </Routes>
      </StaticRouter>
    </QueryClientProvider>,
  );
}

/**
 * The guide page (/guides/:slug or its permalink /guides/:slug/v/:n) as the browser's first render
 * will draw it — the app's own components fed the reads the browser would make, in the built shell
 * with those reads as data — or null when there is no such guide or version for this reader (the
 * browser then shows its own "not found").
 */
export async function guidePageHtml(
  ctx: AppContext,
  shell: Shell,
  user: User | null,
  slug: string,
  number: number | null,
  url: string,
): Promise<string | null> {
  const revisions = revisionService(ctx);
  let detail: GuideDetail;
  let version: { number: number; revision: ReadableGuideRevision } | undefined;
  try {
    // The same reads the API routes answer with (and the same cache), so the page matches the API.
    detail = await revisions.readLive(user, 'guide', slug, 'guide-detail', (v) => ({
      guide: presentGuideRecord(v, { withHiddenReason: isModerator(user) }),
      revision: presentReadableRevision(v) as ReadableGuideRevision,
    }));
    if (number != null) version = { number, revision: presentReadableRevision(await revisions.byNumber(user, 'guide', slug, number)) as ReadableGuideRevision };
  } catch (err) {
    if (err instanceof AppError && err.status === 404) return null;
    throw err;
  }
  const data: InitialData = { me: user, guide: { slug, detail, version, parameters: await liveParameterSummaries(ctx) } };
  const shown = version?.revision ?? detail.revision;

  const parameters = data.guide.parameters;
  const cacheable = user === null && number == null && !url.includes('?');
  const cached = cacheable ? anonymous.get(url) : undefined;
  // Both reads are the read cache's own objects while nothing changed, so identity says "still current".
  if (cached && cached.detail === detail && cached.parameters === parameters) return cached.html;
  const html = shell.render({
    appHtml: draw(url, data),
    data,
    dataId: INITIAL_DATA_ID,
    title: shown.content.title,
    description: shown.content.summary,
    preload: ['src/app/routes/guide.tsx'],
  });
  if (cacheable) {
    if (anonymous.size >= CACHE_MAX) anonymous.delete(anonymous.keys().next().value as string);
    anonymous.set(url, { detail, parameters, html });
  }
  return html;
}
