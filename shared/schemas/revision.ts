import { z } from 'zod';
import { CLASS_SLUGS, DOCUMENT_KINDS, REVISION_STATES, type DocumentKind } from '../constants';
import { contentCheckSchema, reviewApprovalSchema } from './content-check';
import { guideContentSchema, guideDraftContentSchema } from './guide';
import { parameterContentSchema } from './parameter';

export const revisionStateSchema = z.enum(REVISION_STATES);
export const documentKindSchema = z.enum(DOCUMENT_KINDS);

/** Who wrote or reviewed a revision, as readers see them. */
export const personSchema = z.object({ id: z.uuid(), displayName: z.string() });
export type Person = z.infer<typeof personSchema>;

/** A revision as the API shows it (content is the kind's content schema). */
export const revisionSchema = z.object({
  id: z.uuid(),
  documentId: z.uuid(),
  kind: documentKindSchema,
  slug: z.string(),
  number: z.number().int(),
  baseRevisionId: z.uuid().nullable(),
  /** Number of the base revision, so the UI can say "based on version N". */
  baseNumber: z.number().int().nullable(),
  state: revisionStateSchema,
  note: z.string(),
  reason: z.string().nullable(),
  author: personSchema,
  content: z.record(z.string(), z.unknown()),
  setup: z.record(z.string(), z.unknown()).nullable(),
  restoredFromNumber: z.number().int().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  submittedAt: z.string().nullable(),
  publishedAt: z.string().nullable(),
  reviewedAt: z.string().nullable(),
  reviewedBy: personSchema.nullable(),
  /** Ids of images the revision uses that a moderator has hidden; its drawn body shows a notice in their place. */
  hiddenImages: z.array(z.uuid()),
});
export type Revision = z.infer<typeof revisionSchema>;

/** A revision as reading pages get it: with its body already rendered to sanitized HTML. */
export const readableRevisionSchema = revisionSchema.extend({
  /** The Markdown body as sanitized HTML; worked-example blocks are `[data-example-slot]` elements. */
  bodyHtml: z.string(),
});
export type ReadableRevision = z.infer<typeof readableRevisionSchema>;

/** Where a revision's document stands now (sent with a single revision so an editor can tell if its base went stale). */
export const documentStatusSchema = z.object({
  kind: documentKindSchema,
  slug: z.string(),
  publishedRevisionId: z.uuid().nullable(),
  publishedNumber: z.number().int().nullable(),
  hidden: z.boolean(),
});
export type DocumentStatus = z.infer<typeof documentStatusSchema>;

/** One row of a document's history (no content). */
export const revisionHistoryItemSchema = z.object({
  id: z.uuid(),
  number: z.number().int(),
  state: revisionStateSchema,
  author: personSchema,
  note: z.string(),
  baseNumber: z.number().int().nullable(),
  restoredFromNumber: z.number().int().nullable(),
  /** The moderator who brought an older version back (the author stays the one who wrote it). */
  restoredBy: personSchema.nullable(),
  createdAt: z.string(),
  submittedAt: z.string().nullable(),
  publishedAt: z.string().nullable(),
});
export type RevisionHistoryItem = z.infer<typeof revisionHistoryItemSchema>;

/** A piece of a word-level diff (the `diff` package's change objects, trimmed). */
export const diffPartSchema = z.object({ value: z.string(), added: z.boolean().optional(), removed: z.boolean().optional() });
export type DiffPart = z.infer<typeof diffPartSchema>;

/**
 * How finely a body diff could be worked out: `words` throughout; some passages only by `sentences` or
 * whole `lines` (they differed too much to compare word by word within the server's limits); or
 * `whole` (one removal and one addition: the bodies had almost nothing in common).
 */
export const bodyDiffDetailSchema = z.enum(['words', 'sentences', 'lines', 'whole']);
export type BodyDiffDetail = z.infer<typeof bodyDiffDetailSchema>;

/** A metadata field (anything but the body) whose value differs between two revisions. */
export const changedFieldSchema = z.object({ field: z.string(), from: z.unknown(), to: z.unknown() });
export type ChangedField = z.infer<typeof changedFieldSchema>;

/** GET …/compare?from=&to= */
export const compareResultSchema = z.object({
  from: revisionSchema,
  to: revisionSchema,
  changedFields: z.array(changedFieldSchema),
  bodyDiff: z.array(diffPartSchema),
  bodyDiffDetail: bodyDiffDetailSchema,
});
export type CompareResult = z.infer<typeof compareResultSchema>;

