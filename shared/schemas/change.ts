import { z } from 'zod';
import { CLASS_SLUGS, DOCUMENT_KINDS } from '../constants';

/** What happened to live content: a new version, an older text restored, or the whole page hidden. */
export const CHANGE_ACTIONS = ['published', 'restored', 'hidden'] as const;
export type ChangeAction = (typeof CHANGE_ACTIONS)[number];
export const CHANGE_ACTION_LABELS: Record<ChangeAction, string> = { published: 'New version', restored: 'Restored', hidden: 'Hidden' };

export const changesQuerySchema = z.strictObject({
  limit: z.coerce.number({ message: 'Must be a number' }).int().min(1).max(200).default(50),
  kind: z.enum(DOCUMENT_KINDS, { message: 'Must be guide or parameter' }).optional(),
  class: z.enum(CLASS_SLUGS, { message: 'Not a class we know' }).optional(),
  author: z.uuid({ message: 'Must be an author id' }).optional(),
});
export type ChangesQuery = z.infer<typeof changesQuerySchema>;

/** One live change, newest first in every list. `number` is the version that went live (for a hide, the live one). */
export const changeSchema = z.object({
  kind: z.enum(DOCUMENT_KINDS),
  slug: z.string(),
  title: z.string(),
  number: z.number().int().nullable(),
  action: z.enum(CHANGE_ACTIONS),
  at: z.string(),
  note: z.string(),
  class: z.string().nullable(),
  author: z.object({ id: z.string(), displayName: z.string() }).nullable(),
  restoredFromNumber: z.number().int().nullable(),
});
export type Change = z.infer<typeof changeSchema>;
