import { distance as levenshtein } from 'fastest-levenshtein';
import { z } from 'zod';
import { CLASS_SLUGS, SURFACE_SLUGS } from '../constants';
import { packChemistries } from '../calc/chemistry';

// Our own document type for a baseline setup: `tunewright.setup`, schema version 2 (version 1 records,
// which cannot name a registered motor, are still read).
// Every number carries its unit in its field name (tyreDiameterMm, capacityMah, ambientTempC …);
// ESC settings carry their unit beside the value, because the parameter library owns those units.
// The structure below contains no transforms or defaults, so input and output types are the same
// and the generated JSON Schema describes exactly what a file must contain.

/** The `format` every setup record carries. */
export const SETUP_FORMAT = 'tunewright.setup';
/** The schema version this build writes. */
export const SETUP_SCHEMA_VERSION = 2;
/** Every schema version this build reads: version 2 only adds `motor.registeredMotorId`. */
export const SETUP_SCHEMA_VERSIONS = [1, 2] as const;
export type SetupSchemaVersion = (typeof SETUP_SCHEMA_VERSIONS)[number];
/** Where the JSON Schema of each version is served. */
export const SETUP_SCHEMA_PATHS: Readonly<Record<SetupSchemaVersion, string>> = { 1: '/schemas/setup-record.v1.json', 2: '/schemas/setup-record.v2.json' };
/** Where the JSON Schema of the current version is served. */
export const SETUP_SCHEMA_PATH = SETUP_SCHEMA_PATHS[SETUP_SCHEMA_VERSION];

/** Drivetrain layouts a record can name. */
export const DRIVETRAINS = ['2wd', '4wd'] as const;

/**
 * Library slugs that have their own field elsewhere in the record, so they are refused inside
 * escSettings (one value, one place).
 */
export const SLUGS_WITH_OWN_FIELD: Readonly<Record<string, string>> = {
  'endbell-timing': 'motor.endbellTimingDeg',
  'motor-kv': 'motor.kvRpmPerV',
  'pole-count': 'motor.poles',
  'final-drive-ratio': 'gearing (it is computed from spur, pinion and internal ratio)',
  rollout: 'gearing (it is computed from the gearing and tyre diameter)',
  'cell-count': 'battery.cells',
  'pack-chemistry': 'battery.chemistry',
  // Bench readings of a motor, not controller settings: they belong in a bench check of a registered motor.
  'bench-no-load-speed': 'a bench check of a registered motor (it is a bench reading, not a controller setting)',
  'bench-no-load-current': 'a bench check of a registered motor (it is a bench reading, not a controller setting)',
  'bench-timing-reading': 'a bench check of a registered motor (it is a bench reading, not a controller setting)',
  'rotor-symmetry': 'a bench check of a registered motor (it is a bench reading, not a controller setting)',
  'sensor-signal-deviation': 'a bench check of a registered motor (it is a bench reading, not a controller setting)',
  'phase-resistance': 'a bench check of a registered motor (it is a bench reading, not a controller setting)',
};

const withUnit = (v: number, unit: string) => (unit ? `${v} ${unit}` : String(v));

/** A bounded number with messages that name the field and its unit. */
function num(label: string, unit: string, min: number, max: number, opts: { int?: boolean; even?: boolean } = {}) {
  let n = z.number({ error: (i) => (i.input === undefined ? `${label} is required` : `${label} must be a number`) });
  if (opts.int) n = n.int({ error: `${label} must be a whole number` });
  n = n.min(min, { error: `${label} must be at least ${withUnit(min, unit)}` }).max(max, { error: `${label} must be at most ${withUnit(max, unit)}` });
  if (opts.even) n = n.multipleOf(2, { error: `${label} must be an even number (magnet poles come in pairs)` });
  return n.meta({ title: label, ...(unit ? { description: `In ${unit}` } : {}) });
}

function text(label: string, max: number) {
  return z
    .string({ error: `${label} must be text` })
    .max(max, { error: `${label} must be at most ${max} characters` })
    .meta({ title: label });
}

function choice<const T extends readonly [string, ...string[]]>(label: string, options: T) {
  return z
    .enum(options, { error: (i) => (i.input === undefined ? `${label} is required` : `${label} must be one of: ${options.join(', ')}`) })
    .meta({ title: label });
}

const unknownKeys = (where: string) => ({
  error: (issue: { code?: string; keys?: string[] }) =>
    issue.code === 'unrecognized_keys'
      ? `Unknown field${(issue.keys?.length ?? 0) > 1 ? 's' : ''} in ${where}: ${issue.keys?.join(', ')}`
      : issue.code === 'invalid_type'
        ? `${where} must be an object`
        : undefined,
});

const vehicleSchema = z.strictObject(
  {
    class: choice('Class', CLASS_SLUGS),
    chassis: text('Chassis', 120),
    drivetrain: choice('Drivetrain', DRIVETRAINS),
  },
  unknownKeys('vehicle'),
);

