import { distance as levenshtein } from 'fastest-levenshtein';
import type { ParameterCategory } from '@shared/constants';

/** What each library section is about, in a line a newcomer can scan. */
export const CATEGORY_INFO: Record<ParameterCategory, { label: string; blurb: string }> = {
  throttle: { label: 'Throttle', blurb: 'How the controller turns stick movement into power.' },
  brake: { label: 'Brake', blurb: 'What happens when you lift off and when you pull the brake.' },
  timing: { label: 'Timing', blurb: 'How early the controller energises the motor, and when extra advance comes in.' },
  protection: { label: 'Protection', blurb: 'Cutoffs and limits that save the pack, motor and controller.' },
  power: { label: 'Power', blurb: 'Switching frequency, current and the receiver supply.' },
  motor: { label: 'Motor', blurb: 'What the motor is and how the controller reads it.' },
  gearing: { label: 'Gearing', blurb: 'How motor turns become wheel turns and road speed.' },
  battery: { label: 'Battery', blurb: 'Pack chemistry and cell count: the voltage everything else runs on.' },
};

/** A unit as readers expect to see it next to a number. */
export function displayUnit(unit: string): string {
  if (unit === 'deg') return '°';
  return unit;
}

function withUnit(n: string, unit: string) {
  const u = displayUnit(unit);
  if (!u) return n;
  return u === '°' || u === '%' ? `${n}${u === '%' ? ' %' : u}` : `${n} ${u}`;
}

const UNIT_NAMES: Record<string, string> = {
  deg: 'degrees',
  '%': 'percent',
  V: 'volts',
  A: 'amps',
  s: 'seconds',
  kHz: 'kilohertz',
  rpm: 'rpm',
  'rpm/V': 'rpm per volt (kV)',
  '°C': 'degrees Celsius',
  mm: 'millimetres',
};

/** A unit spelled out for the facts strip of an entry. */
export function unitName(unit: string): string {
  return UNIT_NAMES[unit] ?? (unit || 'none (a ratio or count)');
}

const fmt = (n: number) => n.toLocaleString('en-GB', { maximumFractionDigits: 3 });

/** True for a mode or choice parameter (no unit, 0 … n−1 in steps of one), per the content spec. */
export function isChoice(p: { unit: string; range: { min: number; max: number; step: number } }) {
  return p.unit === '' && p.range.min === 0 && p.range.step === 1 && p.range.max <= 5;
}

/** The typical range as one short phrase: "0–100 %", "5–30°", "3 choices". */
export function formatRange(p: { unit: string; range: { min: number; max: number; step: number } }): string {
  if (isChoice(p)) return `${p.range.max + 1} choices`;
  const u = displayUnit(p.unit);
  const span = `${fmt(p.range.min)}–${fmt(p.range.max)}`;
  return u ? withUnit(span, p.unit) : span;
}

/** The step as a phrase, or null where it says nothing useful (choices). */
export function formatStep(p: { unit: string; range: { min: number; max: number; step: number } }): string | null {
  if (isChoice(p)) return null;
  return withUnit(fmt(p.range.step), p.unit);
}

const letters = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, '');

/**
 * Splits an entry's aliases into other names for it and spellings people type (kept so search finds
 * them, shown apart so the page does not read as if "dragbreak" were a proper name).
 */
export function splitAliases(name: string, aliases: string[]): { names: string[]; spellings: string[] } {
  const names: string[] = [];
  const spellings: string[] = [];
  const base = letters(name);
  for (const alias of aliases) {
    const a = letters(alias);
    if (a === base) continue; // the name itself, hyphenated or run together
    const near = [base, ...names.map(letters)].some((n) => levenshtein(a, n) <= 2);
    (near ? spellings : names).push(alias);
  }
  return { names, spellings };
}
