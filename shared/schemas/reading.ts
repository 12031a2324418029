import { z } from 'zod';
import { guideContentSchema, guideRecordSchema } from './guide';
import { parameterDetailSchema, parameterLiveRevisionSchema } from './parameter';
import { compareResultSchema, revisionSchema } from './revision';

/**
 * What the reading pages get from the server: the routes declare these as their responses (so the
 * OpenAPI document shows them and tests/server/response-contract.test.ts holds real answers to them),
 * the client reads its types from here, and the server-drawn pages carry the same shapes.
 */

/** A guide's revision with its content typed as a guide's. */
export const guideRevisionSchema = revisionSchema.extend({ content: guideContentSchema });
export type GuideRevision = z.infer<typeof guideRevisionSchema>;

/** What the reading endpoints send: the body also rendered and sanitized by the server. */
export const readableGuideRevisionSchema = guideRevisionSchema.extend({
  /** The Markdown body as sanitized HTML; worked-example blocks are `[data-example-slot]` elements. */
  bodyHtml: z.string(),
});
export type ReadableGuideRevision = z.infer<typeof readableGuideRevisionSchema>;

/** GET /api/guides/:slug — the guide page's main read: the guide record and its live revision. */
export const guideDetailSchema = z.object({ guide: guideRecordSchema, revision: readableGuideRevisionSchema });
export type GuideDetail = z.infer<typeof guideDetailSchema>;

/** GET /api/guides/:slug/compare — two revisions, changed metadata and the body diff. */
export const guideComparisonSchema = compareResultSchema.extend({ from: guideRevisionSchema, to: guideRevisionSchema });
export type GuideComparison = z.infer<typeof guideComparisonSchema>;

/** GET /api/parameters/:slug — a library entry's page: the entry and the live revision behind it. */
export const parameterPageDataSchema = z.object({ parameter: parameterDetailSchema, revision: parameterLiveRevisionSchema });
export type ParameterPageData = z.infer<typeof parameterPageDataSchema>;
