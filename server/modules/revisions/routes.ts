import { z } from 'zod';
import { guideComparisonSchema, readableGuideRevisionSchema } from '../../../shared/schemas/reading';
import { DOCUMENT_KINDS, REVISION_STATES, type DocumentKind } from '../../../shared/constants';
import { slugSchema } from '../../../shared/schemas/common';
import {
  compareQuerySchema,
  compareResultSchema,
  documentKindSchema,
  documentStatusSchema,
  hideDocumentSchema,
  myRevisionSchema,
  proposeEditSchema,
  rebaseResultSchema,
  readableRevisionSchema,
  restoreRevisionSchema,
  returnRevisionSchema,
  reviewDetailSchema,
  reviewItemSchema,
  reviewQuerySchema,
  revisionHistoryItemSchema,
  revisionSchema,
  submitRevisionSchema,
  unhideDocumentSchema,
} from '../../../shared/schemas/revision';
import { defineRoute, type RouteDef } from '../../lib/route';
import { presentDocumentStatus, presentHistoryItem, presentMyRevision, presentReadableRevision, presentReviewItem, presentRevision } from './presenter';
import { revisionService } from './service';
import { checkRevisionContent } from './checks';
import { contentCheckSchema, reviewApprovalSchema } from '../../../shared/schemas/content-check';
import { hiddenDocumentSchema } from '../../../shared/schemas/audit';
import { hiddenDocuments } from './hidden';

const revisionIdParam = z.object({ id: z.uuid({ message: 'Must be a revision id' }) });
const reviewIdParam = z.object({ revisionId: z.uuid({ message: 'Must be a revision id' }) });
const slugOnly = z.object({ slug: slugSchema });
const slugAndNumber = z.object({ slug: slugSchema, n: z.coerce.number({ message: 'Must be a version number' }).int().positive() });
const revisionEnvelope = z.object({ revision: revisionSchema });
const hiddenState = z.object({ document: documentStatusSchema.extend({ hiddenAt: z.string().nullable(), hiddenReason: z.string().nullable() }) });

/** The history, permalink, compare, propose, restore and hide routes of one document kind (guides and parameters share them). */
function documentRevisionRoutes(kind: DocumentKind): RouteDef[] {
  const base = `/api/${kind}s/:slug`;
  const tag = `${kind}s`;
  const noun = kind === 'guide' ? 'guide' : 'parameter';
  return [
    defineRoute({
      method: 'get',
      path: `${base}/revisions`,
      summary: `History of a ${noun} (readers: live and superseded; authors also their own; moderators all)`,
      tags: [tag, 'revisions'],
      access: 'public',
      owner: { resource: 'revision', rule: 'owner-or-moderator' },
      params: slugOnly,
      response: z.array(revisionHistoryItemSchema),
      handler: async ({ params, user, ctx }) => {
        const { views } = await revisionService(ctx).history(user, kind, params.slug);
        return { data: views.map(presentHistoryItem), meta: { total: views.length } };
      },
    }),
    defineRoute({
      method: 'get',
      path: `${base}/revisions/:n`,
      summary: `One version of a ${noun} by number (permalink)`,
      tags: [tag, 'revisions'],
      access: 'public',
      owner: { resource: 'revision', rule: 'owner-or-moderator' },
      params: slugAndNumber,
      response: z.object({ revision: kind === 'guide' ? readableGuideRevisionSchema : readableRevisionSchema }),
      handler: async ({ params, user, ctx }) => ({
        data: { revision: presentReadableRevision(await revisionService(ctx).byNumber(user, kind, params.slug, params.n)) },
      }),
    }),
    defineRoute({
      method: 'get',
      path: `${base}/compare`,
      summary: `Compare two versions of a ${noun}: changed metadata and a word-level diff of the body`,
      tags: [tag, 'revisions'],
      access: 'public',
      owner: { resource: 'revision', rule: 'owner-or-moderator' },
      params: slugOnly,
      query: compareQuerySchema,
      response: kind === 'guide' ? guideComparisonSchema : compareResultSchema,
      handler: async ({ params, query, user, ctx }) => {
        const r = await revisionService(ctx).compare(user, kind, params.slug, query.from, query.to);
        return {
          data: {
            from: presentRevision(r.from),
            to: presentRevision(r.to),
            changedFields: r.changedFields,
            bodyDiff: r.bodyDiff,
            bodyDiffDetail: r.bodyDiffDetail,
          },
        };
      },
    }),
    defineRoute({
      method: 'post',
      path: `${base}/revisions`,
      summary: `Propose an edit to a ${noun}: a new draft based on its live revision`,
      tags: [tag, 'revisions'],
      access: 'member',
      params: slugOnly,
      body: proposeEditSchema(kind),
      status: 201,
      response: revisionEnvelope,
      handler: async ({ params, body, user, ctx }) => ({
        data: { revision: presentRevision(await revisionService(ctx).createDraft(user, kind, params.slug, body)) },
      }),
    }),
    defineRoute({
      method: 'post',
      path: `${base}/restore`,
      summary: `Restore an older version of a ${noun} as a new live revision, with a reason (moderator); it stays credited to that version's author, who is told`,
      tags: [tag, 'revisions', 'reviews'],
      access: 'moderator',
      params: slugOnly,
      body: restoreRevisionSchema,
      status: 201,
      response: revisionEnvelope,
      handler: async ({ params, body, user, ctx }) => ({
        data: { revision: presentRevision(await revisionService(ctx).restore(user, kind, params.slug, body.number, body.reason, body.note)) },
      }),
    }),
    ...([true, false] as const).map((hide) =>
      defineRoute({
        method: 'post',
        path: `${base}/${hide ? 'hide' : 'unhide'}`,
        summary: hide ? `Hide a ${noun} from readers, with a reason (moderator)` : `Show a hidden ${noun} again (moderator)`,
        tags: [tag, 'reviews'],
        access: 'moderator',
        params: slugOnly,
        body: hide ? hideDocumentSchema : unhideDocumentSchema,
        response: hiddenState,
        handler: async ({ params, body, user, ctx }) => {
          const doc = await revisionService(ctx).setHidden(user, kind, params.slug, hide, (body as { reason?: string }).reason ?? null);
          return { data: { document: { ...presentDocumentStatus(doc, null), hiddenAt: doc.hiddenAt?.toISOString() ?? null, hiddenReason: doc.hiddenReason } } };
        },
      }),
    ),
  ];
}

