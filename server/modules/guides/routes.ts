import { z } from 'zod';
import { guideDetailSchema } from '../../../shared/schemas/reading';
import { CLASSES, SURFACES } from '../../../shared/constants';
import { slugSchema } from '../../../shared/schemas/common';
import { createGuideSchema, guideListQuerySchema, guideSummarySchema, taxonomySchema, type GuideListQuery } from '../../../shared/schemas/guide';
import type { AppContext } from '../../context';
import { revisionSchema } from '../../../shared/schemas/revision';
import { defineRoute } from '../../lib/route';
import { presentGuideRecord, presentGuideSummary, presentReadableRevision, presentRevision } from '../revisions/presenter';
import { revisionService } from '../revisions/service';
import { isModerator } from '../revisions/policy';
import { publishedCache } from '../revisions/read-cache';

const DEFAULT_LIST: GuideListQuery = guideListQuerySchema.parse({});
const isDefaultList = (q: GuideListQuery) =>
  !q.class && !q.surface && !q.parameter && !q.tag && !q.q && q.page === DEFAULT_LIST.page && q.pageSize === DEFAULT_LIST.pageSize;

/**
 * Live guides as GET /api/guides answers them (the server-drawn list sends the same). The unfiltered
 * first page, what nearly every reader asks for, is kept until any document changes; filtered lists are
 * read each time (their combinations are many and each is rarely asked twice).
 */
export async function liveGuideList(ctx: AppContext, query: GuideListQuery) {
  const load = async () => {
    const { views, total } = await revisionService(ctx).listLiveGuides(query);
    return { list: views.map(presentGuideSummary), total };
  };
  return isDefaultList(query) ? ((await publishedCache(ctx).readAcross('guide-list', load)) ?? (await load())) : load();
}

export const guideRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/taxonomy',
    summary: 'Classes and surfaces guides are filed under',
    tags: ['guides'],
    access: 'public',
    response: taxonomySchema,
    handler: () => ({
      data: { classes: CLASSES.map((c) => ({ slug: c.slug, name: c.name })), surfaces: SURFACES.map((s) => ({ slug: s.slug, name: s.name })) },
    }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/guides',
    summary: 'Live guides, newest first (filters: class, surface, parameter, tag, q)',
    tags: ['guides'],
    access: 'public',
    query: guideListQuerySchema,
    response: z.array(guideSummarySchema),
    handler: async ({ query, ctx }) => {
      const { list, total } = await liveGuideList(ctx, query);
      return { data: list, meta: { total, page: query.page, pageSize: query.pageSize } };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/guides',
    summary: 'Start a new guide: the slug comes from the title, revision 1 is your draft',
    tags: ['guides'],
    access: 'member',
    body: createGuideSchema,
    status: 201,
    response: z.object({ guide: z.object({ slug: z.string() }), revision: revisionSchema }),
    handler: async ({ body, user, ctx }) => {
      const v = await revisionService(ctx).createDocument(user, 'guide', body);
      return { data: { guide: { slug: v.doc.slug }, revision: presentRevision(v) } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/guides/:slug',
    summary: 'A live guide with its published revision (404 when hidden, except for moderators)',
    tags: ['guides'],
    access: 'public',
    params: z.object({ slug: slugSchema }),
    response: guideDetailSchema,
    handler: async ({ params, user, ctx }) => ({
      data: await revisionService(ctx).readLive(user, 'guide', params.slug, 'guide-detail', (v) => ({
        guide: presentGuideRecord(v, { withHiddenReason: isModerator(user) }),
        revision: presentReadableRevision(v),
      })),
    }),
  }),
];
