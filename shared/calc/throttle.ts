import type { z } from 'zod';
import { inputObject, numberInput, optionalNumberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

// Curve: x is stick travel past neutral (0..1), k = |expoPct| / 100.
//   expo ≥ 0: y = (1 − k)·x + k·x³            softer near neutral, more resolution for traction
//   expo < 0: y = 1 − [(1 − k)(1 − x) + k(1 − x)³]  the mirror: sharper near neutral
// Both pass through 0 and 100 %, never decrease, and stay within 0..100 % for any k in 0..1.
// Punch (common practice, no source): the commanded output may rise by at most
// punchRatePctPerS × Δt, so a snap from 0 to full output takes 100 / rate seconds.

/** Full output in less than this many ms counts as very hard punch (common practice, no source). */
export const HARD_PUNCH_MS = 50;
/** Full output taking longer than this counts as very soft punch (common practice, no source). */
export const SOFT_PUNCH_MS = 1000;
const STEP_RESPONSE_POINTS = 20;

/** Input of the throttle calculator: curve shape, punch rate and an optional stick position to read. */
export const throttleInput = inputObject({
  expoPct: numberInput({
    label: 'Throttle curve (expo)',
    unit: '%',
    min: -100,
    max: 100,
    step: 1,
    help: 'Positive softens the first part of the stick travel; negative sharpens it; 0 is linear.',
  }),
  punchRatePctPerS: numberInput({
    label: 'Punch rate',
    unit: '%/s',
    min: 10,
    max: 10_000,
    step: 10,
    help: 'How fast the output may rise, in percent of full output per second.',
  }),
  inputPct: optionalNumberInput({
    label: 'Stick position',
    unit: '%',
    min: 0,
    max: 100,
    step: 1,
    help: 'Throttle stick travel past neutral to read the curve at.',
  }),
});

/** Parsed throttle input. */
export type ThrottleInput = z.output<typeof throttleInput>;

/** Throttle results. `stepResponse` is the output over time after snapping the stick to `inputPct` (or full). */
export type ThrottleResults = {
  points: { inputPct: number; outputPct: number }[];
  outputPctAt?: number;
  /** Time for the output to rise from 0 to 100 % under the punch limit. */
  rampTimeMs: number;
  /** Time to reach the output at `inputPct` from a standstill. */
  rampTimeToOutputMs?: number;
  stepResponse: { timeMs: number; outputPct: number }[];
};

/** Output (0..100 %) for stick travel (0..100 %) on the expo curve described above. */
export function throttleOutputPct(inputPct: number, expoPct: number): number {
  const x = Math.min(1, Math.max(0, inputPct / 100));
  const k = Math.min(1, Math.abs(expoPct) / 100);
  const soft = (t: number) => (1 - k) * t + k * t ** 3;
  const y = expoPct >= 0 ? soft(x) : 1 - soft(1 - x);
  return Math.min(100, Math.max(0, y * 100));
}

/** Computes the throttle curve, the output at one stick position and the punch (ramp) timing. */
export function computeThrottle(input: ThrottleInput) {
  const { expoPct, punchRatePctPerS, inputPct } = input;
  const points = [];
  for (let stick = 0; stick <= 100; stick += 5) {
    points.push({ inputPct: stick, outputPct: roundSig(throttleOutputPct(stick, expoPct)) });
  }
  const rampTimeMs = (100 / punchRatePctPerS) * 1000;
  const target = inputPct === undefined ? 100 : throttleOutputPct(inputPct, expoPct);
  const timeToTargetMs = (target / punchRatePctPerS) * 1000;
  const stepResponse = [];
  // Run the chart a little past the target so the flat top shows.
  const chartMs = Math.max(timeToTargetMs * 1.25, 1);
  for (let i = 0; i <= STEP_RESPONSE_POINTS; i++) {
    const timeMs = (chartMs * i) / STEP_RESPONSE_POINTS;
    stepResponse.push({
      timeMs: roundSig(timeMs),
      outputPct: roundSig(Math.min(target, (punchRatePctPerS * timeMs) / 1000)),
    });
  }

  const warnings: CalcWarning[] = [];
  if (rampTimeMs < HARD_PUNCH_MS) {
    warnings.push({
      level: 'caution',
      code: 'hard-punch',
      field: 'punchRatePctPerS',
      message:
        'Very hard punch: the current spikes on every launch heat the motor, controller and pack, strip gears and break traction. ' +
        "Check temperatures after a run and stay within the pack's and controller's ratings from their makers.",
    });
  } else if (rampTimeMs > SOFT_PUNCH_MS) {
    warnings.push({
      level: 'info',
      code: 'soft-punch',
      field: 'punchRatePctPerS',
      message: 'Very soft punch: more than a second to reach full output, so the car feels lazy off the corners.',
    });
  }

  const results: ThrottleResults = {
    points,
    rampTimeMs: roundSig(rampTimeMs),
    stepResponse,
    ...(inputPct !== undefined ? { outputPctAt: roundSig(target), rampTimeToOutputMs: roundSig(timeToTargetMs) } : {}),
  };
  return { results, warnings };
}

/** The throttle calculator: throttle curve (expo) and punch timing. */
export const throttleCalculator = defineCalculator({
  name: 'throttle',
  title: 'Throttle curve and punch',
  description: 'How stick travel maps to output for a throttle curve, and how long the punch limit takes to let the output rise to full.',
  input: throttleInput,
  defaults: { expoPct: 20, punchRatePctPerS: 400, inputPct: 50 },
  compute: computeThrottle,
});
