import { z } from 'zod';

/**
 * Display units (#17). Everything is stored and computed in SI-style units (mm, km/h, °C); a person's
 * preference only changes how a figure is shown. Conversions:
 * - 1 in = 25.4 mm exactly (international inch, 1959; NIST SP 811, Appendix B).
 * - 1 mile = 1.609344 km exactly (international mile; NIST SP 811, Appendix B), so mph = (km/h) / 1.609344.
 * - t/°F = 1.8 · t/°C + 32 (NIST SP 811, Appendix B, temperature conversions).
 */
export const UNIT_SYSTEMS = ['metric', 'imperial'] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];
export const unitSystemSchema = z.enum(UNIT_SYSTEMS, { message: 'Choose metric or imperial' });
export const DEFAULT_UNITS: UnitSystem = 'metric';

export const MM_PER_INCH = 25.4;
export const KM_PER_MILE = 1.609344;

export const mmToIn = (mm: number) => mm / MM_PER_INCH;
export const inToMm = (inches: number) => inches * MM_PER_INCH;
export const kmhToMph = (kmh: number) => kmh / KM_PER_MILE;
export const mphToKmh = (mph: number) => mph * KM_PER_MILE;
export const cToF = (c: number) => c * 1.8 + 32;
export const fToC = (f: number) => (f - 32) / 1.8;

/**
 * What a figure measures, and so how it converts and how many decimals it shows in each system.
 * - `length`: tyre diameters and circumferences (62.0 mm, 2.44 in).
 * - `rollout`: distance per motor turn (22.51 mm, 0.886 in).
 * - `speed`: km/h or mph, one decimal.
 * - `temperature`: whole degrees, as a thermometer gun reads.
 */
export type Quantity = 'length' | 'rollout' | 'speed' | 'temperature';

type Spec = { unit: string; digits: number; convert: (si: number) => number };
const SPECS: Record<Quantity, Record<UnitSystem, Spec>> = {
  length: { metric: { unit: 'mm', digits: 1, convert: (v) => v }, imperial: { unit: 'in', digits: 2, convert: mmToIn } },
  rollout: { metric: { unit: 'mm', digits: 2, convert: (v) => v }, imperial: { unit: 'in', digits: 3, convert: mmToIn } },
  speed: { metric: { unit: 'km/h', digits: 1, convert: (v) => v }, imperial: { unit: 'mph', digits: 1, convert: kmhToMph } },
  temperature: { metric: { unit: '°C', digits: 0, convert: (v) => v }, imperial: { unit: '°F', digits: 0, convert: cToF } },
};

/** The unit a quantity is shown in ("mm", "in", "km/h", "mph", "°C", "°F"). */
export function unitOf(quantity: Quantity, system: UnitSystem): string {
  return SPECS[quantity][system].unit;
}

/** The SI value converted for display, unrounded. */
export function toDisplay(quantity: Quantity, si: number, system: UnitSystem): number {
  return SPECS[quantity][system].convert(si);
}

/** Fixed decimals with thousands separators: 1,234.5. "—" for a missing or non-finite number. */
export function formatFixed(value: number | null | undefined, digits: number): string {
  if (typeof value !== 'number' || !Number.isFinite(value)) return '—';
  // −0.0 reads as 0.0.
  const rounded = Number(value.toFixed(digits));
  return (Object.is(rounded, -0) ? 0 : rounded).toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

/** A figure with its unit in the chosen system: "62.0 mm" / "2.44 in", "45.2 km/h" / "28.1 mph", "71 °C" / "160 °F". */
export function formatQuantity(quantity: Quantity, si: number | null | undefined, system: UnitSystem, digits?: number): string {
  const spec = SPECS[quantity][system];
  if (typeof si !== 'number' || !Number.isFinite(si)) return '—';
  return `${formatFixed(spec.convert(si), digits ?? spec.digits)} ${spec.unit}`;
}

/** A gear ratio as racers write it: "5.42:1" (two decimals unless told). */
export function formatRatio(ratio: number | null | undefined, digits = 2): string {
  if (typeof ratio !== 'number' || !Number.isFinite(ratio)) return '—';
  return `${formatFixed(ratio, digits)}:1`;
}
