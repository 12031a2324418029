import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalRecord } from '../../../shared/schemas/setup-record';
import { computeSetup } from '../../../shared/setup/computed';
import { setupFromCsv, setupToCsv } from '../../../shared/setup/csv';
import { flattenSetup } from '../../../shared/setup/fields';
import { parseSetupText } from '../../../shared/setup/import';
import { buildSetupRecord, contentLibrary, setupRecordArbitrary } from '../../factories/setup-record';

const library = contentLibrary();

describe('setup CSV layout', () => {
  it('round-trips any valid record, computed rows included (property)', () => {
    fc.assert(
      fc.property(setupRecordArbitrary(library), (record) => {
        const csv = setupToCsv(record, computeSetup(record));
        const back = parseSetupText(csv, 'csv', library);
        expect(back.ok, JSON.stringify(!back.ok && back.issues)).toBe(true);
        if (back.ok) expect(canonicalRecord(back.record)).toEqual(canonicalRecord(record));
      }),
      { numRuns: 150 },
    );
  });

  it('is RFC 4180 that an independent parser reads back to the same values (property)', () => {
    fc.assert(
      fc.property(setupRecordArbitrary(library), (record) => {
        const csv = setupToCsv(record);
        expect(csv.endsWith('\r\n')).toBe(true);
        const rows: string[][] = parse(csv, { relaxColumnCount: false });
        expect(rows[0]).toEqual(['path', 'value', 'unit', 'source']);
        const byPath = new Map(rows.slice(1).map((r) => [r[0], r]));
        for (const leaf of flattenSetup(record)) {
          const row = byPath.get(leaf.path);
          expect(row, leaf.path).toBeDefined();
          const text = row![1];
          if (typeof leaf.value === 'number') expect(Number(text)).toBe(leaf.value);
          else if (typeof leaf.value === 'boolean') expect(text).toBe(String(leaf.value));
          // Free text that a spreadsheet would run as a formula carries a leading apostrophe.
          else expect(text.replace(/^'(?='*[=+\-@\t\r])/, '')).toBe(leaf.value);
          expect(row![2]).toBe(leaf.unit);
          expect(row![3]).toBe('record');
        }
      }),
      { numRuns: 150 },
    );
  });

  it('marks computed values and cautions as computed rows', () => {
    const record = buildSetupRecord({ escSettings: { 'low-voltage-cutoff': { value: 2.9, unit: 'V' } } });
    const rows: string[][] = parse(setupToCsv(record, computeSetup(record)));
    const computed = rows.filter((r) => r[3] === 'computed');
    expect(computed.find((r) => r[0] === 'computed.finalDriveRatio')?.[1]).toBe('6.825');
    expect(computed.find((r) => r[0] === 'computed.cautions.1.code')?.[1]).toBe('cutoff-below-window');
    expect(computed.every((r) => r[0].startsWith('computed.'))).toBe(true);
  });

  it('lists each unreadable row by path', () => {
    const csv =
      'path,value,unit,source\r\nformat,tunewright.setup,,record\r\nschemaVersion,1,,record\r\ngearing.spurTeeth,eighty,teeth,record\r\ngearing.tyreDiameterMm,2.4,in,record\r\nmotor.colour,red,,record\r\n';
    const { issues } = setupFromCsv(csv);
    expect(issues.map((i) => i.path)).toEqual(['gearing.spurTeeth', 'gearing.tyreDiameterMm', 'motor.colour']);
    expect(issues[1].message).toContain('"mm"');
  });

  it('refuses a CSV in any other layout as the wrong kind of file', () => {
    const result = parseSetupText('name,pinion\nmine,32\n', 'csv', library);
    expect(result).toMatchObject({ ok: false, status: 415 });
  });
});
