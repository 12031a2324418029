import { z } from 'zod';
import { runMappingSchema } from '../runlog/mapping';
import { RUNLOG_FORMAT, RUNLOG_LIMITS, RUNLOG_SCHEMA_VERSION, RUN_CHANNELS, VALUE_CHANNELS } from '../runlog/vocabulary';

const num = z.number();
const maybe = num.nullable();
const bandTimes = z.object({ cool: num, warm: num, hot: num, 'too-hot': num }).nullable();
const band = z.enum(['cool', 'warm', 'hot', 'too-hot']).nullable();

/** The figures of a run (computed from its raw samples at import); null where the run lacks the channel. */
export const runSummarySchema = z.object({
  durationS: num,
  sampleCount: z.number().int(),
  sampleRateHz: num,
  gapCount: z.number().int(),
  peakRpm: maybe,
  peakRpmAtS: maybe,
  topSpeedKmh: maybe,
  maxMotorTempC: maybe,
  maxEscTempC: maybe,
  motorBand: band,
  escBand: band,
  motorBandTimeS: bandTimes,
  escBandTimeS: bandTimes,
  peakCurrentA: maybe,
  meanCurrentA: maybe,
  minPackV: maybe,
  restPackV: maybe,
  minCellV: maybe,
  cutoffWindowV: z.object({ min: num, max: num }).nullable(),
  energyMah: maybe,
  energyWh: maybe,
  energyIsEstimate: z.literal(true),
  fullThrottleShare: maybe,
  cautions: z.array(z.object({ level: z.enum(['caution', 'danger']), message: z.string() })),
});
export type RunSummary = z.infer<typeof runSummarySchema>;

export const importNoteSchema = z.object({ code: z.string(), message: z.string(), rows: z.array(z.number().int()).optional() });

const channelName = z.enum(RUN_CHANNELS);

/**
 * The metadata of a `tunewright.runlog` run, as stored and as published in its JSON Schema: what was imported,
 * how the file's columns were read, every change made on import, and the figures.
 */
export const runMetadataSchema = z.strictObject({
  format: z.literal(RUNLOG_FORMAT),
  schemaVersion: z.literal(RUNLOG_SCHEMA_VERSION),
  title: z.string().min(1).max(RUNLOG_LIMITS.titleMax),
  sourceFile: z.object({ name: z.string(), byteSize: z.number().int().min(1) }),
  channels: z.array(channelName).min(1),
  mapping: runMappingSchema,
  importNotes: z.array(importNoteSchema),
  gaps: z.array(z.object({ fromS: num, toS: num })),
  demo: z.boolean().describe('true for invented demo runs made by the simulator'),
  summary: runSummarySchema,
});
export type RunMetadata = z.infer<typeof runMetadataSchema>;

const runGearingSchema = z.object({ spurTeeth: num, pinionTeeth: num, internalRatio: num, tyreDiameterMm: num });
export type RunGearing = z.infer<typeof runGearingSchema>;

/**
 * What a run's owner may change after upload: its title, the setup it was run on and the registered motor it used
 * (each one of their own; null detaches). At least one field.
 */
export const runPatchSchema = z
  .strictObject({
    title: z
      .string()
      .trim()
      .min(1, 'A title cannot be empty')
      .max(RUNLOG_LIMITS.titleMax, `A title is at most ${RUNLOG_LIMITS.titleMax} characters`)
      .optional(),
    setupId: z.uuid({ message: 'Must be the id of one of your setups, or null to detach' }).nullable().optional(),
    motorId: z.uuid({ message: 'Must be the id of one of your registered motors, or null' }).nullable().optional(),
  })
  .refine((b) => b.title !== undefined || b.setupId !== undefined || b.motorId !== undefined, { message: 'Send title, setupId or motorId' });
export type RunPatch = z.infer<typeof runPatchSchema>;

