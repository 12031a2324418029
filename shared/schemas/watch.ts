import { z } from 'zod';
import { DOCUMENT_KINDS } from '../constants';

/** How a person wants mail about what they watch: one mail per change, one a day, or none. */
export const WATCH_DELIVERIES = ['immediate', 'daily', 'off'] as const;
export type WatchDelivery = (typeof WATCH_DELIVERIES)[number];
export const WATCH_DELIVERY_LABELS: Record<WatchDelivery, string> = {
  immediate: 'A mail for each change',
  daily: 'One mail a day with every change',
  off: 'No mail (keep my watch list)',
};

export const watchParamsSchema = z.object({
  kind: z.enum(DOCUMENT_KINDS, { message: 'Must be guide or parameter' }),
  slug: z.string().min(1).max(120),
});

/** One thing the signed-in person watches. */
export const watchSchema = z.object({
  kind: z.enum(DOCUMENT_KINDS),
  slug: z.string(),
  title: z.string(),
  since: z.string(),
});
export type Watch = z.infer<typeof watchSchema>;

/** The answer of PUT/DELETE /api/watches/:kind/:slug and GET /api/watches/:kind/:slug. */
export const watchStateSchema = z.object({ kind: z.enum(DOCUMENT_KINDS), slug: z.string(), watching: z.boolean() });
export type WatchState = z.infer<typeof watchStateSchema>;

export const watchSettingsSchema = z.object({ delivery: z.enum(WATCH_DELIVERIES) });
export type WatchSettings = z.infer<typeof watchSettingsSchema>;
export const watchSettingsPatchSchema = z.strictObject({ delivery: z.enum(WATCH_DELIVERIES, { message: 'Choose immediate, daily or off' }) });

export const unsubscribeBodySchema = z.strictObject({ token: z.string().min(20).max(600) });
export const unsubscribeResultSchema = z.object({
  scope: z.enum(['document', 'all']),
  kind: z.enum(DOCUMENT_KINDS).nullable(),
  slug: z.string().nullable(),
  title: z.string().nullable(),
});
export type UnsubscribeResult = z.infer<typeof unsubscribeResultSchema>;
