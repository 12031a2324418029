import { z } from 'zod';
import { BENCH_VERDICT_LABELS, benchVerdicts } from '../calc/bench-verdict';
import { WINDING_TEMP_MAX_C, WINDING_TEMP_MIN_C } from '../calc/winding-resistance';
import { BENCH_READINGS, COMPARED_QUANTITIES, MAX_REPEATS, type BenchReading } from '../motors/quantities';

const withUnit = (v: number, unit: string) => (unit ? `${v} ${unit}` : String(v));

function bounded(label: string, unit: string, min: number, max: number, opts: { int?: boolean; above?: boolean } = {}) {
  let n = z.number({ error: (i) => (i.input === undefined ? `${label} is required` : `${label} must be a number`) });
  if (opts.int) n = n.int({ error: `${label} must be a whole number` });
  n = opts.above
    ? n.gt(min, { error: `${label} must be above ${withUnit(min, unit)}` })
    : n.min(min, { error: `${label} must be at least ${withUnit(min, unit)}` });
  return n.max(max, { error: `${label} must be at most ${withUnit(max, unit)}` });
}

const label = z.string({ error: 'Label must be text' }).trim().min(1, 'Give the motor a label of your own').max(80, 'Label must be at most 80 characters');
const poles = bounded('Rotor poles', 'poles', 2, 24, { int: true }).refine(
  (p) => p % 2 === 0,
  'Rotor poles must be an even number (magnet poles come in pairs)',
);
const toleranceSchema = z.strictObject({ kind: z.enum(['pct', 'abs']), value: bounded('Tolerance', '', 0, 1_000_000, { above: true }) });

/** Tolerance overrides per compared quantity (the rest keep their defaults). */
export const toleranceOverridesSchema = z.partialRecord(z.enum(COMPARED_QUANTITIES), toleranceSchema);

/** POST /api/motors. */
export const motorCreateSchema = z.strictObject({
  label,
  kvRpmPerV: bounded('Motor kV', 'rpm/V', 100, 20_000).optional(),
  windTurns: bounded('Wind', 'turns', 1, 40).optional(),
  poles,
  sensored: z.boolean({ error: 'Sensored must be true or false' }),
  rotorNotes: z.string().trim().max(500, 'Rotor notes must be at most 500 characters').optional(),
});
export type MotorCreate = z.infer<typeof motorCreateSchema>;