/** What the calculators say about one ```worked-example block of a body (blocks counted from 0). */
export const workedExampleCheckSchema = z.object({
  index: z.number().int(),
  calc: z.string().nullable(),
  ok: z.boolean(),
  issues: z.array(z.object({ path: z.string(), message: z.string() })),
  warnings: z.array(z.object({ level: z.enum(['info', 'caution', 'danger']), code: z.string(), message: z.string(), field: z.string().optional() })),
});
export type WorkedExampleCheck = z.infer<typeof workedExampleCheckSchema>;

/** One proposal in the review queue. */
export const reviewItemSchema = z.object({
  revisionId: z.uuid(),
  kind: documentKindSchema,
  slug: z.string(),
  /** Guide title or parameter name. */
  title: z.string(),
  number: z.number().int(),
  baseNumber: z.number().int().nullable(),
  author: personSchema,
  submittedAt: z.string().nullable(),
  note: z.string(),
  class: z.string().nullable(),
  /** The signed-in moderator wrote it, so they cannot review it. */
  own: z.boolean(),
  /** Its base is no longer the live revision (publishing would answer 409 stale_base). */
  stale: z.boolean(),
  /** What the content checks find in it (shared/content-checks), so the queue shows them before it is opened. */
  checks: z.array(contentCheckSchema).optional(),
});
export type ReviewItem = z.infer<typeof reviewItemSchema>;

/** GET /api/reviews/:revisionId */
export const reviewDetailSchema = z.object({
  revision: revisionSchema,
  live: revisionSchema.nullable(),
  changedFields: z.array(changedFieldSchema),
  bodyDiff: z.array(diffPartSchema),
  bodyDiffDetail: bodyDiffDetailSchema,
  workedExamples: z.array(workedExampleCheckSchema),
  /** What the content checks find in the proposal and its baseline (shared/content-checks). */
  checks: z.array(contentCheckSchema),
  /** One moderator, or two for a safety-relevant baseline change: which rules triggered and who approved. */
  approval: reviewApprovalSchema,
  /** Changed fields of the attached baseline setup record (null when neither side has one). */
  setupChanges: z.array(z.object({ path: z.string(), label: z.string(), unit: z.string(), from: z.unknown(), to: z.unknown() })).nullable(),
  /** Cautions the calculators raise on the proposal's setup record. */
  setupWarnings: z
    .array(z.object({ level: z.enum(['info', 'caution', 'danger']), code: z.string(), message: z.string(), field: z.string().optional() }))
    .nullable(),
  own: z.boolean(),
  stale: z.boolean(),
  /** Sent back before and submitted again: the moderator's reason and what the author changed since. */
  sinceReturn: z
    .object({
      reason: z.string(),
      returnedAt: z.string(),
      changed: z.boolean(),
      changedFields: z.array(changedFieldSchema),
      bodyDiff: z.array(diffPartSchema),
      setupChanged: z.boolean(),
    })
    .nullable()
    .optional(),
});
export type ReviewDetail = z.infer<typeof reviewDetailSchema>;

/** One of the signed-in member's revisions (GET /api/me/revisions). */
export const myRevisionSchema = z.object({
  id: z.uuid(),
  kind: documentKindSchema,
  slug: z.string(),
  title: z.string(),
  number: z.number().int(),
  state: revisionStateSchema,
  note: z.string(),
  reason: z.string().nullable(),
  baseRevisionId: z.uuid().nullable(),
  baseNumber: z.number().int().nullable(),
  stale: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
  submittedAt: z.string().nullable(),
  publishedAt: z.string().nullable(),
});
export type MyRevision = z.infer<typeof myRevisionSchema>;

/** A place where the draft and the live revision both changed the same thing since the draft's base. */
export const mergeConflictSchema = z.object({
  field: z.string(),
  /** For the body: which conflicting hunk (0-based, in order). */
  hunk: z.number().int().optional(),
  base: z.unknown(),
  ours: z.unknown(),
  theirs: z.unknown(),
});
export type MergeConflict = z.infer<typeof mergeConflictSchema>;

/**
 * The body as merge regions, in order, each as lines: merged lines, or a conflicting hunk to resolve
 * by hand. The resolved body is every region's chosen lines joined with "\n".
 */
export const bodyRegionSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('ok'), lines: z.array(z.string()) }),
  z.object({
    kind: z.literal('conflict'),
    hunk: z.number().int(),
    base: z.array(z.string()),
    ours: z.array(z.string()),
    theirs: z.array(z.string()),
    /** Word diff from the live lines to the draft's, so the screen can mark where the two sides differ inside a long paragraph. */
    words: z.array(diffPartSchema),
  }),
]);
export type BodyRegion = z.infer<typeof bodyRegionSchema>;

