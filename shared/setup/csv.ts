import Papa from 'papaparse';
import type { SetupRecord } from '../schemas/setup-record';
import type { SetupComputed } from './computed';
import { flattenSetup, SETUP_FIELD_BY_PATH, type SetupLeafValue } from './fields';

// Our CSV layout (RFC 4180: comma-separated, CRLF line ends, fields quoted when they hold a comma,
// quote or line break): a header `path,value,unit,source`, then one row per field. `source` is
// `record` for fields of the record and `computed` for values worked out from it (ratio, rollout,
// speeds, pack voltages, timing, cautions). Importing reads the record rows and ignores the
// computed ones, since they are recomputed from the record anyway.

/** The header row of our CSV layout. */
export const SETUP_CSV_HEADER = ['path', 'value', 'unit', 'source'] as const;

type Row = [path: string, value: string, unit: string, source: 'record' | 'computed'];

// Spreadsheets run a cell that starts with one of these as a formula; a leading apostrophe stops
// that. Only free-text fields get it (numbers like -20 must stay numbers), and import removes it.
// Text that already starts with apostrophes before such a character gets one more, so the
// escape is lossless both ways.
const NEEDS_ESCAPE = /^'*[=+\-@\t\r]/;
/** Prefixes text a spreadsheet would run as a formula with an apostrophe (lossless; import removes it). */
export const escapeText = (s: string) => (NEEDS_ESCAPE.test(s) ? `'${s}` : s);
const unescapeText = (s: string) => (s.startsWith("'") && NEEDS_ESCAPE.test(s.slice(1)) ? s.slice(1) : s);

function cell(value: SetupLeafValue, textField: boolean): string {
  if (typeof value === 'string') return textField ? escapeText(value) : value;
  return String(value);
}

function computedRows(c: SetupComputed): Row[] {
  const rows: Row[] = [];
  const put = (path: string, value: number | string | null | undefined, unit = '') => {
    if (value === null || value === undefined) return;
    rows.push([`computed.${path}`, String(value), unit, 'computed']);
  };
  if (c.gearing) {
    put('finalDriveRatio', c.gearing.finalDriveRatio, ':1');
    put('rolloutMm', c.gearing.rolloutMm, 'mm');
    put('rolloutIn', c.gearing.rolloutIn, 'in');
    put('kmhPer1000Rpm', c.gearing.kmhPer1000Rpm, 'km/h');
  }
  if (c.motor) {
    put('motor.volts', c.motor.volts, 'V');
    put('motor.noLoadRpm', c.motor.noLoadRpm, 'rpm');
  }
  if (c.speed) {
    put('speed.noLoadKmh', c.speed.noLoadKmh, 'km/h');
    put('speed.loadFactor', c.speed.loadFactor);
    put('speed.loadedKmh', c.speed.loadedKmh, 'km/h');
    put('speed.loadedMph', c.speed.loadedMph, 'mph');
  }
  if (c.pack) {
    put('pack.fullV', c.pack.fullV, 'V');
    put('pack.nominalV', c.pack.nominalV, 'V');
    put('pack.storageV', c.pack.storageV, 'V');
    put('pack.cutoffWindowMinV', c.pack.cutoffWindowV.min, 'V');
    put('pack.cutoffWindowMaxV', c.pack.cutoffWindowV.max, 'V');
    put('pack.cutoffV', c.pack.cutoffV, 'V');
    put('pack.cutoffCheck', c.pack.cutoffCheck);
  }
  if (c.timing) {
    put('timing.atRpm', c.timing.atRpm, 'rpm');
    put('timing.controllerDeg', c.timing.controllerDeg, 'deg');
    put('timing.endbellElectricalDeg', c.timing.endbellElectricalDeg, 'deg');
    put('timing.totalDeg', c.timing.totalDeg, 'deg');
    put('timing.maxCombinedDeg', c.timing.maxCombinedDeg, 'deg');
  }
  c.cautions.forEach((w, i) => {
    put(`cautions.${i + 1}.level`, w.level);
    put(`cautions.${i + 1}.code`, w.code);
    put(`cautions.${i + 1}.message`, w.message);
  });
  return rows;
}

/** Writes a record (and, when given, its computed values and cautions) in our CSV layout. */
export function setupToCsv(record: SetupRecord, computed?: SetupComputed): string {
  const rows: Row[] = [
    ['format', record.format, '', 'record'],
    ['schemaVersion', String(record.schemaVersion), '', 'record'],
  ];
  for (const leaf of flattenSetup(record)) {
    const def = SETUP_FIELD_BY_PATH.get(leaf.path);
    rows.push([leaf.path, cell(leaf.value, def?.type === 'string'), leaf.unit, 'record']);
  }
  if (computed) rows.push(...computedRows(computed));
  return Papa.unparse({ fields: [...SETUP_CSV_HEADER], data: rows }, { newline: '\r\n', quotes: false }) + '\r\n';
}

