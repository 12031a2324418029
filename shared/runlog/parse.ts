import { proposeMapping, runMappingSchema, type RunMapping } from './mapping';
import { readTable, type ImportNote, type RawTable, type RunlogProblem } from './table';
import { CHANNEL_UNITS, RUN_CHANNELS, VALUE_CHANNELS, type RunChannel, type ValueChannel } from './vocabulary';
import { toCanonical } from './units';

/** A stretch with no samples, longer than the file's usual interval allows; nothing is integrated across it. */
export type RunGap = { fromS: number; toS: number };

/** A parsed run: time in seconds (sorted, strictly rising), each mapped channel in our unit (NaN where a cell was empty). */
export type ParsedRun = {
  time: Float64Array;
  channels: Partial<Record<ValueChannel, Float64Array>>;
  mapping: RunMapping;
  notes: ImportNote[];
  gaps: RunGap[];
  headers: string[];
};

export type ParseResult = { ok: true; run: ParsedRun } | { ok: false; status: 400 | 413; problem: RunlogProblem };

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NOT_FINITE = /^[+-]?(nan|inf|infinity|#num!|#div\/0!)$/i;

const fail = (code: string, message: string, row?: number, column?: string): ParseResult => ({
  ok: false,
  status: 400,
  problem: { code, message, row, column },
});

/** Reads one cell as a number; null when empty; a problem when it is anything else. */
function readCell(raw: string | undefined, decimalComma: boolean): number | null | { code: string; message: string } {
  const cell = (raw ?? '').trim();
  if (cell === '') return null;
  const text = decimalComma ? cell.replace(',', '.') : cell;
  if (NUMBER.test(text)) return Number(text);
  if (NOT_FINITE.test(text)) return { code: 'not_finite', message: `"${cell.slice(0, 20)}" is not a reading: every value must be a finite number.` };
  if (/^[=@]/.test(cell) || /^[+-]\D/.test(cell))
    return { code: 'formula', message: 'A spreadsheet formula is not a reading: export the values, not the formulas.' };
  return { code: 'not_a_number', message: `"${cell.slice(0, 20)}" is not a number.` };
}

const rowList = (rows: number[]) => (rows.length > 10 ? `${rows.slice(0, 10).join(', ')} and ${rows.length - 10} more` : rows.join(', '));

/**
 * Parses a CSV text into a run: the mapping given, or the one proposed from the header (said so in the notes);
 * duplicated rows dropped, a counter reset bridged, out-of-order timestamps sorted, gaps flagged, units converted
 * to ours. Each change is a note. The first problem stops the import with its row and column.
 */
export function parseRunlog(text: string, mapping?: RunMapping, opts: { maxRows?: number } = {}): ParseResult {
  const read = readTable(text, opts);
  if (!read.ok) return read;
  return parseTable(read.table, mapping);
}

/** {@link parseRunlog} on a table already split into header and rows. */
export function parseTable(table: RawTable, given?: RunMapping): ParseResult {
  const notes = [...table.notes];
  let mapping = given;
  if (!mapping) {
    const proposal = proposeMapping(table.headers);
    if (!proposal.mapping.time_s)
      return fail('no_time_column', 'No column could be read as time: name one "time_s", or send a mapping that says which column holds time.', 1);
    const proposed = { ...proposal.mapping };
    // Electrical rpm cannot be read without the pole count, which no header gives: leave it for the person to map.
    if (proposed.motor_rpm?.unit === 'erpm' && !proposed.motor_rpm.poles) {
      notes.push({
        code: 'channel_left_out',
        message: `"${proposed.motor_rpm.column}" looks like electrical rpm; map it with the motor's pole count to include motor speed.`,
      });
      delete proposed.motor_rpm;
    }
    mapping = runMappingSchema.parse(proposed);
    if (!proposal.ours) {
      const used = RUN_CHANNELS.filter((c) => mapping![c]).map((c) => `${c} ← "${mapping![c]!.column}" (${mapping![c]!.unit})`);
      notes.push({ code: 'mapping_proposed', message: `The header is not our vocabulary, so the proposed mapping was used: ${used.join('; ')}.` });
    }
  }
  const columnIndex = {} as Record<RunChannel, number>;
  for (const channel of RUN_CHANNELS) {
    const src = mapping[channel];
    if (!src) continue;
    const i = table.headers.findIndex((h) => h === src.column || h.trim() === src.column.trim());
    if (i < 0) return fail('unknown_column', `The mapping names column "${src.column}" for ${channel}, but the header has no such column.`, 1, src.column);
    if (!(CHANNEL_UNITS[channel] as readonly string[]).includes(src.unit))
      return fail('unknown_unit', `Unknown unit "${src.unit}" for ${channel}.`, 1, src.column);
    columnIndex[channel] = i;
  }
  const ignored = table.headers.filter((_h, i) => !Object.values(columnIndex).includes(i));
  if (ignored.length)
    notes.push({ code: 'columns_ignored', message: `Columns not mapped to a channel were left out: ${ignored.map((h) => `"${h}"`).join(', ')}.` });

  const mapped = RUN_CHANNELS.filter((c) => mapping![c]);
  const n = table.rows.length;
  const values = Object.fromEntries(mapped.map((c) => [c, new Float64Array(n)])) as Record<RunChannel, Float64Array>;
  const rowNo = new Int32Array(n);
  const emptyCells: number[] = [];
  for (let r = 0; r < n; r++) {
    const row = table.rows[r];
    rowNo[r] = r + 2;
    for (const channel of mapped) {
      const v = readCell(row[columnIndex[channel]], table.decimalComma);
      const column = table.headers[columnIndex[channel]];
      if (v === null) {
        if (channel === 'time_s') return fail('missing_time', 'This row has no time.', r + 2, column);
        if (emptyCells.length < 1000) emptyCells.push(r + 2);
        values[channel][r] = NaN;
      } else if (typeof v === 'object') {
        return fail(v.code, v.message, r + 2, column);
      } else {
        values[channel][r] = v;
      }
    }
  }
  if (n < 2) return fail('too_few_rows', 'A run log needs at least two rows of readings under its header.', n + 2);
  if (emptyCells.length)
    notes.push({
      code: 'empty_cells',
      message: `Rows ${rowList([...new Set(emptyCells)])} have empty cells; those readings are missing, not zero.`,
      rows: [...new Set(emptyCells)],
    });

  const timeColumn = table.headers[columnIndex.time_s];
  const timeScale = toCanonical('time_s', mapping.time_s!.unit, 1);
  const t = values.time_s;
  for (let r = 0; r < n; r++) {
    if (t[r] < 0) return fail('negative_time', 'Time must not be negative.', rowNo[r], timeColumn);
    t[r] *= timeScale;
  }
  const reset = bridgeCounterResets(t, rowNo);
  if (reset.length)
    notes.push({
      code: 'counter_reset',
      message: `The time counter started again at row ${rowList(reset)}; later times were shifted to follow on.`,
      rows: reset,
    });

  const order = sortedOrder(t);
  const moved = order.filter((k, i) => k !== i).map((k) => rowNo[k]);
  if (moved.length) notes.push({ code: 'sorted', message: `Rows ${rowList(moved)} were out of time order and were sorted into place.`, rows: moved });

  // Drop exact repeats (same time, same readings); a repeated time with different readings is refused.
  const keep: number[] = [];
  const dropped: number[] = [];
  for (const k of order) {
    const prev = keep[keep.length - 1];
    if (prev !== undefined && t[k] === t[prev]) {
      const same = mapped.every((c) => Object.is(values[c][k], values[c][prev]) || values[c][k] === values[c][prev]);
      if (!same) return fail('repeated_time', `Two rows (${rowNo[prev]} and ${rowNo[k]}) have the same time but different readings.`, rowNo[k], timeColumn);
      dropped.push(rowNo[k]);
      continue;
    }
    keep.push(k);
  }
  if (dropped.length)
    notes.push({ code: 'duplicates_dropped', message: `Rows ${rowList(dropped)} repeated the row before them and were dropped.`, rows: dropped });
  if (keep.length < 2) return fail('too_few_rows', 'A run log needs at least two distinct times.', rowNo[keep[0] ?? 0]);

  const time = Float64Array.from(keep, (k) => t[k]);
  const channels: ParsedRun['channels'] = {};
  for (const channel of VALUE_CHANNELS) {
    const src = mapping[channel];
    if (!src) continue;
    const out = new Float64Array(keep.length);
    const col = values[channel];
    for (let i = 0; i < keep.length; i++) out[i] = toCanonical(channel, src.unit, col[keep[i]], src.poles);
    channels[channel] = out;
    if (src.unit !== CHANNEL_UNITS[channel][0])
      notes.push({ code: 'unit_converted', message: `${channel} was converted from ${src.unit}${src.poles ? ` (${src.poles} poles)` : ''}.` });
  }
  if (mapping.time_s!.unit !== 's') notes.push({ code: 'unit_converted', message: `time_s was converted from ${mapping.time_s!.unit}.` });

  const gaps = findGaps(time);
  if (gaps.length)
    notes.push({
      code: 'gaps',
      message: `${gaps.length} gap${gaps.length > 1 ? 's' : ''} in the samples (${gaps
        .slice(0, 5)
        .map((g) => `${g.fromS.toFixed(2)}–${g.toS.toFixed(2)} s`)
        .join(', ')}${gaps.length > 5 ? ', …' : ''}); nothing is integrated across a gap.`,
    });
  return { ok: true, run: { time, channels, mapping, notes, gaps, headers: table.headers } };
}

/** The usual interval between samples: the median of the first thousand positive steps. */
export function typicalInterval(t: ArrayLike<number>): number {
  const steps: number[] = [];
  for (let i = 1; i < t.length && steps.length < 1000; i++) if (t[i] > t[i - 1]) steps.push(t[i] - t[i - 1]);
  if (!steps.length) return 0;
  steps.sort((a, b) => a - b);
  return steps[Math.floor(steps.length / 2)];
}

/**
 * A logger whose time counter wraps or restarts drops back and keeps rising from there. A drop that the next
 * three rows all stay under is such a restart (a single late row is just out of order): later times are
 * shifted to continue one usual interval after the last time before it. Returns the rows where it happened.
 */
function bridgeCounterResets(t: Float64Array, rowNo: Int32Array): number[] {
  const dt = typicalInterval(t);
  const resets: number[] = [];
  let runningMax = t[0];
  for (let i = 1; i < t.length; i++) {
    if (t[i] < runningMax) {
      const ahead = Math.min(3, t.length - 1 - i);
      let restarted = ahead > 0;
      for (let k = 1; k <= ahead; k++) if (!(t[i + k] < runningMax)) restarted = false;
      if (restarted && runningMax - t[i] > 10 * dt) {
        const shift = runningMax + dt - t[i];
        for (let k = i; k < t.length; k++) t[k] += shift;
        resets.push(rowNo[i]);
      }
    }
    if (t[i] > runningMax) runningMax = t[i];
  }
  return resets;
}

/** Indices in rising time order (stable, so equal times keep file order). */
function sortedOrder(t: Float64Array): number[] {
  const order = Array.from({ length: t.length }, (_v, i) => i);
  let sorted = true;
  for (let i = 1; i < t.length; i++) if (t[i] < t[i - 1]) sorted = false;
  if (!sorted) order.sort((a, b) => t[a] - t[b] || a - b);
  return order;
}

/** Intervals more than five usual intervals long: the logger stopped or dropped samples. */
export function findGaps(time: Float64Array): RunGap[] {
  const dt = typicalInterval(time);
  const gaps: RunGap[] = [];
  if (dt <= 0) return gaps;
  for (let i = 1; i < time.length; i++) if (time[i] - time[i - 1] > 5 * dt) gaps.push({ fromS: time[i - 1], toS: time[i] });
  return gaps;
}
