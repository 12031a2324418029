import { QUANTITY_INFO, type BenchReading, type ComparedQuantity } from '@shared/motors/quantities';
import type { BenchVerdict } from '@shared/calc/bench-verdict';

/** A quantity's value in its unit, with the digits the bench reads to. */
export function fmt(q: BenchReading | ComparedQuantity, v: number | null | undefined, withUnit = true): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  const { digits, unit } = QUANTITY_INFO[q];
  const text = v.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
  return withUnit ? `${text} ${unit}` : text;
}

/** A signed change, so a drop and a rise read differently at a glance. */
export function fmtDelta(q: ComparedQuantity, v: number | null): string {
  if (v === null) return '—';
  return `${v > 0 ? '+' : v < 0 ? '−' : '±'}${fmt(q, Math.abs(v))}`;
}

/** Date of a check as the racer wrote it in their notebook. */
export function fmtDate(iso: string): string {
  return (
    new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone: 'UTC' }) + ' UTC'
  );
}

/** Verdict badge colours: ours, in the notebook's palette. */
export const VERDICT_TONE: Record<BenchVerdict, string> = {
  clearly_within: 'border-ok-line bg-ok-wash text-ink',
  within_close: 'border-caution-line bg-caution-wash text-ink',
  clearly_outside: 'border-danger-line bg-danger-wash text-ink font-semibold',
  cant_tell: 'border-ink/25 bg-paper-deep text-ink-soft italic',
};

/** Parses "17000 17040 17020" (spaces or semicolons between repeats; a decimal comma is read as a point). */
export function parseRepeats(text: string): number[] | null | 'invalid' {
  const parts = text
    .trim()
    .split(/[\s;]+/)
    .filter(Boolean);
  if (!parts.length) return null;
  const nums = parts.map((p) => Number(p.replace(',', '.')));
  return nums.some((n) => !Number.isFinite(n)) ? 'invalid' : nums;
}
