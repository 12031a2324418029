/**
 * Rounds to a number of significant figures for display (default 5: enough for 0.0023873 N·m/A and
 * 101.59 km/h alike). Calculators chain unrounded values and round only what they return.
 */
export function roundSig(value: number, digits = 5): number {
  if (value === 0 || !Number.isFinite(value)) return value;
  return Number(value.toPrecision(digits));
}

/** Clamps `value` into [min, max]. */
export function clamp(value: number, min: number, max: number): number {
  return Math.min(max, Math.max(min, value));
}
