import type { User } from '../../../shared/schemas/user';
import { drawParameterPage, INITIAL_DATA_ID } from '../../../src/entry-server';
import type { ParameterPageData } from '../../../shared/schemas/reading';
import type { InitialData } from '../../../shared/schemas/initial-data';
import type { AppContext } from '../../context';
import { AppError } from '../../lib/errors';
import type { Shell } from '../../lib/html-shell';
import { liveParameterDetail } from '../parameters/routes';
import { anonymousPages, type DrawnPage } from './anonymous-pages';

const anonymous = anonymousPages();

/**
 * A parameter entry's page (/parameters/:slug) as the browser's first render will draw it, with the
 * entry as data; null when the library has no live entry by that name.
 */
export async function parameterPageHtml(ctx: AppContext, shell: Shell, user: User | null, slug: string, url: string): Promise<DrawnPage | null> {
  let detail: ParameterPageData | null;
  try {
    detail = await liveParameterDetail(ctx, slug);
  } catch (err) {
    if (err instanceof AppError && err.status === 404) return null;
    throw err;
  }
  if (!detail) return null;
  const cacheable = user === null && !url.includes('?');
  const cached = cacheable ? anonymous.get(url, [detail]) : undefined;
  if (cached) return cached;
  const data: InitialData = { me: user, parameter: { slug, detail } };
  const html = shell.render({
    appHtml: drawParameterPage(url, data),
    data,
    dataId: INITIAL_DATA_ID,
    title: detail.parameter.name,
    description: detail.parameter.summary,
    preload: ['src/app/routes/parameter.tsx'],
  });
  return cacheable ? anonymous.set(url, [detail], html) : { html };
}
