import fc from 'fast-check';
import { CLASS_SLUGS, SURFACE_SLUGS } from '../../shared/constants';
import { SLUGS_WITH_OWN_FIELD, type SettingDefinition, type SetupRecord } from '../../shared/schemas/setup-record';
import { readParameterFiles } from '../../server/db/seed-content';

/** The parameter library as the content files define it (what the seeded database holds). */
export function contentLibrary(): SettingDefinition[] {
  return readParameterFiles().map(({ slug, content }) => ({ slug, name: content.name, unit: content.unit, range: content.range }));
}

/** A valid record to start a test from; override what the test is about. */
export function buildSetupRecord(overrides: Partial<SetupRecord> = {}): SetupRecord {
  return {
    format: 'tunewright.setup',
    schemaVersion: 1,
    vehicle: { class: 'buggy-2wd-stock', chassis: '2WD buggy, mid-motor', drivetrain: '2wd' },
    motor: { kvRpmPerV: 2200, windTurns: 17.5, poles: 2, sensored: true, endbellTimingDeg: 30 },
    escSettings: {
      'drag-brake': { value: 8, unit: '%' },
      'low-voltage-cutoff': { value: 3.2, unit: 'V' },
      'zero-timing-mode': { value: 1, unit: '' },
    },
    gearing: { spurTeeth: 84, pinionTeeth: 32, internalRatio: 2.6, tyreDiameterMm: 62 },
    battery: { chemistry: 'lipo', cells: 2, capacityMah: 5000 },
    conditions: { surface: 'clay', layout: 'Test layout', ambientTempC: 20 },
    notes: 'Made by a test.',
    ...overrides,
  };
}

const text = (max: number) => fc.string({ maxLength: max, unit: fc.constantFrom('a', 'B', ' ', ',', '"', '\n', '=', '-', "'", 'é', '7', '°') });
const decimal = (min: number, max: number, step = 0.5) => fc.integer({ min: Math.ceil(min / step), max: Math.floor(max / step) }).map((n) => n * step);

/** Arbitrary valid records, for property checks (values inside the schema's and the library's bounds). */
export function setupRecordArbitrary(library: SettingDefinition[]): fc.Arbitrary<SetupRecord> {
  // Slugs with a field of their own (or bench readings) are refused inside escSettings.
  const usable = library.filter((d) => !(d.slug in SLUGS_WITH_OWN_FIELD));
  const esc = fc
    .subarray(usable, { maxLength: 8 })
    .chain((defs) =>
      fc.tuple(
        ...defs.map((d) =>
          fc
            .integer({ min: 0, max: Math.round((d.range.max - d.range.min) / d.range.step) })
            .map((k) => ({ slug: d.slug, unit: d.unit, value: Number((d.range.min + k * d.range.step).toFixed(4)) })),
        ),
      ),
    );
  return fc
    .record({
      cls: fc.constantFrom(...CLASS_SLUGS),
      chassis: text(40),
      drivetrain: fc.constantFrom('2wd' as const, '4wd' as const),
      kv: fc.option(fc.integer({ min: 500, max: 12_000 }), { nil: undefined }),
      wind: fc.option(decimal(3, 30), { nil: undefined }),
      poles: fc.constantFrom(2, 4, 6),
      sensored: fc.boolean(),
      endbell: fc.option(fc.integer({ min: 0, max: 50 }), { nil: undefined }),
      esc,
      spur: fc.integer({ min: 40, max: 120 }),
      pinion: fc.integer({ min: 8, max: 50 }),
      internal: decimal(1, 10, 0.01),
      tyre: decimal(40, 120, 0.1),
      chemistry: fc.constantFrom('lipo' as const, 'lihv' as const, 'lifepo4' as const, 'nimh' as const),
      cells: fc.integer({ min: 1, max: 6 }),
      capacity: fc.option(fc.integer({ min: 1000, max: 9000 }), { nil: undefined }),
      surface: fc.constantFrom(...SURFACE_SLUGS),
      layout: fc.option(text(60), { nil: undefined }),
      ambient: fc.option(decimal(-10, 40), { nil: undefined }),
      notes: fc.option(text(120), { nil: undefined }),
    })
    .map((r): SetupRecord => {
      const motor: SetupRecord['motor'] = { poles: r.poles, sensored: r.sensored };
      if (r.kv !== undefined || r.wind === undefined) motor.kvRpmPerV = r.kv ?? 3000;
      if (r.wind !== undefined) motor.windTurns = r.wind;
      if (r.endbell !== undefined) motor.endbellTimingDeg = r.endbell;
      const record: SetupRecord = {
        format: 'tunewright.setup',
        schemaVersion: 1,
        vehicle: { class: r.cls, chassis: r.chassis, drivetrain: r.drivetrain },
        motor,
        escSettings: Object.fromEntries(r.esc.map((e) => [e.slug, { value: e.value, unit: e.unit }])),
        gearing: { spurTeeth: r.spur, pinionTeeth: r.pinion, internalRatio: Number(r.internal.toFixed(2)), tyreDiameterMm: Number(r.tyre.toFixed(1)) },
        battery: { chemistry: r.chemistry, cells: r.cells, ...(r.capacity !== undefined ? { capacityMah: r.capacity } : {}) },
        conditions: {
          surface: r.surface,
          ...(r.layout !== undefined ? { layout: r.layout } : {}),
          ...(r.ambient !== undefined ? { ambientTempC: r.ambient } : {}),
        },
      };
      if (r.notes !== undefined) record.notes = r.notes;
      return record;
    });
}