/** A run as the API answers it. */
export const runSchema = z.object({
  id: z.uuid(),
  title: z.string(),
  originalName: z.string(),
  byteSize: z.number().int(),
  createdAt: z.string(),
  setupId: z.uuid().nullable(),
  setupLabel: z.string().nullable(),
  /** The attached setup's gearing (its owner only), for the road-speed line; null when not attached. */
  gearing: runGearingSchema.nullable(),
  motorId: z.uuid().nullable(),
  motorLabel: z.string().nullable(),
  demo: z.boolean(),
  channels: z.array(channelName),
  mapping: z.record(z.string(), z.unknown()),
  importNotes: z.array(importNoteSchema),
  gaps: z.array(z.object({ fromS: num, toS: num })),
  summary: runSummarySchema,
  isOwn: z.boolean(),
});
export type Run = z.infer<typeof runSchema>;

export const runListItemSchema = runSchema.omit({ mapping: true, importNotes: true, gaps: true });
export type RunListItem = z.infer<typeof runListItemSchema>;

/** The preview of an upload: header, proposed (or given) mapping, the first rows as text, and notes. */
export const runPreviewSchema = z.object({
  headers: z.array(z.string()),
  rows: z.array(z.array(z.string())),
  mapping: z.record(z.string(), z.object({ column: z.string(), unit: z.string(), poles: z.number().optional() })),
  ours: z.boolean(),
  delimiter: z.string(),
  decimalComma: z.boolean(),
  rowCount: z.number().int(),
  notes: z.array(importNoteSchema),
  problem: z.object({ code: z.string(), message: z.string(), row: z.number().optional(), column: z.string().optional() }).nullable(),
  summary: runSummarySchema.nullable(),
});
export type RunPreview = z.infer<typeof runPreviewSchema>;

const minMax = z.object({ min: z.array(num.nullable()), max: z.array(num.nullable()) });
/** Chart data: bucket start times and each channel's min and max per bucket. */
export const runSeriesSchema = z.object({
  t: z.array(num),
  channels: z.partialRecord(z.enum(VALUE_CHANNELS), minMax),
  points: z.number().int(),
  sampleCount: z.number().int(),
});
export type RunSeries = z.infer<typeof runSeriesSchema>;

const figureDiff = z.object({ key: z.string(), a: maybe, b: maybe, delta: maybe });
/** Two runs compared: both summaries, their differences, the offset that aligns b on a, and differing setup fields. */
export const runCompareSchema = z.object({
  a: runListItemSchema,
  b: runListItemSchema,
  differences: z.array(figureDiff),
  /**
   * How b is lined up on a: `offsetS` is b's time of the same moment minus a's. `method` says how it was found:
   * `cross-correlation` of `channel` in both runs (with the `correlation` reached), `full-throttle` (first
   * sustained full throttle, `aAtS`/`bAtS`), or `start` (no common trace and no full throttle in one run).
   */
  alignment: z.object({
    offsetS: num,
    method: z.enum(['cross-correlation', 'full-throttle', 'start']),
    channel: z.enum(['throttle_pct', 'motor_rpm']).nullable(),
    correlation: maybe,
    aAtS: maybe,
    bAtS: maybe,
  }),
  settings: z.array(z.object({ path: z.string(), label: z.string(), unit: z.string(), a: z.unknown(), b: z.unknown() })),
  settingsNote: z.string().nullable(),
});
export type RunCompare = z.infer<typeof runCompareSchema>;

/** The JSON Schema (2020-12) of run metadata, version 1, generated from {@link runMetadataSchema}. */
export function runMetadataJsonSchema(id?: string): Record<string, unknown> {
  const generated = z.toJSONSchema(runMetadataSchema, { target: 'draft-2020-12' }) as Record<string, unknown>;
  return {
    $schema: 'https://json-schema.org/draft/2020-12/schema',
    ...(id ? { $id: id } : {}),
    title: 'Tunewright run log metadata, version 1',
    description:
      'What Tunewright keeps about an imported run log (tunewright.runlog): the title, the source file, how its columns map onto our channels ' +
      '(time_s, throttle_pct, motor_rpm, motor_temp_c, esc_temp_c, current_a, pack_v), every change made on import, gaps, and the figures computed from the raw samples.',
    ...generated,
  };
}
