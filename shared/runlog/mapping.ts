import { z } from 'zod';
import { CHANNEL_UNITS, RUN_CHANNELS, type RunChannel } from './vocabulary';

/** One channel's source: the file's column (its header text exactly) and the unit that column is in. */
export const channelSourceSchema = z.strictObject({
  column: z.string().min(1, 'Name the column').max(200),
  unit: z.string().min(1).max(20),
  /** Motor pole count, needed only when speed is in electrical rpm. */
  poles: z.number().int().min(2).max(24).optional(),
});
export type ChannelSource = z.infer<typeof channelSourceSchema>;

/** Our channel ← the file's column and unit; `time_s` is required, every other channel optional. */
export const runMappingSchema = z
  .strictObject(
    Object.fromEntries(RUN_CHANNELS.map((c) => [c, channelSourceSchema.optional()])) as Record<RunChannel, z.ZodOptional<typeof channelSourceSchema>>,
  )
  .superRefine((m, ctx) => {
    if (!m.time_s) ctx.addIssue({ code: 'custom', path: ['time_s'], message: 'Map a column to time: every run log needs one' });
    const seen = new Map<string, string>();
    for (const channel of RUN_CHANNELS) {
      const src = m[channel];
      if (!src) continue;
      const units = CHANNEL_UNITS[channel] as readonly string[];
      if (!units.includes(src.unit))
        ctx.addIssue({ code: 'custom', path: [channel, 'unit'], message: `Unknown unit "${src.unit}" for ${channel}; use one of ${units.join(', ')}` });
      if (src.unit === 'erpm' && (!src.poles || src.poles % 2 !== 0))
        ctx.addIssue({ code: 'custom', path: [channel, 'poles'], message: 'Electrical rpm needs the motor pole count (an even number, 2–24)' });
      const other = seen.get(src.column);
      if (other) ctx.addIssue({ code: 'custom', path: [channel, 'column'], message: `Column "${src.column}" is already mapped to ${other}` });
      seen.set(src.column, channel);
    }
  });
export type RunMapping = z.infer<typeof runMappingSchema>;

/** A header split into its words and the unit written in brackets or parentheses (`Current (mA)`). */
export function splitHeader(header: string): { words: string; unit: string | null } {
  const m = /^(.*?)[([]\s*([^)\]]*?)\s*[)\]]\s*$/.exec(header.trim());
  const name = m ? m[1] : header;
  const words = name
    .toLowerCase()
    .replace(/[^a-z0-9%]+/g, ' ')
    .trim();
  return { words, unit: m ? m[2] : null };
}

/** Our unit for how a file writes one (`°F`, `deg C`, `msec`, `mV`...), or null when it is not one we know. */
export function normaliseUnit(raw: string): string | null {
  const u = raw.trim().replace(/^°|^deg\s*|^degrees?\s*/i, '');
  const table: Record<string, string> = {
    s: 's',
    sec: 's',
    secs: 's',
    second: 's',
    seconds: 's',
    ms: 'ms',
    msec: 'ms',
    millisecond: 'ms',
    milliseconds: 'ms',
    c: 'C',
    celsius: 'C',
    f: 'F',
    fahrenheit: 'F',
    a: 'A',
    amp: 'A',
    amps: 'A',
    ma: 'mA',
    v: 'V',
    volt: 'V',
    volts: 'V',
    mv: 'mV',
    rpm: 'rpm',
    erpm: 'erpm',
    '%': '%',
    pct: '%',
    percent: '%',
  };
  // mA and MA, mV and MV are told apart by case only where it matters: milli is the only prefix files use here.
  return table[u.toLowerCase()] ?? null;
}

