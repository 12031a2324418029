import { z } from 'zod';
import { DOCUMENT_KINDS, REVISION_STATES } from '../constants';

export const revisionStateSchema = z.enum(REVISION_STATES);
export const documentKindSchema = z.enum(DOCUMENT_KINDS);

/** A revision as the API shows it (content is the kind's content schema). */
export const revisionSchema = z.object({
  id: z.uuid(),
  documentId: z.uuid(),
  kind: documentKindSchema,
  slug: z.string(),
  number: z.number().int(),
  baseRevisionId: z.uuid().nullable(),
  state: revisionStateSchema,
  note: z.string(),
  reason: z.string().nullable(),
  author: z.object({ id: z.uuid(), displayName: z.string() }),
  content: z.record(z.string(), z.unknown()),
  setup: z.record(z.string(), z.unknown()).nullable(),
  restoredFromNumber: z.number().int().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  submittedAt: z.string().nullable(),
  publishedAt: z.string().nullable(),
  reviewedBy: z.object({ id: z.uuid(), displayName: z.string() }).nullable(),
});
export type Revision = z.infer<typeof revisionSchema>;
