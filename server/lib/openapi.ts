import { createDocument } from 'zod-openapi';
import { z } from 'zod';
import { apiErrorSchema } from '../../shared/schemas/common';
import type { OwnedResource, OwnershipRule, RouteDef } from './route';
import { APP_VERSION } from './version';

const toOpenApiPath = (p: string) => p.replace(/:([A-Za-z0-9_]+)/g, '{$1}');

const ERROR_STATUSES: Record<string, string> = {
  '400': 'Validation failed (details lists each field)',
  '401': 'Sign in first',
  '403': 'Not allowed, or CSRF token missing',
  '404': 'Not found',
  '409': 'Conflict',
  '413': 'Too large',
  '415': 'Unsupported media type',
  '429': 'Rate limited',
  '503': 'Database unavailable',
};

const RESOURCE_WORDS: Record<OwnedResource, string> = {
  revision: "the revision's author",
  'setup-upload': "the upload's owner",
  account: 'the account holder',
  motor: "the motor's owner",
  run: "the run's owner",
  image: "the image's uploader",
};
const OWNERSHIP_WORDS: Record<OwnershipRule, (r: OwnedResource) => string> = {
  owner: (r) => `${RESOURCE_WORDS[r]} only`,
  'owner-or-moderator': (r) => `${RESOURCE_WORDS[r]} and moderators`,
  'not-owner': (r) => `anyone allowed except ${RESOURCE_WORDS[r]}`,
  any: () => 'any caller allowed; the answer marks your own',
  self: () => "only ever the caller's own",
};

/** The OpenAPI 3.1 document, generated from the route table's zod schemas. */
export function buildOpenApi(routes: RouteDef[], opts: { devTools: boolean }) {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const r of routes) {
    if (r.devOnly && !opts.devTools) continue;
    const path = toOpenApiPath(r.path);
    const errorResponses = Object.fromEntries(
      Object.entries(ERROR_STATUSES).map(([code, description]) => [code, { description, content: { 'application/json': { schema: apiErrorSchema } } }]),
    );
    const status = String(r.status ?? 200);
    const success = r.download
      ? { description: 'A file download' }
      : status === '204'
        ? { description: 'No content' }
        : { description: 'Success', content: { 'application/json': { schema: z.object({ data: r.response ?? z.unknown(), meta: z.unknown().optional() }) } } };
    const requestParams: Record<string, unknown> = {};
    if (r.params) requestParams.path = r.params;
    if (r.query) requestParams.query = r.query;
    paths[path] ??= {};
    paths[path][r.method] = {
      summary: r.summary,
      tags: r.tags,
      description: `Access: ${r.access}${r.owner ? `; ownership: ${OWNERSHIP_WORDS[r.owner.rule](r.owner.resource)}` : ''}${r.method !== 'get' ? '; requires the x-csrf-token header' : ''}`,
      ...(Object.keys(requestParams).length ? { requestParams } : {}),
      ...(r.body && !r.multipart ? { requestBody: { content: { 'application/json': { schema: r.body } } } } : {}),
      ...(r.multipart ? { requestBody: { content: { 'multipart/form-data': { schema: z.object({ file: z.string().meta({ format: 'binary' }) }) } } } } : {}),
      responses: { [status]: success, ...errorResponses },
    };
  }
  return createDocument({
    openapi: '3.1.0',
    info: {
      title: 'Tunewright API',
      version: APP_VERSION,
      description: 'Successes are `{ data }` (lists add `meta`); failures are `{ error: { code, message, details? } }`.',
    },
    paths: paths as never,
  });
}
