import type { User } from '../../../shared/schemas/user';
import { drawGuidePage, INITIAL_DATA_ID } from '../../../src/entry-server';
import type { GuideDetail, ReadableGuideRevision } from '../../../shared/schemas/reading';
import type { InitialData } from '../../../shared/schemas/initial-data';
import type { AppContext } from '../../context';
import { AppError } from '../../lib/errors';
import type { Shell } from '../../lib/html-shell';
import { liveParameterSummaries } from '../parameters/routes';
import { isModerator } from '../revisions/policy';
import { presentGuideRecord, presentReadableRevision } from '../revisions/presenter';
import { revisionService } from '../revisions/service';
import { anonymousPages, type DrawnPage } from './anonymous-pages';

// Visitors all get the same page for a live guide, so it is kept until the guide (or the library) changes.
const anonymous = anonymousPages();

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
): Promise<DrawnPage | null> {
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
  const parameters = await liveParameterSummaries(ctx);
  const data: InitialData = { me: user, guide: { slug, detail, version, parameters } };
  const shown = version?.revision ?? detail.revision;

  const cacheable = user === null && number == null && !url.includes('?');
  // Both reads are the read cache's own objects while nothing changed.
  const cached = cacheable ? anonymous.get(url, [detail, parameters]) : undefined;
  if (cached) return cached;
  const html = shell.render({
    appHtml: drawGuidePage(url, data),
    data,
    dataId: INITIAL_DATA_ID,
    title: shown.content.title,
    description: shown.content.summary,
    preload: ['src/app/routes/guide.tsx'],
  });
  return cacheable ? anonymous.set(url, [detail, parameters], html) : { html };
}
