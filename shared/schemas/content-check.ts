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

/** Why a proposal needs two moderators (a safety-relevant change to the live baseline). */
export const safetyChangeSchema = z.object({ rule: z.string(), message: z.string(), path: z.string() });

/** How many moderators a proposal needs, the rules that ask for two, and who has approved it so far. */
export const reviewApprovalSchema = z.object({
  needed: z.union([z.literal(1), z.literal(2)]),
  rules: z.array(safetyChangeSchema),
  approvals: z.array(z.object({ moderator: z.object({ id: z.uuid(), displayName: z.string() }), at: z.string() })),
});
export type ReviewApproval = z.infer<typeof reviewApprovalSchema>;