const motorShape = {
  kvRpmPerV: num('Motor kV', 'rpm/V', 100, 20_000).optional(),
  windTurns: num('Wind', 'turns', 1, 40).optional(),
  poles: num('Rotor poles', 'poles', 2, 24, { int: true, even: true }),
  sensored: z.boolean({ error: 'Sensored must be true or false' }),
  endbellTimingDeg: num('Endbell timing', 'deg', 0, 60).optional(),
};

/** Version 2: the member's registered motor this setup used (an id from their motor register, private to them). */
const registeredMotorId = z
  .uuid({ error: 'Registered motor must be a motor id from your motor register' })
  .meta({ title: 'Registered motor', description: 'Id of a motor in the owner’s motor register (schema version 2)' });

const gearingSchema = z.strictObject(
  {
    spurTeeth: num('Spur', 'teeth', 10, 200, { int: true }),
    pinionTeeth: num('Pinion', 'teeth', 5, 100, { int: true }),
    internalRatio: num('Internal ratio', ':1', 0.5, 60),
    tyreDiameterMm: num('Tyre diameter', 'mm', 20, 250),
  },
  unknownKeys('gearing'),
);

const batterySchema = z.strictObject(
  {
    chemistry: choice('Chemistry', packChemistries),
    cells: num('Cells', 'S', 1, 12, { int: true }),
    capacityMah: num('Capacity', 'mAh', 100, 30_000, { int: true }).optional(),
  },
  unknownKeys('battery'),
);

const conditionsSchema = z.strictObject(
  {
    surface: choice('Surface', SURFACE_SLUGS),
    layout: text('Layout', 300).optional(),
    ambientTempC: num('Ambient temperature', '°C', -30, 60).optional(),
    trackTempC: num('Track temperature', '°C', -30, 80).optional(),
  },
  unknownKeys('conditions'),
);

const provenanceSchema = z.strictObject(
  {
    guideSlug: z
      .string()
      .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Guide slug: lowercase letters, digits and single hyphens')
      .max(120)
      .optional(),
    guideTitle: text('Guide title', 140).optional(),
    revisionNumber: num('Revision number', '', 1, 100_000, { int: true }).optional(),
    authorDisplayName: text("Author's name", 60).optional(),
    exportedAt: z.iso.datetime({ error: 'Exported at must be an ISO 8601 date and time (e.g. 2025-03-01T18:30:00Z)' }).optional(),
  },
  unknownKeys('provenance'),
);

/** One ESC setting: a number in the unit the parameter library gives for that slug. */
export const escSettingSchema = z.strictObject(
  {
    value: num('Value', '', -1_000_000, 1_000_000),
    unit: z.string({ error: 'Unit must be text ("" for a choice)' }).max(12),
  },
  unknownKeys('an ESC setting'),
);

const escSettingsStructure = z
  .record(z.string().regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Setting keys are parameter slugs (lowercase letters, digits and hyphens)'), escSettingSchema, {
    error: 'escSettings must be an object of parameter slug → { value, unit }',
  })
  .meta({ title: 'ESC settings', description: 'Parameter slug → { value, unit }; slugs and units come from the parameter library.' });

function structure(
  escSettings: z.ZodType<Record<string, z.infer<typeof escSettingSchema>>>,
  motorRefined: boolean,
  versions: readonly SetupSchemaVersion[] = SETUP_SCHEMA_VERSIONS,
) {
  const motorBase = z.strictObject(
    { ...motorShape, ...(versions.includes(2) ? { registeredMotorId: registeredMotorId.optional() } : {}) },
    unknownKeys('motor'),
  );
  const motor = motorRefined
    ? motorBase.superRefine((m, ctx) => {
        if (m.kvRpmPerV === undefined && m.windTurns === undefined)
          ctx.addIssue({ code: 'custom', path: ['kvRpmPerV'], message: 'Give the motor kV (rpm/V) or its wind (turns), or both' });
      })
    : motorBase;
  return z
    .strictObject(
      {
        format: z.literal(SETUP_FORMAT, { error: `format must be "${SETUP_FORMAT}"` }),
        schemaVersion: z.literal(versions, { error: `schemaVersion must be ${versions.join(' or ')}` }),
        vehicle: vehicleSchema,
        motor,
        escSettings,
        gearing: gearingSchema,
        battery: batterySchema,
        conditions: conditionsSchema,
        notes: text('Notes', 4000).optional(),
        provenance: provenanceSchema.optional(),
      },
      unknownKeys('the setup record'),
    )
    .superRefine((r, ctx) => {
      const motor = r.motor as { registeredMotorId?: string };
      if (r.schemaVersion === 1 && motor.registeredMotorId !== undefined) {
        ctx.addIssue({ code: 'custom', path: ['motor', 'registeredMotorId'], message: 'A registered motor needs schemaVersion 2' });
      }
    });
}