/** A problem found while reading a CSV, addressed by record path (or `csv` for the file itself). */
export type CsvIssue = { path: string; message: string };

function stripBom(text: string) {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** True when the text starts with our CSV header (used to tell our layout from any other CSV). */
export function looksLikeSetupCsv(text: string): boolean {
  const firstLine = stripBom(text).split(/\r?\n/, 1)[0] ?? '';
  const cells = firstLine.split(',').map((c) => c.trim().replace(/^"|"$/g, '').toLowerCase());
  return cells[0] === 'path' && cells[1] === 'value' && cells[2] === 'unit' && (cells.length === 3 || cells[3] === 'source');
}

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Reads our CSV layout back into an (unvalidated) record object, listing every row it could not
 * read; the caller validates the result with the setup-record schema.
 */
export function setupFromCsv(text: string): { record: Record<string, unknown>; issues: CsvIssue[] } {
  const issues: CsvIssue[] = [];
  const record: Record<string, unknown> = {};
  const parsed = Papa.parse<string[]>(stripBom(text), { skipEmptyLines: 'greedy' });
  for (const e of parsed.errors) issues.push({ path: 'csv', message: `Row ${(e.row ?? 0) + 1}: ${e.message}` });
  const [header, ...rows] = parsed.data;
  if (!header || !looksLikeSetupCsv(header.join(','))) {
    issues.push({ path: 'csv', message: 'The first row must be the header path,value,unit,source' });
    return { record, issues };
  }
  const seen = new Set<string>();
  const set = (path: string, value: unknown) => {
    const [head, tail] = path.split('.', 2) as [string, string | undefined];
    if (tail === undefined) record[head] = value;
    else record[head] = { ...((record[head] as Record<string, unknown>) ?? {}), [tail]: value };
  };
  rows.forEach((cells, i) => {
    const rowNo = i + 2;
    const [rawPath = '', value = '', unit = '', source = 'record'] = cells.map((c) => c ?? '');
    const path = rawPath.trim();
    if (source.trim() === 'computed' || path.startsWith('computed.')) return;
    if (cells.length < 3 || cells.length > 4) {
      issues.push({ path: path || 'csv', message: `Row ${rowNo}: expected 3 or 4 columns (path,value,unit,source), found ${cells.length}` });
      return;
    }
    if (seen.has(path)) {
      issues.push({ path, message: `Row ${rowNo}: ${path} appears more than once` });
      return;
    }
    seen.add(path);
    const number = (label: string): number | undefined => {
      const v = value.trim();
      if (v === '') {
        issues.push({ path, message: `Row ${rowNo}: ${label} has no value; fill it in or delete the row` });
        return undefined;
      }
      if (!NUMBER.test(v)) {
        issues.push({ path, message: `Row ${rowNo}: ${label} must be a number (got "${v}")` });
        return undefined;
      }
      return Number(v);
    };
    if (path === 'format') return set('format', value.trim());
    if (path === 'schemaVersion') {
      const n = number('schemaVersion');
      if (n !== undefined) set('schemaVersion', n);
      return;
    }
    if (path.startsWith('escSettings.')) {
      const slug = path.slice('escSettings.'.length);
      const n = number(slug);
      if (n !== undefined) record.escSettings = { ...((record.escSettings as Record<string, unknown>) ?? {}), [slug]: { value: n, unit: unit.trim() } };
      return;
    }
    const def = SETUP_FIELD_BY_PATH.get(path);
    if (!def) {
      issues.push({ path, message: `Row ${rowNo}: unknown field "${path}"` });
      return;
    }
    if (unit.trim() !== '' && unit.trim() !== def.unit) {
      issues.push({ path, message: `Row ${rowNo}: ${def.label} is recorded in ${def.unit ? `"${def.unit}"` : 'no unit'}, not "${unit.trim()}"` });
      return;
    }
    switch (def.type) {
      case 'number':
      case 'integer': {
        const n = number(def.label);
        if (n !== undefined) set(path, n);
        return;
      }
      case 'boolean': {
        const v = value.trim().toLowerCase();
        if (v === 'true' || v === 'false') set(path, v === 'true');
        else issues.push({ path, message: `Row ${rowNo}: ${def.label} must be true or false (got "${value}")` });
        return;
      }
      case 'enum':
        return set(path, value.trim());
      case 'string':
        return set(path, unescapeText(value));
    }
  });
  if (!('escSettings' in record) && seen.has('format')) record.escSettings = {};
  return { record, issues };
}
