import { z } from 'zod';
import type { Request, Response } from 'express';
import { ROLE_RANK } from '../../../shared/constants';
import { changeSchema, changesQuerySchema } from '../../../shared/schemas/change';
import type { User } from '../../../shared/schemas/user';
import type { AppContext } from '../../context';
import { toFieldIssues, defineRoute, type RouteDef } from '../../lib/route';
import { validationFailed } from '../../lib/errors';
import { changesAtom } from './atom';
import { changesService } from './service';

const isModerator = (u: User | null) => !!u && ROLE_RANK[u.role] >= ROLE_RANK.moderator;

export const changeRoutes: RouteDef[] = [
  defineRoute({
    method: 'get',
    path: '/api/changes',
    summary: 'Recent live changes (new versions, restores, hides), newest first; filter by kind, class and author',
    tags: ['changes'],
    access: 'public',
    query: changesQuerySchema,
    response: z.array(changeSchema),
    handler: async ({ query, user, ctx }) => {
      const data = await changesService(ctx).list(query, isModerator(user));
      return { data, meta: { total: data.length, limit: query.limit } };
    },
  }),
];

/**
 * GET /changes.atom: the same list as an Atom feed, as a visitor sees it whoever asks (feed readers
 * share and cache feeds), with the same filters. Lives outside /api because it is not a JSON envelope.
 */
export function changesFeed(ctx: AppContext) {
  return async (req: Request, res: Response) => {
    const parsed = changesQuerySchema.safeParse(req.query);
    if (!parsed.success) throw validationFailed(toFieldIssues(parsed.error, 'query'));
    const changes = await changesService(ctx).list(parsed.data, false);
    const self = `${ctx.config.appUrl}${req.originalUrl}`;
    res.setHeader('Cache-Control', 'public, max-age=300');
    res.type('application/atom+xml; charset=utf-8').send(changesAtom(ctx.config.appUrl, changes, self));
  };
}
