import Papa from 'papaparse';
import { RUNLOG_LIMITS } from './vocabulary';

/** A change made to the data on import, listed to the person (nothing is changed silently). */
export type ImportNote = { code: string; message: string; rows?: number[] };
/** The first problem that stops an import, with the file row (the header is row 1) and column where known. */
export type RunlogProblem = { code: string; message: string; row?: number; column?: string };

export type RawTable = { headers: string[]; rows: string[][]; delimiter: ',' | ';' | '\t'; decimalComma: boolean; notes: ImportNote[] };
export type TableResult = { ok: true; table: RawTable } | { ok: false; status: 400 | 413; problem: RunlogProblem };

const DECIMAL_COMMA = /^\s*"?[+-]?\d+,\d+"?\s*$/;

/**
 * Which delimiter the header line uses. Papa Parse's own guess picks `,` on semicolon files whose numbers
 * use decimal commas, so a `;` in the header wins first, then a tab, then the comma of RFC 4180.
 */
export function detectDelimiter(headerLine: string): ',' | ';' | '\t' {
  const outsideQuotes = headerLine.replace(/"[^"]*"/g, '');
  if (outsideQuotes.includes(';')) return ';';
  if (outsideQuotes.includes('\t')) return '\t';
  return ',';
}

/**
 * Splits a CSV text into header and rows: byte-order mark removed, delimiter and decimal commas detected,
 * quotes and CRLF handled by Papa Parse; stops reading past the row limit instead of holding the whole file.
 */
export function readTable(text: string, opts: { maxRows?: number } = {}): TableResult {
  const maxRows = opts.maxRows ?? RUNLOG_LIMITS.maxRows;
  const notes: ImportNote[] = [];
  let body = text;
  if (body.charCodeAt(0) === 0xfeff) {
    body = body.slice(1);
    notes.push({ code: 'bom_removed', message: 'A byte-order mark at the start of the file was removed.' });
  }
  // eslint-disable-next-line no-control-regex -- a NUL or other control byte means this is not a text table
  if (/[\u0000-\u0008\u000e-\u001f]/.test(body.slice(0, 65536)) || body.includes('\ufffd')) {
    return { ok: false, status: 400, problem: { code: 'not_a_run_log', message: 'This is binary data, not a CSV run log.', row: 1 } };
  }
  const firstBreak = body.search(/\r?\n/);
  const headerLine = firstBreak < 0 ? body : body.slice(0, firstBreak);
  const delimiter = detectDelimiter(headerLine);
  const parsed = Papa.parse<string[]>(body, { delimiter, skipEmptyLines: 'greedy', preview: maxRows + 2 });
  const quoteError = parsed.errors.find((e) => e.type === 'Quotes');
  if (quoteError) {
    return {
      ok: false,
      status: 400,
      problem: { code: 'malformed_csv', message: `A quoted field is not closed (${quoteError.message}).`, row: (quoteError.row ?? 0) + 1 },
    };
  }
  const [headers, ...rows] = parsed.data;
  if (!headers || headers.every((h) => h.trim() === ''))
    return {
      ok: false,
      status: 400,
      problem: { code: 'not_a_run_log', message: 'The file is empty: a run log starts with a header row naming its columns.', row: 1 },
    };
  if (rows.length > maxRows) {
    return {
      ok: false,
      status: 413,
      problem: {
        code: 'too_many_rows',
        message: `The run log has more than ${maxRows.toLocaleString('en-GB')} rows; split it into shorter runs.`,
        row: maxRows + 2,
      },
    };
  }
  if (headers.every((h) => h.trim() !== '' && !Number.isNaN(Number(h.trim().replace(',', '.'))))) {
    return {
      ok: false,
      status: 400,
      problem: { code: 'no_header', message: 'The first row holds numbers: a run log starts with a header row naming its columns.', row: 1 },
    };
  }
  if (delimiter !== ',') notes.push({ code: 'delimiter', message: `Columns are separated by ${delimiter === ';' ? 'semicolons' : 'tabs'}.` });
  const decimalComma = delimiter !== ',' && rows.slice(0, 50).some((r) => r.some((cell) => DECIMAL_COMMA.test(cell)));
  if (decimalComma) notes.push({ code: 'decimal_comma', message: 'Numbers use a decimal comma; read as decimal points.' });
  return { ok: true, table: { headers, rows, delimiter, decimalComma, notes } };
}
