import { z } from 'zod';

/** One finding of the content checks (shared/content-checks), as revisions and reviews carry them. */
export const contentCheckSchema = z.object({
  rule: z.string(),
  severity: z.enum(['error', 'warning']),
  message: z.string(),
  /** The setting or example concerned, e.g. `gearing.pinionTeeth`, `escSettings.drag-brake`, `examples[1].expoPct`. */
  path: z.string(),
});
export type ContentCheckItem = z.infer<typeof contentCheckSchema>;