/** PATCH /api/motors/:id: any of the fields; null clears an optional one (the reference goes back to the first check). */
export const motorPatchSchema = z
  .strictObject({
    label: label.optional(),
    kvRpmPerV: bounded('Motor kV', 'rpm/V', 100, 20_000).nullable().optional(),
    windTurns: bounded('Wind', 'turns', 1, 40).nullable().optional(),
    poles: poles.optional(),
    sensored: z.boolean({ error: 'Sensored must be true or false' }).optional(),
    rotorNotes: z.string().trim().max(500, 'Rotor notes must be at most 500 characters').nullable().optional(),
    tolerances: toleranceOverridesSchema.optional(),
    referenceCheckId: z.uuid('The reference must be a check id').nullable().optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Send at least one field to change');
export type MotorPatch = z.infer<typeof motorPatchSchema>;

/** Bounds of each bench reading; a speed below zero, a voltage of zero and the like are refused by field. */
export const READING_FIELDS: Record<BenchReading, z.ZodNumber> = {
  testVoltageV: bounded('Test voltage', 'V', 0, 60, { above: true }),
  noLoadRpm: bounded('No-load speed', 'rpm', 0, 200_000, { above: true }),
  noLoadCurrentA: bounded('No-load current', 'A', 0, 100, { above: true }),
  timingDeg: bounded('Timing reading', '°', -90, 180),
  rotorSymmetryPct: bounded('Rotor symmetry', '%', 0, 100),
  sensorDeviationPct: bounded('Sensor-signal deviation', '%', 0, 100),
  phaseResistanceOhm: bounded('Phase resistance', 'Ω', 0, 100, { above: true }),
};

const readingsSchema = z.strictObject(
  Object.fromEntries(
    BENCH_READINGS.map((q) => [
      q,
      z.array(READING_FIELDS[q]).min(1, 'Give at least one reading').max(MAX_REPEATS, `At most ${MAX_REPEATS} repeat readings`).optional(),
    ]),
  ) as Record<BenchReading, z.ZodOptional<z.ZodArray<z.ZodNumber>>>,
);

/**
 * POST /api/motors/:id/checks. Each reading is given either as one number in its own field or as up to
 * five repeat readings under `readings.<field>` — not both. Voltage and speed are required in one form.
 */
export const checkCreateSchema = z
  .strictObject({
    testedAt: z.iso.datetime({ offset: true, error: 'testedAt must be an ISO 8601 date and time' }).optional(),
    ...Object.fromEntries(BENCH_READINGS.map((q) => [q, READING_FIELDS[q].optional()])),
    resistanceTempC: bounded('Resistance temperature', '°C', WINDING_TEMP_MIN_C, WINDING_TEMP_MAX_C).optional(),
    notes: z.string().max(2000, 'Notes must be at most 2,000 characters').optional(),
    readings: readingsSchema.optional(),
  })
  .superRefine((v, ctx) => {
    const body = v as Record<string, unknown> & { readings?: Partial<Record<BenchReading, number[]>> };
    for (const q of BENCH_READINGS) {
      const one = body[q] !== undefined;
      const many = body.readings?.[q] !== undefined;
      if (one && many) ctx.addIssue({ code: 'custom', path: [q], message: `Give ${q} as one number or as readings.${q}, not both` });
      if (!one && !many && (q === 'testVoltageV' || q === 'noLoadRpm'))
        ctx.addIssue({ code: 'custom', path: [q], message: `${q === 'testVoltageV' ? 'Test voltage' : 'No-load speed'} is required` });
    }
    const hasR = body.phaseResistanceOhm !== undefined || body.readings?.phaseResistanceOhm !== undefined;
    if (hasR && body.resistanceTempC === undefined)
      ctx.addIssue({
        code: 'custom',
        path: ['resistanceTempC'],
        message: 'Give the temperature the resistance was read at (room temperature for a cold motor)',
      });
    if (typeof body.testedAt === 'string' && Date.parse(body.testedAt) > Date.now() + 86_400_000)
      ctx.addIssue({ code: 'custom', path: ['testedAt'], message: 'testedAt is in the future' });
  });
export type CheckCreate = z.infer<typeof checkCreateSchema> & { readings?: Partial<Record<BenchReading, number[]>> } & Partial<Record<BenchReading, number>>;

const reading = z.object({ values: z.array(z.number()), mean: z.number(), spread: z.number() });

/** A bench check as the API returns it: scalar fields hold the mean of the repeats. */
export const checkSchema = z.object({
  id: z.uuid(),
  motorId: z.uuid(),
  testedAt: z.string(),
  ...Object.fromEntries(BENCH_READINGS.map((q) => [q, z.number().nullable()])),
  resistanceTempC: z.number().nullable(),
  notes: z.string(),
  readings: z.partialRecord(z.enum(BENCH_READINGS), reading),
  computed: z.object({
    measuredKv: z.number(),
    measuredKvSpread: z.number(),
    resistanceAt20COhm: z.number().nullable(),
    resistanceAt20CSpread: z.number().nullable(),
  }),
  isReference: z.boolean(),
  createdAt: z.string(),
});
export type Check = z.infer<typeof checkSchema> & Record<BenchReading, number | null>;

/** A registered motor. */
export const motorSchema = z.object({
  id: z.uuid(),
  label: z.string(),
  kvRpmPerV: z.number().nullable(),
  windTurns: z.number().nullable(),
  poles: z.number(),
  sensored: z.boolean(),
  rotorNotes: z.string(),
  tolerances: z.record(z.string(), toleranceSchema),
  referenceCheckId: z.string().nullable(),
  checkCount: z.number(),
  lastTestedAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Motor = z.infer<typeof motorSchema>;

/** One row of a comparison. */
export const compareRowSchema = z.object({
  name: z.enum(COMPARED_QUANTITIES),
  label: z.string(),
  unit: z.string(),
  from: z.number().nullable(),
  to: z.number().nullable(),
  delta: z.number().nullable(),
  deltaPct: z.number().nullable(),
  tolerance: z.number().nullable(),
  spread: z.number().nullable(),
  verdict: z.enum(benchVerdicts).nullable(),
});
export type CompareRow = z.infer<typeof compareRowSchema>;

/** GET /api/motors/:id/compare. */
export const motorCompareSchema = z.object({
  from: checkSchema,
  to: checkSchema,
  quantities: z.array(compareRowSchema),
  findings: z.array(z.object({ code: z.string(), level: z.enum(['moved', 'watch', 'info']), message: z.string() })),
});
export type MotorCompare = z.infer<typeof motorCompareSchema>;

export { BENCH_VERDICT_LABELS };