export const revisionRoutes: RouteDef[] = [
  ...DOCUMENT_KINDS.flatMap(documentRevisionRoutes),
  defineRoute({
    method: 'get',
    path: '/api/hidden',
    summary: 'Guides and parameter entries hidden from readers, most recently hidden first, with who hid them and why (moderators)',
    tags: ['reviews'],
    access: 'moderator',
    response: z.array(hiddenDocumentSchema),
    handler: async ({ ctx }) => {
      const rows = await hiddenDocuments(ctx);
      return { data: rows, meta: { total: rows.length } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/revisions/:id',
    summary: 'A revision with its state, note and return reason (its author and moderators only)',
    tags: ['revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner-or-moderator' },
    params: revisionIdParam,
    response: revisionEnvelope.extend({ document: documentStatusSchema, checks: z.array(contentCheckSchema) }),
    handler: async ({ params, user, ctx }) => {
      const { view, publishedNumber } = await revisionService(ctx).getRevision(user, params.id);
      const checks = await checkRevisionContent(ctx.dataSource, view.doc.kind, view.rev.content, view.rev.setup);
      return { data: { revision: presentRevision(view), document: presentDocumentStatus(view.doc, publishedNumber), checks } };
    },
  }),
  defineRoute({
    method: 'patch',
    path: '/api/revisions/:id',
    summary: "Autosave the author's draft (content fields, note; baseRevisionId only to the live revision)",
    tags: ['revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    params: revisionIdParam,
    // The fields depend on the document kind; the service validates them against its content schema.
    body: z.record(z.string(), z.unknown()),
    response: revisionEnvelope.extend({ checks: z.array(contentCheckSchema) }),
    handler: async ({ params, body, user, ctx }) => {
      // The checks run on every save, so the editor lists them as the author writes.
      const view = await revisionService(ctx).updateDraft(user, params.id, body);
      return { data: { revision: presentRevision(view), checks: await checkRevisionContent(ctx.dataSource, view.doc.kind, view.rev.content, view.rev.setup) } };
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/revisions/:id',
    summary: 'Discard your own draft or sent-back revision (a new guide that was never live goes with its only draft); 409 once submitted, live or superseded',
    tags: ['revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    params: revisionIdParam,
    status: 204,
    handler: async ({ params, user, ctx }) => {
      await revisionService(ctx).discard(user, params.id);
      return { status: 204 };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/revisions/:id/submit',
    summary: 'Send a draft for review with an edit note',
    tags: ['revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    params: revisionIdParam,
    body: submitRevisionSchema,
    response: revisionEnvelope,
    handler: async ({ params, body, user, ctx }) => ({ data: { revision: presentRevision(await revisionService(ctx).submit(user, params.id, body.note)) } }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/revisions/:id/withdraw',
    summary: 'Withdraw a proposal back to a draft',
    tags: ['revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    params: revisionIdParam,
    response: revisionEnvelope,
    handler: async ({ params, user, ctx }) => ({ data: { revision: presentRevision(await revisionService(ctx).withdraw(user, params.id)) } }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/revisions/:id/rebase',
    summary: 'Three-way merge of a stale draft with the live revision (changes nothing; PATCH the result)',
    tags: ['revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    params: revisionIdParam,
    response: rebaseResultSchema,
    handler: async ({ params, user, ctx }) => ({ data: await revisionService(ctx).rebase(user, params.id) }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/me/revisions',
    summary: "The signed-in member's drafts and proposals with their states",
    tags: ['revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'self' },
    query: z.object({ state: z.enum(REVISION_STATES).optional(), kind: documentKindSchema.optional() }),
    response: z.array(myRevisionSchema),
    handler: async ({ query, user, ctx }) => {
      const views = await revisionService(ctx).myRevisions(user, query);
      return { data: views.map(presentMyRevision), meta: { total: views.length } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/reviews/count',
    summary: 'How many proposals the signed-in moderator can review',
    tags: ['reviews'],
    access: 'moderator',
    owner: { resource: 'revision', rule: 'not-owner' },
    response: z.object({ count: z.number().int() }),
    handler: async ({ user, ctx }) => ({ data: { count: await revisionService(ctx).reviewCount(user) } }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/reviews',
    summary: 'The review queue, oldest first (filter by kind and class)',
    tags: ['reviews'],
    access: 'moderator',
    owner: { resource: 'revision', rule: 'any' },
    query: reviewQuerySchema,
    response: z.array(reviewItemSchema),
    handler: async ({ query, user, ctx }) => {
      const views = await revisionService(ctx).reviewQueue(query);
      // Each proposal's automatic findings, so the moderator sees them in the queue (the checks run in memory).
      const items = await Promise.all(
        views.map(async (v) => ({
          ...presentReviewItem(v, user.id),
          checks: await checkRevisionContent(ctx.dataSource, v.doc.kind, v.rev.content, v.rev.setup),
        })),
      );
      return { data: items, meta: { total: items.length, reviewable: items.filter((i) => !i.own).length } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/reviews/:revisionId',
    summary: 'A proposal against the live revision: diff, changed metadata, calculator warnings',
    tags: ['reviews'],
    access: 'moderator',
    owner: { resource: 'revision', rule: 'any' },
    params: reviewIdParam,
    response: reviewDetailSchema,
    handler: async ({ params, user, ctx }) => {
      const r = await revisionService(ctx).reviewDetail(user, params.revisionId);
      return {
        data: {
          revision: presentRevision(r.view),
          live: r.live ? presentRevision(r.live) : null,
          changedFields: r.changedFields,
          bodyDiff: r.bodyDiff,
          bodyDiffDetail: r.bodyDiffDetail,
          workedExamples: r.workedExamples,
          checks: r.checks,
          approval: r.approval,
          setupChanges: r.setupChanges,
          setupWarnings: r.setupWarnings,
          own: r.own,
          stale: r.stale,
          sinceReturn: r.sinceReturn,
        },
      };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/reviews/:revisionId/publish',
    summary:
      'Publish a proposal (not your own); the previous live revision is superseded. A safety-relevant baseline change needs two different moderators: the first call answers 202 with the approval recorded and the revision still in review',
    tags: ['reviews'],
    access: 'moderator',
    owner: { resource: 'revision', rule: 'not-owner' },
    params: reviewIdParam,
    response: revisionEnvelope.extend({ approval: reviewApprovalSchema.optional() }),
    handler: async ({ params, user, ctx }) => {
      const result = await revisionService(ctx).publish(user, params.revisionId);
      if (result.approval) return { status: 202, data: { revision: presentRevision(result), approval: result.approval } };
      return { data: { revision: presentRevision(result) } };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/reviews/:revisionId/return',
    summary: 'Send a proposal back to its author with a reason (not your own)',
    tags: ['reviews'],
    access: 'moderator',
    owner: { resource: 'revision', rule: 'not-owner' },
    params: reviewIdParam,
    body: returnRevisionSchema,
    response: revisionEnvelope,
    handler: async ({ params, body, user, ctx }) => ({
      data: { revision: presentRevision(await revisionService(ctx).returnRevision(user, params.revisionId, body.reason)) },
    }),
  }),
];
