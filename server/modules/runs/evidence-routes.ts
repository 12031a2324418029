import { z } from 'zod';
import { runListItemSchema } from '../../../shared/schemas/run';
import { slugParam, uuidParam } from '../../../shared/schemas/common';
import { defineRoute, type RouteDef } from '../../lib/route';
import { attachEvidence, detachEvidence, guideEvidence, listEvidence } from './evidence';

const evidenceParams = z.strictObject({ id: z.uuid({ message: 'Must be an id' }), runId: z.uuid({ message: 'Must be a run id' }) });

/** Runs as evidence on guide revisions: attached by the author to their draft, public once the revision is live. */
export const evidenceRoutes: RouteDef[] = [
  defineRoute({
    method: 'get',
    path: '/api/revisions/:id/runs',
    summary: 'Runs offered as evidence on a revision, with their figures (the author and moderators; anyone once it is public)',
    tags: ['runs', 'revisions'],
    access: 'public',
    owner: { resource: 'revision', rule: 'owner-or-moderator' },
    params: uuidParam,
    response: z.array(runListItemSchema),
    handler: async ({ params, user, ctx }) => ({ data: await listEvidence(ctx.dataSource, user, params.id) }),
  }),
  defineRoute({
    method: 'put',
    path: '/api/revisions/:id/runs/:runId',
    summary: 'Offer one of your runs as evidence on your own draft guide revision (it becomes public only when that revision is published)',
    tags: ['runs', 'revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    params: evidenceParams,
    response: z.array(runListItemSchema),
    handler: async ({ params, user, ctx }) => ({ data: await attachEvidence(ctx, user, params.id, params.runId) }),
  }),
  defineRoute({
    method: 'delete',
    path: '/api/revisions/:id/runs/:runId',
    summary: 'Take a run off your own draft guide revision',
    tags: ['runs', 'revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    params: evidenceParams,
    status: 204,
    handler: async ({ params, user, ctx }) => {
      await detachEvidence(ctx, user, params.id, params.runId);
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/guides/:slug/evidence',
    summary: "Runs offered as evidence on a guide's live revision",
    tags: ['runs', 'guides'],
    access: 'public',
    params: slugParam,
    response: z.array(runListItemSchema),
    handler: async ({ params, user, ctx }) => ({ data: await guideEvidence(ctx.dataSource, user, params.slug) }),
  }),
];
