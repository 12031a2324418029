import type { RunSummary } from '@shared/schemas/run';
import { toDisplay, unitOf, type UnitSystem } from '@shared/units';

/**
 * How each figure is shown: label, unit, digits, and how to turn the stored value into the shown one.
 * `quantity` marks a figure that follows the display units (#17): speeds in mph, temperatures in °F.
 */
export type FigureRow = {
  key: keyof RunSummary;
  label: string;
  unit: string;
  digits: number;
  scale?: number;
  note?: string;
  quantity?: 'speed' | 'temperature';
};
export const FIGURE_ROWS: FigureRow[] = [
  { key: 'durationS', label: 'Duration', unit: 's', digits: 1 },
  { key: 'sampleRateHz', label: 'Sample rate', unit: 'Hz', digits: 1 },
  { key: 'peakRpm', label: 'Peak motor speed', unit: 'rpm', digits: 0 },
  { key: 'peakRpmAtS', label: '… reached at', unit: 's', digits: 1 },
  {
    key: 'topSpeedKmh',
    label: 'Estimated top speed',
    unit: 'km/h',
    digits: 1,
    quantity: 'speed',
    note: 'from the peak motor speed through the setup’s gearing; no tyre growth or slip',
  },
  { key: 'fullThrottleShare', label: 'Time at full throttle', unit: '%', digits: 0, scale: 100 },
  { key: 'peakCurrentA', label: 'Peak current', unit: 'A', digits: 1 },
  { key: 'meanCurrentA', label: 'Mean current', unit: 'A', digits: 1 },
  { key: 'energyMah', label: 'Charge used', unit: 'mAh', digits: 0, note: 'estimate: trapezoidal rule over the samples, gaps left out' },
  { key: 'energyWh', label: 'Energy used', unit: 'Wh', digits: 2, note: 'estimate' },
  { key: 'maxMotorTempC', label: 'Hottest motor reading', unit: '°C', digits: 1, quantity: 'temperature' },
  { key: 'maxEscTempC', label: 'Hottest controller reading', unit: '°C', digits: 1, quantity: 'temperature' },
  { key: 'restPackV', label: 'Pack at rest', unit: 'V', digits: 2 },
  { key: 'minPackV', label: 'Lowest pack voltage under load', unit: 'V', digits: 2 },
  { key: 'minCellV', label: 'Lowest per cell', unit: 'V', digits: 2 },
];

/** The unit a figure is shown in. */
export const figureUnit = (row: FigureRow, units: UnitSystem) => (row.quantity ? unitOf(row.quantity, units) : row.unit);

/**
 * A stored figure (or a difference of two) in the display units. A temperature difference scales by 1.8
 * without the 32° offset (NIST SP 811, Appendix B: a kelvin interval = 1.8 °F intervals).
 */
export function figureValue(row: FigureRow, v: number | null, units: UnitSystem, difference = false): number | null {
  if (v === null || !row.quantity || units === 'metric') return v;
  if (row.quantity === 'temperature' && difference) return v * 1.8;
  return toDisplay(row.quantity, v, units);
}

/** A figure as shown, or a dash where the run has no such channel. */
export function showFigure(summary: RunSummary, key: keyof RunSummary, digits: number, scale = 1, units: UnitSystem = 'metric'): string {
  const row = FIGURE_ROWS.find((r) => r.key === key);
  const raw = summary[key];
  const v = typeof raw === 'number' && row ? figureValue(row, raw, units) : raw;
  if (typeof v !== 'number') return '–';
  return (v * scale).toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits > 0 && v * scale < 100 ? Math.min(digits, 2) : 0 });
}
