// The quantities a bench check records and the ones a comparison judges. Default tolerances are our own
// starting points (common practice on the bench, no source): a member edits them per motor.

/** Quantities read on the bench; each may carry up to five repeat readings. */
export const BENCH_READINGS = [
  'testVoltageV',
  'noLoadRpm',
  'noLoadCurrentA',
  'timingDeg',
  'rotorSymmetryPct',
  'sensorDeviationPct',
  'phaseResistanceOhm',
] as const;
/** One of {@link BENCH_READINGS}. */
export type BenchReading = (typeof BENCH_READINGS)[number];

/** Quantities a comparison judges: the readings, with kV and the 20 °C resistance in place of raw speed-per-volt and raw resistance. */
export const COMPARED_QUANTITIES = [
  'measuredKv',
  'noLoadRpm',
  'noLoadCurrentA',
  'timingDeg',
  'rotorSymmetryPct',
  'sensorDeviationPct',
  'resistanceAt20COhm',
  'testVoltageV',
] as const;
/** One of {@link COMPARED_QUANTITIES}. */
export type ComparedQuantity = (typeof COMPARED_QUANTITIES)[number];

/** Most repeat readings per quantity in one check. */
export const MAX_REPEATS = 5;

/** A tolerance either side of the reference: a share of the reference value, or an amount in the quantity's unit. */
export type Tolerance = { kind: 'pct' | 'abs'; value: number };

type QuantityInfo = { label: string; unit: string; digits: number; tolerance: Tolerance };

/** Label, unit, display digits and default tolerance of every quantity. */
export const QUANTITY_INFO: Readonly<Record<BenchReading | ComparedQuantity, QuantityInfo>> = {
  testVoltageV: { label: 'Test voltage', unit: 'V', digits: 2, tolerance: { kind: 'abs', value: 0.1 } },
  noLoadRpm: { label: 'No-load speed', unit: 'rpm', digits: 0, tolerance: { kind: 'pct', value: 3 } },
  measuredKv: { label: 'Measured kV', unit: 'rpm/V', digits: 0, tolerance: { kind: 'pct', value: 3 } },
  noLoadCurrentA: { label: 'No-load current', unit: 'A', digits: 2, tolerance: { kind: 'pct', value: 15 } },
  timingDeg: { label: 'Timing reading', unit: '° el.', digits: 1, tolerance: { kind: 'abs', value: 3 } },
  rotorSymmetryPct: { label: 'Rotor symmetry', unit: '%', digits: 1, tolerance: { kind: 'abs', value: 1 } },
  sensorDeviationPct: { label: 'Sensor-signal deviation', unit: '%', digits: 1, tolerance: { kind: 'abs', value: 2 } },
  phaseResistanceOhm: { label: 'Phase resistance', unit: 'Ω', digits: 5, tolerance: { kind: 'pct', value: 5 } },
  resistanceAt20COhm: { label: 'Resistance at 20 °C', unit: 'Ω', digits: 5, tolerance: { kind: 'pct', value: 5 } },
};

/** The tolerance in the quantity's unit for a reference value. */
export function absoluteTolerance(t: Tolerance, reference: number): number {
  return t.kind === 'abs' ? t.value : (Math.abs(reference) * t.value) / 100;
}