// Which header words point at which channel, tried in this order (more specific first).
const WORD_RULES: Array<[RunChannel, RegExp]> = [
  ['time_s', /\b(time|timestamp|elapsed|t|ms|millis|seconds|sec)\b/],
  ['esc_temp_c', /\b(esc|controller|fet|board|ctrl)\b.*\b(temp|temperature|t)\b|\b(temp|temperature)\b.*\b(esc|controller|fet)\b/],
  ['motor_temp_c', /\b(motor|mot|can)\b.*\b(temp|temperature)\b|\b(temp|temperature)\b.*\b(motor|mot)\b|^temp(erature)?$/],
  ['throttle_pct', /\b(throttle|thr|stick|input|trigger)\b/],
  ['motor_rpm', /\b(e?rpm|speed|revs?|motor speed)\b/],
  ['current_a', /\b(current|amps?|curr|i)\b/],
  ['pack_v', /\b(voltage|volts?|pack|batt|battery|vbat|v)\b/],
];

// A unit written as the last word of the name (`time_ms`, `temp_f`, `current_ma`).
const SUFFIX_UNIT: Partial<Record<RunChannel, Record<string, string>>> = {
  time_s: { s: 's', ms: 'ms', sec: 's' },
  motor_temp_c: { c: 'C', f: 'F' },
  esc_temp_c: { c: 'C', f: 'F' },
  current_a: { a: 'A', ma: 'mA' },
  pack_v: { v: 'V', mv: 'mV' },
  motor_rpm: { rpm: 'rpm', erpm: 'erpm' },
  throttle_pct: { pct: '%' },
};

// The channel a unit alone points at (temperature to the motor: it is the one most logs carry).
const UNIT_CHANNEL: Record<string, RunChannel> = {
  s: 'time_s',
  ms: 'time_s',
  '%': 'throttle_pct',
  rpm: 'motor_rpm',
  erpm: 'motor_rpm',
  C: 'motor_temp_c',
  F: 'motor_temp_c',
  A: 'current_a',
  mA: 'current_a',
  V: 'pack_v',
  mV: 'pack_v',
};

/**
 * Proposes a mapping from a file's header: our own vocabulary is taken as is; otherwise each channel takes
 * the first unclaimed column whose words name it, with the unit from brackets, a name suffix or the channel's own.
 */
export function proposeMapping(headers: string[]): { mapping: Partial<RunMapping>; ours: boolean; unmatched: string[] } {
  const trimmed = headers.map((h) => h.trim());
  const ours = trimmed.includes('time_s') && trimmed.every((h) => (RUN_CHANNELS as readonly string[]).includes(h));
  const mapping: Partial<Record<RunChannel, { column: string; unit: string; poles?: number }>> = {};
  const claimed = new Set<number>();
  if (ours) {
    trimmed.forEach((h, i) => {
      mapping[h as RunChannel] = { column: headers[i], unit: CHANNEL_UNITS[h as RunChannel][0] };
      claimed.add(i);
    });
    return { mapping: mapping as Partial<RunMapping>, ours, unmatched: [] };
  }
  const parts = trimmed.map(splitHeader);
  for (const [channel, rule] of WORD_RULES) {
    if (mapping[channel]) continue;
    const i = parts.findIndex((p, k) => !claimed.has(k) && (p.words === channel.replace(/_/g, ' ') || rule.test(p.words)));
    if (i < 0) continue;
    claimed.add(i);
    const allowed = CHANNEL_UNITS[channel] as readonly string[];
    const bracket = parts[i].unit !== null ? normaliseUnit(parts[i].unit!) : null;
    const lastWord = parts[i].words.split(' ').pop() ?? '';
    const suffix = SUFFIX_UNIT[channel]?.[lastWord] ?? (channel === 'motor_rpm' && /\berpm\b/.test(parts[i].words) ? 'erpm' : null);
    const unit = [bracket, suffix].find((u): u is string => !!u && allowed.includes(u)) ?? allowed[0];
    mapping[channel] = { column: headers[i], unit };
  }
  // Second pass: a column whose words we do not know may still say what it is by its unit alone.
  parts.forEach((p, i) => {
    if (claimed.has(i) || p.unit === null) return;
    const unit = normaliseUnit(p.unit);
    const channel = unit ? UNIT_CHANNEL[unit] : undefined;
    if (!channel || mapping[channel]) return;
    claimed.add(i);
    mapping[channel] = { column: headers[i], unit: unit! };
  });
  return { mapping: mapping as Partial<RunMapping>, ours, unmatched: headers.filter((_h, i) => !claimed.has(i)) };
}
