/**
 * The `tunewright.runlog` CSV vocabulary: our channel names (each carries its unit in the name, like the
 * setup record's fields) and the units another file's column may be in when it is mapped onto one of them.
 */

export const RUNLOG_FORMAT = 'tunewright.runlog';
export const RUNLOG_SCHEMA_VERSION = 1;
export const RUNLOG_SCHEMA_PATH = '/schemas/runlog.v1.json';

/** Our channels in the order they are charted; `time_s` is the only one a file must have. */
export const RUN_CHANNELS = ['time_s', 'throttle_pct', 'motor_rpm', 'motor_temp_c', 'esc_temp_c', 'current_a', 'pack_v'] as const;
export type RunChannel = (typeof RUN_CHANNELS)[number];
/** The channels other than time. */
export const VALUE_CHANNELS = RUN_CHANNELS.filter((c) => c !== 'time_s') as Exclude<RunChannel, 'time_s'>[];
export type ValueChannel = (typeof VALUE_CHANNELS)[number];

/** Units a mapped column may be in, per channel; the first is the channel's own (no conversion). */
export const CHANNEL_UNITS = {
  time_s: ['s', 'ms'],
  throttle_pct: ['%', 'fraction'],
  motor_rpm: ['rpm', 'erpm'],
  motor_temp_c: ['C', 'F'],
  esc_temp_c: ['C', 'F'],
  current_a: ['A', 'mA'],
  pack_v: ['V', 'mV'],
} as const satisfies Record<RunChannel, readonly string[]>;
export type ChannelUnit = (typeof CHANNEL_UNITS)[RunChannel][number];

/** Human words for each channel, for the mapping form and charts. */
export const CHANNEL_LABELS: Record<RunChannel, { label: string; unit: string }> = {
  time_s: { label: 'Time', unit: 's' },
  throttle_pct: { label: 'Throttle', unit: '%' },
  motor_rpm: { label: 'Motor speed', unit: 'rpm' },
  motor_temp_c: { label: 'Motor temperature', unit: '°C' },
  esc_temp_c: { label: 'Controller temperature', unit: '°C' },
  current_a: { label: 'Current', unit: 'A' },
  pack_v: { label: 'Pack voltage', unit: 'V' },
};

/** Words for each unit in the mapping form. */
export const UNIT_LABELS: Record<string, string> = {
  s: 'seconds',
  ms: 'milliseconds',
  '%': 'percent (0–100)',
  fraction: 'fraction (0–1)',
  rpm: 'rpm (mechanical)',
  erpm: 'electrical rpm (needs pole count)',
  C: '°C',
  F: '°F',
  A: 'amperes',
  mA: 'milliamperes',
  V: 'volts',
  mV: 'millivolts',
};

/** Limits that keep one upload within what one request should do. */
export const RUNLOG_LIMITS = {
  /** Upload size; the issue asks for at least 20 MB. */
  fileBytes: 32 * 1024 * 1024,
  /** Rows after the header: 100 Hz for 2 h 45 min, far past any battery pack. */
  maxRows: 1_000_000,
  /** Rows shown in the mapping preview. */
  previewRows: 8,
  /** Buckets a series request may ask for. */
  maxSeriesPoints: 4000,
  titleMax: 120,
} as const;

/** Throttle at or above this share counts as full throttle (a stick at its end stop rarely reads exactly 100). */
export const FULL_THROTTLE_PCT = 95;
/** Full throttle held this long counts as "sustained" when two runs are aligned. */
export const SUSTAINED_FULL_THROTTLE_S = 0.5;
