import Papa from 'papaparse';
import type { Check, Motor } from '../schemas/motor';
import { escapeText } from '../setup/csv';
import { BENCH_READINGS, QUANTITY_INFO } from './quantities';

// Our CSV layout for a motor's bench checks (RFC 4180: comma-separated, CRLF, quoted where needed),
// one row per check, one column per value, units in the header as `name (unit)`. Each reading has its
// mean, its spread (largest minus smallest repeat) and how many repeats it had. Free text that a
// spreadsheet would run as a formula gets a leading apostrophe, as in the setup CSV.

const num = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(Number(v.toPrecision(10))));

/** The header row of the bench-check CSV. */
export function benchCsvHeader(): string[] {
  const cols = ['motor', 'check id', 'tested at (UTC)', 'reference'];
  for (const q of BENCH_READINGS) {
    const { label, unit } = QUANTITY_INFO[q];
    cols.push(`${label} (${unit})`, `${label} spread (${unit})`, `${label} repeats`);
  }
  cols.push('resistance temperature (°C)', 'measured kV (rpm/V)', 'resistance at 20 °C (Ω)', 'notes');
  return cols;
}

/** Writes a motor's checks in our CSV layout. */
export function benchChecksToCsv(motor: Pick<Motor, 'label'>, checks: Check[]): string {
  const rows = checks.map((c) => {
    const row = [escapeText(motor.label), c.id, c.testedAt, c.isReference ? 'yes' : 'no'];
    for (const q of BENCH_READINGS) {
      const r = c.readings[q];
      row.push(num(r?.mean), num(r?.spread), r ? String(r.values.length) : '');
    }
    row.push(num(c.resistanceTempC), num(c.computed.measuredKv), num(c.computed.resistanceAt20COhm), escapeText(c.notes));
    return row;
  });
  return Papa.unparse({ fields: benchCsvHeader(), data: rows }, { newline: '\r\n', quotes: false }) + '\r\n';
}
