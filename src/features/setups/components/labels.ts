import { CLASSES, SURFACES } from '@shared/constants';
import { chemistryVoltages, type PackChemistry } from '@shared/calc/chemistry';
import type { SetupLeafValue } from '@shared/setup/fields';

export const classLabel = (slug: string) => CLASSES.find((c) => c.slug === slug)?.name ?? slug;
export const surfaceLabel = (slug: string) => SURFACES.find((s) => s.slug === slug)?.name ?? slug;

/** Numbers in en-GB style, trimmed to sensible places for a table cell. */
export function fmt(value: number | null | undefined, digits = 2): string {
  if (value === null || value === undefined || Number.isNaN(value)) return '—';
  return value.toLocaleString('en-GB', { maximumFractionDigits: digits });
}

// What each value of a choice parameter means, in the order the parameter library counts them.
const CHOICE_LABELS: Record<string, string[]> = {
  'zero-timing-mode': ['Off', 'On'],
  'sensor-mode': ['Sensored', 'Sensorless', 'Hybrid'],
  'reverse-mode': ['Forward and brake', 'Forward, brake and reverse', 'Forward and reverse'],
  'motor-rotation': ['Normal', 'Reversed'],
};

/** A record field as a reader sees it: enums by their label, booleans as yes/no, units appended. */
export function showValue(path: string, value: SetupLeafValue | null, unit: string): string {
  if (value === null) return '—';
  if (path === 'vehicle.class') return classLabel(String(value));
  if (path === 'conditions.surface') return surfaceLabel(String(value));
  if (path === 'battery.chemistry') return chemistryVoltages[value as PackChemistry]?.label ?? String(value);
  if (path === 'vehicle.drivetrain') return String(value).toUpperCase();
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  const choices = path.startsWith('escSettings.') ? CHOICE_LABELS[path.slice('escSettings.'.length)] : undefined;
  if (choices && typeof value === 'number' && choices[value]) return `${choices[value]} (${value})`;
  if (typeof value === 'number') {
    const shown = fmt(value, 3);
    if (!unit || unit === 'poles') return unit === 'poles' ? `${shown}-pole` : shown;
    if (unit === ':1') return `${shown}:1`;
    if (unit === 'S') return `${shown}S`;
    if (unit === '%' || unit === '°C') return `${shown}${unit === '%' ? ' %' : ' °C'}`;
    if (unit === 'deg') return `${shown}°`;
    return `${shown} ${unit}`;
  }
  return String(value);
}