/**
 * POST /api/revisions/:id/rebase. `merged` is the full content with every conflict resolved
 * in favour of the draft ("ours"), so saving it unchanged never loses the proposer's text.
 */
export const rebaseResultSchema = z.object({
  merged: z.record(z.string(), z.unknown()),
  conflicts: z.array(mergeConflictSchema),
  bodyRegions: z.array(bodyRegionSchema),
  /** What the merge brings into the draft from the live version: draft → `merged`, field by field and word by word. */
  incoming: z.object({ changedFields: z.array(changedFieldSchema), bodyDiff: z.array(diffPartSchema) }),
  currentRevisionId: z.uuid(),
  currentNumber: z.number().int(),
  stale: z.boolean(),
});
export type RebaseResult = z.infer<typeof rebaseResultSchema>;

const noteSchema = z.string().trim().max(1000, 'Keep the edit note under 1,000 characters');

/** POST /api/revisions/:id/submit */
export const submitRevisionSchema = z.strictObject({
  note: noteSchema.min(3, 'Write an edit note: what changed and why'),
});

/** POST /api/reviews/:revisionId/return */
export const returnRevisionSchema = z.strictObject({
  reason: z
    .string({ message: 'Give a reason, so the author knows what to change' })
    .trim()
    .min(3, 'Give a reason, so the author knows what to change')
    .max(2000),
});

/** POST …/hide */
export const hideDocumentSchema = z.strictObject({
  reason: z.string({ message: 'Give a reason for hiding it' }).trim().min(3, 'Give a reason for hiding it').max(1000),
});

/** POST …/unhide */
export const unhideDocumentSchema = z.strictObject({ reason: z.string().trim().max(1000).optional() });

/** POST …/restore */
export const restoreRevisionSchema = z.strictObject({
  number: z.number({ message: 'Give the version number to restore' }).int().positive(),
  /** Why: kept in the audit log and sent to the author of the restored version. */
  reason: z
    .string({ message: 'Say why this version is restored' })
    .trim()
    .min(10, 'Say why this version is restored (at least 10 characters): the author is told')
    .max(1000, 'Use at most 1,000 characters'),
  note: noteSchema.optional(),
});

/** The content schema of a document kind. */
export function contentSchemaFor(kind: DocumentKind) {
  return kind === 'guide' ? guideContentSchema : parameterContentSchema;
}

/**
 * What a draft of the kind may hold while it is written (autosave, a new guide): a guide needs only its
 * title; submitting checks `contentSchemaFor`. Parameter edits start from a whole live entry, so their
 * drafts keep the full rules.
 */
export function draftContentSchemaFor(kind: DocumentKind) {
  return kind === 'guide' ? guideDraftContentSchema : parameterContentSchema;
}

/**
 * The kind's draft content fields, each optional and without defaults (so a partial update never
 * resets a field the caller did not send).
 */
export function contentPatchShape(kind: DocumentKind) {
  const shape = draftContentSchemaFor(kind).shape as Record<string, z.ZodType>;
  return Object.fromEntries(
    Object.entries(shape).map(([key, field]) => {
      const bare = field instanceof z.ZodDefault ? (field.removeDefault() as z.ZodType) : field;
      return [key, bare.optional()];
    }),
  ) as Record<string, z.ZodOptional<z.ZodType>>;
}

/** PATCH /api/revisions/:id for a revision of this kind (autosave): any content field, the edit note, a new base. */
export function revisionPatchSchema(kind: DocumentKind) {
  return z.strictObject({ ...contentPatchShape(kind), note: noteSchema.optional(), baseRevisionId: z.uuid().optional() });
}

/** POST …/revisions: a new draft based on the live revision; fields not sent are copied from it. */
export function proposeEditSchema(kind: DocumentKind) {
  return z.strictObject({
    ...contentPatchShape(kind),
    note: noteSchema.optional(),
    baseRevisionId: z.uuid({ message: 'Say which live revision the edit is based on' }),
  });
}

/** Query of GET /api/reviews. */
export const reviewQuerySchema = z.object({
  kind: documentKindSchema.optional(),
  class: z.enum(CLASS_SLUGS).optional(),
});

/** Query of …/compare. */
export const compareQuerySchema = z.object({
  from: z.coerce.number({ message: 'Give the revision number to compare from' }).int().positive(),
  to: z.coerce.number({ message: 'Give the revision number to compare to' }).int().positive(),
});
