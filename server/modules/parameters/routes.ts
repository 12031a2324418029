import { z } from 'zod';
import { parameterPageDataSchema } from '../../../shared/schemas/reading';
import { slugParam } from '../../../shared/schemas/common';
import { parameterSummarySchema } from '../../../shared/schemas/parameter';
import type { AppContext } from '../../context';
import { defineRoute } from '../../lib/route';
import { presentLiveRevision, presentParameterDetail, presentParameterSummary } from './presenter';
import { parametersService } from './service';
import { publishedCache } from '../revisions/read-cache';

/** The library list as readers get it (cached until any document changes). */
export async function liveParameterSummaries(ctx: AppContext) {
  return (await publishedCache(ctx).readAcross('parameter-library', async () => (await parametersService(ctx).listLive()).map(presentParameterSummary))) ?? [];
}

/** One live entry as GET /api/parameters/:slug answers it (the server-drawn page sends the same object). */
export function liveParameterDetail(ctx: AppContext, slug: string) {
  // Related entries and the guides list span other documents, so this view is dropped on any change.
  return publishedCache(ctx).readAcross(`parameter-detail:${slug}`, async () => {
    const { parameter, relatedParameters, guides } = await parametersService(ctx).getLive(slug);
    return { parameter: presentParameterDetail(parameter, relatedParameters, guides), revision: presentLiveRevision(parameter) };
  });
}

export const parameterRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/parameters',
    summary: 'The parameter library: every live entry, by category then name',
    tags: ['parameters'],
    access: 'public',
    response: z.array(parameterSummarySchema),
    handler: async ({ ctx }) => ({ data: await liveParameterSummaries(ctx) }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/parameters/:slug',
    summary: 'One parameter entry (its live revision), with related entries and the guides that discuss it',
    tags: ['parameters'],
    access: 'public',
    params: slugParam,
    response: parameterPageDataSchema,
    handler: async ({ params, ctx }) => ({ data: await liveParameterDetail(ctx, params.slug) }),
  }),
];
