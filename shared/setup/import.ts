import type { z } from 'zod';
import {
  SETUP_FORMAT,
  SETUP_SCHEMA_VERSION,
  SETUP_SCHEMA_VERSIONS,
  setupRecordSchema,
  type SettingDefinition,
  type SetupRecord,
} from '../schemas/setup-record';
import { looksLikeSetupCsv, setupFromCsv } from './csv';

/** One problem with an imported setup, addressed by its path in the record. */
export type SetupIssue = { path: string; message: string };

/** The outcome of reading a setup file's text: a valid record, or every problem with an HTTP-style status. */
export type SetupImportResult = { ok: true; record: SetupRecord } | { ok: false; status: 400 | 415; issues: SetupIssue[] };

/** Maps zod issues to `{ path, message }` rows, naming unknown keys in the path. */
export function setupIssuesFromZod(error: z.ZodError): SetupIssue[] {
  return error.issues.flatMap((i) => {
    const base = i.path.map(String);
    if (i.code === 'unrecognized_keys') return i.keys.map((k) => ({ path: [...base, k].join('.'), message: i.message }));
    return [{ path: base.join('.') || '(record)', message: i.message }];
  });
}

/** Validates an already-parsed object as a setup record (version 1 or 2) against the parameter library. */
export function validateSetupObject(value: unknown, library: readonly SettingDefinition[]): SetupImportResult {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    return {
      ok: false,
      status: 400,
      issues: [
        {
          path: '(record)',
          message: 'A setup record is a JSON object with format, schemaVersion, vehicle, motor, escSettings, gearing, battery and conditions',
        },
      ],
    };
  }
  const v = value as Record<string, unknown>;
  if (v.format !== undefined && v.format !== SETUP_FORMAT) {
    return {
      ok: false,
      status: 400,
      issues: [{ path: 'format', message: `This is not a Tunewright setup record (format is ${JSON.stringify(v.format)}, expected "${SETUP_FORMAT}")` }],
    };
  }
  if (v.schemaVersion !== undefined && !(SETUP_SCHEMA_VERSIONS as readonly unknown[]).includes(v.schemaVersion)) {
    return {
      ok: false,
      status: 400,
      issues: [
        {
          path: 'schemaVersion',
          message: `This file uses schema version ${JSON.stringify(v.schemaVersion)}; Tunewright reads versions ${SETUP_SCHEMA_VERSIONS.join(' and ')}. Export it again as version ${SETUP_SCHEMA_VERSION}.`,
        },
      ],
    };
  }
  const parsed = setupRecordSchema(library).safeParse(value);
  if (!parsed.success) return { ok: false, status: 400, issues: setupIssuesFromZod(parsed.error) };
  return { ok: true, record: parsed.data };
}

/** Reads the text of a `.json` or `.csv` setup file (our JSON or our CSV layout) and validates it. */
export function parseSetupText(text: string, kind: 'json' | 'csv', library: readonly SettingDefinition[]): SetupImportResult {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (kind === 'json') {
    let value: unknown;
    try {
      value = JSON.parse(body);
    } catch (err) {
      return { ok: false, status: 400, issues: [{ path: '(file)', message: `Not valid JSON: ${(err as Error).message}` }] };
    }
    return validateSetupObject(value, library);
  }
  if (!looksLikeSetupCsv(body)) {
    return {
      ok: false,
      status: 415,
      issues: [{ path: '(file)', message: 'This CSV is not in the Tunewright layout: the first row must be path,value,unit,source' }],
    };
  }
  const { record, issues } = setupFromCsv(body);
  if (record.schemaVersion !== undefined && !(SETUP_SCHEMA_VERSIONS as readonly unknown[]).includes(record.schemaVersion))
    return validateSetupObject(record, library);
  const checked = validateSetupObject(record, library);
  if (issues.length)
    return { ok: false, status: 400, issues: [...issues, ...(checked.ok ? [] : checked.issues.filter((i) => !issues.some((x) => x.path === i.path)))] };
  return checked;
}
