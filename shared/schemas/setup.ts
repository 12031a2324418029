import { z } from 'zod';
import { setupRecordStructureSchema, type SetupRecord } from './setup-record';

/** A short line about a record's motor, e.g. "17.5T · 2,200 rpm/V · sensored · 2-pole". */
export function describeMotor(record: SetupRecord): string {
  const parts: string[] = [];
  if (record.motor.windTurns !== undefined) parts.push(`${record.motor.windTurns}T`);
  if (record.motor.kvRpmPerV !== undefined) parts.push(`${record.motor.kvRpmPerV.toLocaleString('en-GB')} rpm/V`);
  parts.push(record.motor.sensored ? 'sensored' : 'sensorless');
  parts.push(`${record.motor.poles}-pole`);
  return parts.join(' · ');
}

/** The key facts of a record for lists: class, surface, motor, ratio, rollout, pack. */
export const setupSummarySchema = z.object({
  class: z.string(),
  surface: z.string(),
  motor: z.string(),
  finalDriveRatio: z.number().nullable(),
  rolloutMm: z.number().nullable(),
  pack: z.string(),
});
export type SetupSummary = z.infer<typeof setupSummarySchema>;

/** A member's uploaded setup as the API shows it. */
export const setupUploadSchema = z.object({
  id: z.uuid(),
  originalName: z.string(),
  format: z.enum(['json', 'csv']),
  byteSize: z.number().int(),
  createdAt: z.string(),
  summary: setupSummarySchema,
  record: setupRecordStructureSchema,
});
export type SetupUpload = z.infer<typeof setupUploadSchema>;

/** A published guide's baseline, as the setup library lists it. */
export const setupBaselineSchema = z.object({
  guideSlug: z.string(),
  guideTitle: z.string(),
  revisionNumber: z.number().int(),
  authorDisplayName: z.string(),
  publishedAt: z.string().nullable(),
  summary: setupSummarySchema,
});
export type SetupBaseline = z.infer<typeof setupBaselineSchema>;

/** The setup library: published baselines for everyone, plus the caller's own uploads when signed in. */
export const setupLibrarySchema = z.object({
  baselines: z.array(setupBaselineSchema),
  uploads: z.array(setupUploadSchema.omit({ record: true })),
});
export type SetupLibrary = z.infer<typeof setupLibrarySchema>;

/** One library parameter as the setup form and the validator use it. */
export const settingDefinitionSchema = z.object({
  slug: z.string(),
  name: z.string(),
  unit: z.string(),
  category: z.string(),
  summary: z.string(),
  range: z.object({ min: z.number(), max: z.number(), step: z.number() }),
  /** The entry's typical value per class slug, from its "Typical settings by class" table (numbers when the cell has them). */
  typical: z.record(z.string(), z.object({ text: z.string(), min: z.number().optional(), max: z.number().optional() })).optional(),
});
export type SettingDefinitionRow = z.infer<typeof settingDefinitionSchema>;

/** Which record a comparison side is, for headings and links. */
export const compareSideSchema = z.object({ ref: z.string(), label: z.string(), kind: z.enum(['guide', 'upload']) });
export type CompareSide = z.infer<typeof compareSideSchema>;

/** Refs accepted by the compare endpoint: an upload id, or `guide:<slug>` for a guide's live baseline. */
export const setupRefSchema = z
  .string()
  .trim()
  .regex(/^(guide:[a-z0-9]+(?:-[a-z0-9]+)*|[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})$/i, 'Use an upload id or guide:<guide-slug>')
  // Accepted in any case, so looked up in one: prefixes, slugs and ids are all lower case.
  .transform((ref) => ref.toLowerCase());
