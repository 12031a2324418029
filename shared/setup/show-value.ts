// How a setup-record value reads to a person: choices by name, classes and surfaces by label, units written out.
import { CLASSES, SURFACES } from '../constants';
import { chemistryVoltages, type PackChemistry } from '../calc/chemistry';
import type { SetupLeafValue } from './fields';
import { choiceLabel } from './choices';
import { formatQuantity, type UnitSystem } from '../units';

export const classLabel = (slug: string) => CLASSES.find((c) => c.slug === slug)?.name ?? slug;
export const surfaceLabel = (slug: string) => SURFACES.find((s) => s.slug === slug)?.name ?? slug;

/** Numbers in en-GB style, trimmed to sensible places for a table cell. */
export function fmt(value: number | null | undefined, digits = 2): string {
  if (value === null || value === undefined || Number.isNaN(value)) return '—';
  return value.toLocaleString('en-GB', { maximumFractionDigits: digits });
}

/**
 * A record field as a reader sees it: enums by their label, booleans as yes/no, units appended. In
 * imperial display units (#17) millimetres read as inches and °C as °F; the record itself stays SI.
 */
export function showValue(path: string, value: SetupLeafValue | null, unit: string, units: UnitSystem = 'metric'): string {
  if (value === null) return '—';
  if (path === 'vehicle.class') return classLabel(String(value));
  if (path === 'conditions.surface') return surfaceLabel(String(value));
  if (path === 'battery.chemistry') return chemistryVoltages[value as PackChemistry]?.label ?? String(value);
  if (path === 'vehicle.drivetrain') return String(value).toUpperCase();
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  const choice = path.startsWith('escSettings.') && typeof value === 'number' ? choiceLabel(path.slice('escSettings.'.length), value) : null;
  if (choice) return choice;
  if (typeof value === 'number') {
    if (units === 'imperial' && unit === 'mm') return formatQuantity('length', value, 'imperial', 3);
    if (units === 'imperial' && unit === '°C') return formatQuantity('temperature', value, 'imperial', 0);
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
