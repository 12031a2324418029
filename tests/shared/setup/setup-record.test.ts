import Ajv2020 from 'ajv/dist/2020';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalRecord, setupRecordJsonSchema, setupRecordSchema, setupRecordStructureSchema } from '../../../shared/schemas/setup-record';
import { parseSetupText, validateSetupObject } from '../../../shared/setup/import';
import { buildSetupRecord, contentLibrary, setupRecordArbitrary } from '../../factories/setup-record';

const library = contentLibrary();
const schema = setupRecordSchema(library);
const issuesOf = (value: unknown) => {
  const r = schema.safeParse(value);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
};

describe('setupRecordSchema(library)', () => {
  it('accepts a complete record and returns it unchanged', () => {
    const record = buildSetupRecord();
    expect(schema.parse(record)).toEqual(record);
  });

  it('refuses an unknown ESC slug, naming it and suggesting the close one', () => {
    const issues = issuesOf(buildSetupRecord({ escSettings: { 'drag-brak': { value: 8, unit: '%' } } }));
    expect(issues).toEqual([{ path: 'escSettings.drag-brak', message: expect.stringMatching(/Unknown setting "drag-brak".*Did you mean "drag-brake"/) }]);
  });

  it("checks each setting against the library's range and unit", () => {
    const issues = issuesOf(
      buildSetupRecord({
        escSettings: { 'drag-brake': { value: 120, unit: '%' }, 'static-timing': { value: 10, unit: '°' }, 'reverse-mode': { value: 1.5, unit: '' } },
      }),
    );
    expect(issues.map((i) => i.path).sort()).toEqual(['escSettings.drag-brake.value', 'escSettings.reverse-mode.value', 'escSettings.static-timing.unit']);
    expect(issues.find((i) => i.path === 'escSettings.drag-brake.value')?.message).toBe('Drag brake must be between 0 % and 100 % (got 120 %)');
  });

  it('sends settings that have their own field to that field', () => {
    const issues = issuesOf(buildSetupRecord({ escSettings: { 'motor-kv': { value: 2200, unit: 'rpm/V' } } }));
    expect(issues).toEqual([{ path: 'escSettings.motor-kv', message: expect.stringContaining('motor.kvRpmPerV') }]);
  });

  it('lists every problem at once, across sections', () => {
    const bad = buildSetupRecord({
      gearing: { spurTeeth: 84, pinionTeeth: 3, internalRatio: 2.6, tyreDiameterMm: 62 },
      escSettings: { nonsense: { value: 1, unit: '' } },
    });
    const issues = issuesOf({ ...bad, motor: { poles: 3, sensored: true }, extra: 1 });
    const paths = issues.map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['gearing.pinionTeeth', 'escSettings.nonsense', 'motor.poles', 'motor.kvRpmPerV', '']));
  });

  it('reports a schema version other than 1 or 2 on its own, plainly', () => {
    const result = validateSetupObject({ ...buildSetupRecord(), schemaVersion: 3 }, library);
    expect(result).toEqual({ ok: false, status: 400, issues: [{ path: 'schemaVersion', message: expect.stringContaining('schema version 3') }] });
  });

  it('version 2 may name a registered motor; version 1 may not', () => {
    const motorId = '3f0c9a52-8d0e-4a51-9a51-2a7f0e0d1c11';
    const v2 = { ...buildSetupRecord(), schemaVersion: 2, motor: { ...buildSetupRecord().motor, registeredMotorId: motorId } };
    expect(validateSetupObject(v2, library)).toMatchObject({ ok: true, record: { schemaVersion: 2, motor: { registeredMotorId: motorId } } });
    expect(validateSetupObject({ ...v2, schemaVersion: 1 }, library)).toEqual({
      ok: false,
      status: 400,
      issues: [{ path: 'motor.registeredMotorId', message: 'A registered motor needs schemaVersion 2' }],
    });
    expect(validateSetupObject({ ...v2, motor: { ...v2.motor, registeredMotorId: 'blue-can' } }, library)).toMatchObject({
      ok: false,
      issues: [{ path: 'motor.registeredMotorId' }],
    });
    expect(validateSetupObject(buildSetupRecord(), library).ok).toBe(true); // version 1 records are still read
  });

  it('says where JSON is broken', () => {
    const result = parseSetupText('{"format": "tunewright.setup",', 'json', library);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues[0]).toEqual({ path: '(file)', message: expect.stringMatching(/^Not valid JSON/) });
  });

  it('canonicalRecord keeps every value and only orders keys (property)', () => {
    fc.assert(
      fc.property(setupRecordArbitrary(library), (record) => {
        const canonical = canonicalRecord(record);
        expect(canonical).toEqual(record);
        expect(Object.keys(canonical.escSettings)).toEqual(Object.keys(record.escSettings).sort());
      }),
      { numRuns: 150 },
    );
  });
});

describe('JSON Schema of the setup record', () => {
  const ajv = new Ajv2020({ allErrors: true, strict: false, validateFormats: false });
  const validate = ajv.compile(setupRecordJsonSchema('https://tunewright.test/schemas/setup-record.v1.json', 1));

  it('is a 2020-12 schema that ajv compiles', () => {
    const s = setupRecordJsonSchema();
    expect(s.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(s.type).toBe('object');
  });

  it('accepts every record the zod schema accepts (property)', () => {
    fc.assert(
      fc.property(setupRecordArbitrary(library), (record) => {
        expect(schema.safeParse(record).success).toBe(true);
        expect(validate(record), JSON.stringify(validate.errors)).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it('refuses what the structure refuses: unknown fields, wrong types, out-of-bounds numbers', () => {
    const good = buildSetupRecord();
    expect(validate(good)).toBe(true);
    for (const bad of [
      { ...good, colour: 'red' },
      { ...good, schemaVersion: 3 },
      { ...good, gearing: { ...good.gearing, pinionTeeth: 32.5 } },
      { ...good, gearing: { ...good.gearing, tyreDiameterMm: '62' } },
      { ...good, motor: { ...good.motor, poles: 3 } },
      { ...good, escSettings: { 'Drag Brake': { value: 8, unit: '%' } } },
      { ...good, battery: { ...good.battery, chemistry: 'lead-acid' } },
    ]) {
      expect(validate(bad)).toBe(false);
      expect(setupRecordStructureSchema.safeParse(bad).success).toBe(false);
    }
  });
});