/**
 * The structure of a setup record without the checks that need the parameter library; the
 * JSON Schema is generated from this.
 */
export const setupRecordStructureSchema = structure(escSettingsStructure, false);

/** A setup record (the same type before and after validation). */
export type SetupRecord = z.infer<typeof setupRecordStructureSchema>;
export type EscSetting = z.infer<typeof escSettingSchema>;

/** What the schema needs to know about one library parameter to check an ESC setting. */
export type SettingDefinition = { slug: string; name: string; unit: string; range: { min: number; max: number; step: number } };

function closest(slug: string, known: readonly string[]): string | undefined {
  let best: string | undefined;
  let bestScore = Infinity;
  for (const k of known) {
    if (k.includes(slug) || slug.includes(k)) return k;
    // Small Levenshtein distance: enough to catch a typo such as "drag-brak".
    const d = levenshtein(slug, k);
    if (d < bestScore) {
      bestScore = d;
      best = k;
    }
  }
  return bestScore <= 3 ? best : undefined;
}

const unitLabel = (unit: string) => (unit === '' ? 'no unit (a choice or a count)' : `"${unit}"`);

/** Checks each ESC setting against the library: known slug, the library's unit, inside its range. */
function checkEscSettings(library: readonly SettingDefinition[]) {
  const bySlug = new Map(library.map((d) => [d.slug, d]));
  const known = library.map((d) => d.slug).filter((s) => !(s in SLUGS_WITH_OWN_FIELD));
  return (settings: Record<string, EscSetting>, ctx: z.RefinementCtx) => {
    for (const [slug, setting] of Object.entries(settings)) {
      const own = SLUGS_WITH_OWN_FIELD[slug];
      if (own) {
        ctx.addIssue({ code: 'custom', path: [slug], message: `"${slug}" has its own field: put it in ${own}, not in escSettings` });
        continue;
      }
      const def = bySlug.get(slug);
      if (!def) {
        const hint = closest(slug, known);
        ctx.addIssue({
          code: 'custom',
          path: [slug],
          message: `Unknown setting "${slug}": it is not in the parameter library.${hint ? ` Did you mean "${hint}"?` : ''}`,
        });
        continue;
      }
      if (setting.unit !== def.unit) {
        ctx.addIssue({ code: 'custom', path: [slug, 'unit'], message: `${def.name} is set in ${unitLabel(def.unit)}, not ${unitLabel(setting.unit)}` });
      }
      const { min, max } = def.range;
      if (setting.value < min || setting.value > max) {
        ctx.addIssue({
          code: 'custom',
          path: [slug, 'value'],
          message: `${def.name} must be between ${withUnit(min, def.unit)} and ${withUnit(max, def.unit)} (got ${withUnit(setting.value, def.unit)})`,
        });
      } else if (def.unit === '' && def.range.step === 1 && !Number.isInteger(setting.value)) {
        ctx.addIssue({ code: 'custom', path: [slug, 'value'], message: `${def.name} is a choice or a count: use a whole number from ${min} to ${max}` });
      }
    }
  };
}

/**
 * The full setup-record schema: the structure plus the checks against the parameter library
 * (known slugs, the library's units and ranges) and the motor's "kV or wind" rule.
 */
export function setupRecordSchema(library: readonly SettingDefinition[]) {
  return structure(escSettingsStructure.superRefine(checkEscSettings(library)), true);
}

/** The JSON Schema (2020-12) of one version (the current one by default), generated from the structure schema. */
export function setupRecordJsonSchema(id?: string, version: SetupSchemaVersion = SETUP_SCHEMA_VERSION): Record<string, unknown> {
  const generated = z.toJSONSchema(structure(escSettingsStructure, false, [version]), { target: 'draft-2020-12' }) as Record<string, unknown>;
  return {
    $schema: 'https://json-schema.org/draft/2020-12/schema',
    ...(id ? { $id: id } : {}),
    title: `Tunewright setup record, version ${version}`,
    description:
      'A baseline setup for a radio-controlled car: vehicle, motor, ESC settings keyed by parameter slug, gearing, battery, conditions, notes and provenance. ' +
      'Units are in the field names. The server also checks ESC settings against the parameter library (known slugs, units and ranges) and that the motor gives kV or wind.',
    ...generated,
  };
}

/** Orders a record's keys the way the schema lists them (escSettings by slug), so exports are stable. */
export function canonicalRecord(record: SetupRecord): SetupRecord {
  const parsed = setupRecordStructureSchema.parse(record);
  const escSettings = Object.fromEntries(
    Object.keys(parsed.escSettings)
      .sort()
      .map((slug) => [slug, { value: parsed.escSettings[slug].value, unit: parsed.escSettings[slug].unit }]),
  );
  return { ...parsed, escSettings };
}
