import { z } from 'zod';

/**
 * Individuals-chart constant: 3 / d₂ with d₂ = 1.128 for moving ranges of two points
 * (NIST/SEMATECH e-Handbook of Statistical Methods, section 6.3.2, "Shewhart individuals control chart").
 */
export const INDIVIDUALS_FACTOR = 2.66;
/** Checks a motor needs before its history shows control limits (fewer give limits too loose to mean much). */
export const CONTROL_LIMITS_MIN_POINTS = 8;

/** Input of the control-limit calculation: a series of readings in time order. */
export const controlLimitsInput = z.array(z.number().finite(), { error: 'Give the readings as a list of numbers' }).min(2, 'At least two readings are needed');

/** Centre line, mean moving range and limits of an individuals chart. */
export type ControlLimits = { n: number; mean: number; meanMovingRange: number; upper: number; lower: number };

/**
 * Individuals control chart over readings in time order: centre x̄, limits x̄ ± 2.66 × MR̄, where MR̄ is
 * the mean of |xᵢ − xᵢ₋₁| (NIST/SEMATECH e-Handbook, section 6.3.2).
 */
export function individualsLimits(readings: readonly number[]): ControlLimits {
  const xs = controlLimitsInput.parse(readings);
  const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
  let mr = 0;
  for (let i = 1; i < xs.length; i++) mr += Math.abs(xs[i] - xs[i - 1]);
  const meanMovingRange = mr / (xs.length - 1);
  return { n: xs.length, mean, meanMovingRange, upper: mean + INDIVIDUALS_FACTOR * meanMovingRange, lower: mean - INDIVIDUALS_FACTOR * meanMovingRange };
}

/** Control limits when there are enough checks to mean something, else null. */
export function limitsWhenEnough(readings: readonly number[]): ControlLimits | null {
  return readings.length >= CONTROL_LIMITS_MIN_POINTS ? individualsLimits(readings) : null;
}

/** Mean and spread (largest minus smallest) of up to five repeat readings of one quantity. */
export function meanAndSpread(readings: readonly number[]): { mean: number; spread: number } {
  if (readings.length === 0) throw new RangeError('No readings');
  const mean = readings.reduce((a, b) => a + b, 0) / readings.length;
  return { mean, spread: Math.max(...readings) - Math.min(...readings) };
}
