import type { Response } from 'express';
import { z } from 'zod';
import { SETUP_SCHEMA_PATHS, SETUP_SCHEMA_VERSIONS, setupRecordJsonSchema, setupRecordStructureSchema } from '../../../shared/schemas/setup-record';
import { compareSideSchema, setupLibrarySchema, setupRefSchema, setupUploadSchema, settingDefinitionSchema } from '../../../shared/schemas/setup';
import { slugParam, uuidParam } from '../../../shared/schemas/common';
import { computeSetup } from '../../../shared/setup/computed';
import { setupToCsv } from '../../../shared/setup/csv';
import { defineRoute, type RouteDef } from '../../lib/route';
import { presentBaseline, presentUpload, presentUploadListItem } from './presenter';
import {
  attachToRevision,
  compareRefs,
  createUpload,
  deleteUpload,
  detachFromRevision,
  getUpload,
  guideBaseline,
  listBaselines,
  listUploads,
  loadSettingLibrary,
} from './service';
import { parseSetupUpload } from './upload';

/** RFC 6266 / RFC 8187: an ASCII fallback name plus the exact name as UTF-8 in filename*. */
export function contentDisposition(filename: string): string {
  const fallback = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\%]/g, '_');
  const encoded = encodeURIComponent(filename).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `attachment; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}

function sendFile(res: Response, body: string | Buffer, contentType: string, filename: string) {
  res.setHeader('Content-Type', contentType);
  res.setHeader('Content-Disposition', contentDisposition(filename));
  res.status(200).send(body);
}

const compareQuery = z.object({
  a: setupRefSchema,
  b: setupRefSchema,
  rpm: z.coerce
    .number({ error: 'rpm must be a number' })
    .int('rpm must be a whole number')
    .min(0, 'rpm must be at least 0')
    .max(150_000, 'rpm must be at most 150,000')
    .optional(),
});

const recordBody = z.record(z.string(), z.unknown(), { error: 'Send the setup record as a JSON object' });

export const setupRoutes: RouteDef[] = [
  // One JSON Schema per version the server reads (version 1 stays published for files written before version 2).
  ...SETUP_SCHEMA_VERSIONS.map((version) =>
    defineRoute({
      method: 'get',
      path: SETUP_SCHEMA_PATHS[version],
      summary: `JSON Schema (2020-12) of the tunewright.setup record, version ${version}`,
      tags: ['setups'],
      access: 'public',
      download: true,
      handler: ({ res, ctx }) => {
        const schema = setupRecordJsonSchema(`${ctx.config.appUrl}${SETUP_SCHEMA_PATHS[version]}`, version);
        res.setHeader('Cache-Control', 'public, max-age=3600');
        res
          .type('application/schema+json')
          .status(200)
          .send(JSON.stringify(schema, null, 2));
      },
    }),
  ),
  defineRoute({
    method: 'get',
    path: '/api/setups',
    summary: "The setup library: published guides' baselines, and your own uploads when signed in",
    tags: ['setups'],
    access: 'public',
    owner: { resource: 'setup-upload', rule: 'self' },
    response: setupLibrarySchema,
    handler: async ({ user, ctx }) => {
      const baselines = (await listBaselines(ctx.dataSource)).map(presentBaseline);
      const uploads = user ? (await listUploads(ctx.dataSource, user.id)).map(presentUploadListItem) : [];
      return { data: { baselines, uploads }, meta: { signedIn: !!user } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/setups/esc-settings',
    summary: 'The parameter library entries an ESC setting in a setup record is checked against (slug, name, unit, range)',
    tags: ['setups'],
    access: 'public',
    response: z.array(settingDefinitionSchema),
    handler: async ({ ctx }) => ({ data: await loadSettingLibrary(ctx.dataSource) }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/setups/compare',
    summary: 'Compare two setups (upload ids, or guide:<slug> for a live baseline): fields, differences, computed deltas, cautions',
    tags: ['setups'],
    access: 'public',
    owner: { resource: 'setup-upload', rule: 'owner' },
    query: compareQuery,
    response: z.object({ a: compareSideSchema, b: compareSideSchema }).passthrough(),
    handler: async ({ query, user, ctx }) => ({ data: await compareRefs(ctx.dataSource, user, query.a, query.b, query.rpm) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/setups',
    summary: 'Upload your own setup record (multipart field "file": our .json or our .csv layout, 256 KB at most)',
    tags: ['setups'],
    access: 'member',
    multipart: true,
    rateLimit: 'upload',
    status: 201,
    before: [parseSetupUpload],
    response: setupUploadSchema,
    handler: async ({ req, user, ctx }) => ({ status: 201, data: presentUpload(await createUpload(ctx, user.id, req.file)) }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/setups/:id',
    summary: 'One of your uploaded setups',
    tags: ['setups'],
    access: 'member',
    owner: { resource: 'setup-upload', rule: 'owner' },
    params: uuidParam,
    response: setupUploadSchema,
    handler: async ({ params, user, ctx }) => ({ data: presentUpload(await getUpload(ctx.dataSource, user, params.id)) }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/setups/:id/download',
    summary: 'Download one of your uploaded setups as it was uploaded',
    tags: ['setups'],
    access: 'member',
    owner: { resource: 'setup-upload', rule: 'owner' },
    params: uuidParam,
    download: true,
    handler: async ({ params, user, ctx, res }) => {
      const row = await getUpload(ctx.dataSource, user, params.id);
      const body = await ctx.storage.get(row.storageKey);
      if (!body) throw new Error(`stored object missing for setup ${row.id}`);
      sendFile(res, body, row.fileFormat === 'json' ? 'application/json; charset=utf-8' : 'text/csv; charset=utf-8', row.originalName);
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/setups/:id',
    summary: 'Delete one of your uploaded setups',
    tags: ['setups'],
    access: 'member',
    owner: { resource: 'setup-upload', rule: 'owner' },
    params: uuidParam,
    status: 204,
    handler: async ({ params, user, ctx }) => {
      await deleteUpload(ctx, user, params.id);
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/guides/:slug/setup',
    summary: "A guide's live baseline setup record (meta.computed holds the computed values and cautions)",
    tags: ['setups', 'guides'],
    access: 'public',
    params: slugParam,
    response: setupRecordStructureSchema,
    handler: async ({ params, ctx }) => {
      const { record } = await guideBaseline(ctx.dataSource, params.slug);
      return { data: record, meta: { computed: computeSetup(record) } };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/guides/:slug/setup.json',
    summary: "Download a guide's live baseline as <guide-slug>-v<n>.tunewright.json",
    tags: ['setups', 'guides'],
    access: 'public',
    params: slugParam,
    download: true,
    handler: async ({ params, ctx, res }) => {
      const { record, baseline } = await guideBaseline(ctx.dataSource, params.slug);
      sendFile(
        res,
        JSON.stringify(record, null, 2) + '\n',
        'application/json; charset=utf-8',
        `${baseline.doc.slug}-v${baseline.revision.number}.tunewright.json`,
      );
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/guides/:slug/setup.csv',
    summary: "Download a guide's live baseline in our CSV layout (path,value,unit,source), computed values and cautions included",
    tags: ['setups', 'guides'],
    access: 'public',
    params: slugParam,
    download: true,
    handler: async ({ params, ctx, res }) => {
      const { record, baseline } = await guideBaseline(ctx.dataSource, params.slug);
      sendFile(
        res,
        setupToCsv(record, computeSetup(record)),
        'text/csv; charset=utf-8; header=present',
        `${baseline.doc.slug}-v${baseline.revision.number}.tunewright.csv`,
      );
    },
  }),
  defineRoute({
    method: 'put',
    path: '/api/revisions/:id/setup',
    summary: 'Attach or replace the baseline setup of your own draft guide revision',
    tags: ['setups', 'revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    params: uuidParam,
    body: recordBody,
    response: setupRecordStructureSchema,
    handler: async ({ params, body, user, ctx }) => ({ data: await attachToRevision(ctx, user, params.id, body) }),
  }),
  defineRoute({
    method: 'delete',
    path: '/api/revisions/:id/setup',
    summary: 'Remove the baseline setup from your own draft guide revision',
    tags: ['setups', 'revisions'],
    access: 'member',
    owner: { resource: 'revision', rule: 'owner' },
    params: uuidParam,
    status: 204,
    handler: async ({ params, user, ctx }) => {
      await detachFromRevision(ctx, user, params.id);
    },
  }),
];
