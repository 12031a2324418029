import { z } from 'zod';
import { runMappingSchema } from '../../../shared/runlog/mapping';
import { RUNLOG_LIMITS, RUNLOG_SCHEMA_PATH } from '../../../shared/runlog/vocabulary';
import {
  runCompareSchema,
  runListItemSchema,
  runMetadataJsonSchema,
  runPatchSchema,
  runPreviewSchema,
  runSchema,
  runSeriesSchema,
} from '../../../shared/schemas/run';
import { uuidParam } from '../../../shared/schemas/common';
import { defineRoute, type RouteDef } from '../../lib/route';
import { compareRuns } from './compare';
import { presentRun, presentRunListItem } from './presenter';
import { createRun, deleteRun, getRun, listRuns, previewRun, runSeries, runLabels, updateRun } from './service';
import { parseRunUpload } from './upload';
import { evidenceRoutes } from './evidence-routes';

/** The text fields sent beside the file; `mapping` is a JSON string (multipart fields are text). */
export const runFieldsSchema = z.strictObject({
  title: z.string().trim().max(RUNLOG_LIMITS.titleMax, `A title is at most ${RUNLOG_LIMITS.titleMax} characters`).optional(),
  setupId: z
    .union([z.literal(''), z.uuid({ message: 'Must be the id of one of your setups' })])
    .optional()
    .transform((v) => v || undefined),
  motorId: z
    .union([z.literal(''), z.uuid({ message: 'Must be the id of one of your registered motors' })])
    .optional()
    .transform((v) => v || undefined),
  mapping: z
    .string()
    .max(16 * 1024)
    .optional()
    .transform((text, ctx) => {
      if (!text) return undefined;
      try {
        return JSON.parse(text) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'The mapping must be JSON: {"<channel>": {"column": "<header>", "unit": "<unit>"}}' });
        return z.NEVER;
      }
    })
    .pipe(runMappingSchema.optional()),
});

const seriesQuery = z.strictObject({
  points: z.coerce
    .number({ error: 'points must be a number' })
    .int('points must be a whole number')
    .min(10, 'points must be at least 10')
    .max(RUNLOG_LIMITS.maxSeriesPoints, `points must be at most ${RUNLOG_LIMITS.maxSeriesPoints}`)
    .default(1000),
});
const compareQuery = z.strictObject({ a: z.uuid({ message: 'a must be a run id' }), b: z.uuid({ message: 'b must be a run id' }) });
const RUN_OWNER = { resource: 'run', rule: 'owner' } as const;

export const runRoutes: RouteDef[] = [
  defineRoute({
    method: 'get',
    path: RUNLOG_SCHEMA_PATH,
    summary: 'JSON Schema (2020-12) of run-log metadata (tunewright.runlog), version 1',
    tags: ['runs'],
    access: 'public',
    download: true,
    handler: ({ res, ctx }) => {
      res.setHeader('Cache-Control', 'public, max-age=3600');
      res
        .type('application/schema+json')
        .status(200)
        .send(JSON.stringify(runMetadataJsonSchema(`${ctx.config.appUrl}${RUNLOG_SCHEMA_PATH}`), null, 2));
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/runs',
    summary: 'Your run logs, newest first',
    tags: ['runs'],
    access: 'member',
    owner: { resource: 'run', rule: 'self' },
    response: z.array(runListItemSchema),
    handler: async ({ user, ctx }) => {
      const rows = await listRuns(ctx.dataSource, user.id);
      const labels = await runLabels(ctx.dataSource, rows);
      return { data: rows.map((r) => presentRunListItem(r, labels, user)), meta: { count: rows.length } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/runs/compare',
    summary: 'Compare two runs: both summaries, differences (b − a), the offset aligning their first sustained full throttle, settings that differ',
    tags: ['runs'],
    access: 'public',
    owner: RUN_OWNER,
    query: compareQuery,
    response: runCompareSchema,
    handler: async ({ query, user, ctx }) => ({ data: await compareRuns(ctx, user, query.a, query.b) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/runs/preview',
    summary: 'Read an upload without storing it: header, first rows, proposed (or given) mapping, notes, figures or the first problem',
    tags: ['runs'],
    access: 'member',
    multipart: true,
    rateLimit: 'upload',
    before: [parseRunUpload],
    body: runFieldsSchema,
    response: runPreviewSchema,
    handler: async ({ req, body, user, ctx }) => ({ data: await previewRun(ctx, user.id, req.file, body) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/runs',
    summary: `Upload a run log (multipart: file, optional title, setupId, mapping as JSON; ${RUNLOG_LIMITS.fileBytes / 1024 / 1024} MB at most)`,
    tags: ['runs'],
    access: 'member',
    multipart: true,
    rateLimit: 'upload',
    status: 201,
    before: [parseRunUpload],
    body: runFieldsSchema,
    response: runSchema,
    handler: async ({ req, body, user, ctx }) => {
      const row = await createRun(ctx, user.id, req.file, body);
      return { status: 201, data: presentRun(row, await runLabels(ctx.dataSource, [row]), user) };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/runs/:id',
    summary: 'One of your runs (or a run that is evidence on a live guide revision)',
    tags: ['runs'],
    access: 'public',
    owner: RUN_OWNER,
    params: uuidParam,
    response: runSchema,
    handler: async ({ params, user, ctx }) => {
      const row = await getRun(ctx.dataSource, user, params.id);
      return { data: presentRun(row, await runLabels(ctx.dataSource, [row]), user) };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/runs/:id/series',
    summary: "A run's channels for a chart: each channel's minimum and maximum in each of at most `points` time buckets",
    tags: ['runs'],
    access: 'public',
    owner: RUN_OWNER,
    params: uuidParam,
    query: seriesQuery,
    response: runSeriesSchema,
    handler: async ({ params, query, user, ctx }) => ({ data: await runSeries(ctx, await getRun(ctx.dataSource, user, params.id), query.points) }),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/runs/:id',
    summary: 'Change one of your runs: its title, the setup it was run on and the registered motor it used (your own; null detaches)',
    tags: ['runs'],
    access: 'member',
    owner: RUN_OWNER,
    params: uuidParam,
    body: runPatchSchema,
    response: runSchema,
    handler: async ({ params, body, user, ctx }) => {
      const row = await updateRun(ctx, user, params.id, body);
      return { data: presentRun(row, await runLabels(ctx.dataSource, [row]), user) };
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/runs/:id',
    summary: 'Delete one of your runs',
    tags: ['runs'],
    access: 'member',
    owner: RUN_OWNER,
    params: uuidParam,
    status: 204,
    handler: async ({ params, user, ctx }) => {
      await deleteRun(ctx, user, params.id);
    },
  }),
  ...evidenceRoutes,
];
