import type { z } from 'zod';
import { inputObject, numberInput, optionalNumberInput } from './inputs';
import { checkEvenPoles } from './motor';
import { clamp, roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

// Model (a speed-dependent lead rising linearly between two speeds; from memory, general industrial servo-drive practice): the controller's advance in electrical degrees is
//   total(rpm) = baseDeg + rampDeg × clamp((rpm − rampStartRpm) / (rampEndRpm − rampStartRpm), 0, 1)
// A linear speed-dependent lead between a start and an end speed is standard drive practice (from memory).
// The optional full-throttle step adds stepDeg on top, but only once the throttle has been held fully
// open for stepDelayS seconds; it depends on time and throttle, not rpm, so it is reported as a second
// curve (`fullThrottleDeg` on each point) rather than folded into `deg`.
// Mechanical endbell timing × pole pairs = electrical degrees.

/**
 * Combined electrical timing (controller + endbell) from which the heat caution shows. Common
 * practice, no source: past roughly 50° total most motors heat quickly and need gearing down.
 */
export const HIGH_TIMING_DEG = 50;
/** Points across the chart, before the breakpoints are added. */
const CHART_STEPS = 40;

/** Input of the timing-curve calculator. */
export const timingCurveInput = inputObject({
  baseDeg: numberInput({
    label: 'Base timing',
    unit: '°',
    min: 0,
    max: 60,
    step: 1,
    help: 'Fixed advance the controller adds at every speed (electrical degrees).',
  }),
  rampDeg: numberInput({
    label: 'Ramped advance',
    unit: '°',
    min: 0,
    max: 80,
    step: 1,
    help: 'Extra advance added gradually between the ramp start and end speeds.',
  }),
  rampStartRpm: numberInput({
    label: 'Ramp start',
    unit: 'rpm',
    min: 0,
    max: 100_000,
    step: 500,
    help: 'Motor speed where the ramped advance starts to come in.',
  }),
  rampEndRpm: numberInput({
    label: 'Ramp end',
    unit: 'rpm',
    min: 1,
    max: 100_000,
    step: 500,
    help: 'Motor speed where the ramped advance is fully in; must be above the ramp start.',
  }),
  atRpm: optionalNumberInput({
    label: 'Read at',
    unit: 'rpm',
    min: 0,
    max: 150_000,
    step: 500,
    help: 'A motor speed to read the curve at.',
  }),
  endbellDeg: optionalNumberInput({
    label: 'Endbell timing',
    unit: '°',
    min: 0,
    max: 60,
    step: 1,
    help: 'Mechanical timing set on the motor itself, in mechanical degrees.',
  }),
  poles: optionalNumberInput({
    label: 'Rotor poles',
    unit: 'poles',
    min: 2,
    max: 24,
    int: true,
    help: 'Needed to turn endbell (mechanical) degrees into electrical degrees; 2 if left empty.',
  }),
  stepDeg: optionalNumberInput({
    label: 'Full-throttle advance',
    unit: '°',
    min: 0,
    max: 40,
    step: 1,
    help: 'Extra advance added at full throttle once the delay has passed.',
  }),
  stepDelayS: optionalNumberInput({
    label: 'Full-throttle delay',
    unit: 's',
    min: 0,
    max: 5,
    step: 0.05,
    help: 'How long full throttle must be held before the full-throttle advance comes in.',
  }),
  maxRpm: optionalNumberInput({
    label: 'Chart to',
    unit: 'rpm',
    min: 1000,
    max: 150_000,
    step: 1000,
    help: 'Right-hand end of the chart; 25 % past the ramp end if left empty.',
  }),
})
  .superRefine((value, ctx) => {
    if (typeof value.rampStartRpm === 'number' && typeof value.rampEndRpm === 'number' && value.rampEndRpm <= value.rampStartRpm) {
      ctx.addIssue({
        code: 'custom',
        path: ['rampEndRpm'],
        message: `Ramp end must be above the ramp start (${value.rampStartRpm} rpm)`,
      });
    }
  })
  .superRefine(checkEvenPoles);

/** Parsed timing-curve input. */
export type TimingCurveInput = z.output<typeof timingCurveInput>;

/** One chart point: `deg` is the rpm curve; `fullThrottleDeg` (only when a step is set) adds the step. */
export type TimingPoint = { rpm: number; deg: number; fullThrottleDeg?: number };

/** Timing-curve results. */
export type TimingCurveResults = {
  points: TimingPoint[];
  /** Curve value at `atRpm`, without the full-throttle step. */
  totalDegAt?: number;
  /** Curve value at `atRpm` once the full-throttle step is in. */
  totalDegAtFullThrottle?: number;
  endbellElectricalDeg?: number;
  /** Most the controller adds: base + ramp + step. */
  maxTotalDeg: number;
  /** Controller maximum plus endbell electrical degrees, when endbell timing is given. */
  maxCombinedDeg?: number;
  stepDeg: number;
  stepDelayS?: number;
};

/** Controller advance at `rpm` without the full-throttle step (the linear-ramp model above). */
export function timingAt(rpm: number, curve: { baseDeg: number; rampDeg: number; rampStartRpm: number; rampEndRpm: number }): number {
  const fraction = clamp((rpm - curve.rampStartRpm) / (curve.rampEndRpm - curve.rampStartRpm), 0, 1);
  return curve.baseDeg + curve.rampDeg * fraction;
}

/** Rounds the chart's right-hand end up to a whole 1,000 rpm. */
function defaultChartEnd(input: TimingCurveInput): number {
  const wanted = Math.max(input.rampEndRpm * 1.25, input.atRpm ?? 0);
  return Math.ceil(wanted / 1000) * 1000;
}

/** Computes the timing curve against rpm, the value at one speed, endbell electrical degrees and the maximum. */
export function computeTimingCurve(input: TimingCurveInput) {
  const { baseDeg, rampDeg, rampStartRpm, rampEndRpm, atRpm, endbellDeg, stepDelayS } = input;
  const stepDeg = input.stepDeg ?? 0;
  const hasStep = stepDeg > 0;
  const chartEnd = input.maxRpm ?? defaultChartEnd(input);

  const rpms = new Set<number>();
  for (let i = 0; i <= CHART_STEPS; i++) rpms.add(Math.round((chartEnd * i) / CHART_STEPS));
  // The corners of the curve must be on the chart exactly, or a line chart cuts them off.
  for (const corner of [rampStartRpm, rampEndRpm, atRpm]) {
    if (corner !== undefined && corner <= chartEnd) rpms.add(corner);
  }
  const points: TimingPoint[] = [...rpms]
    .sort((a, b) => a - b)
    .map((rpm) => {
      const deg = timingAt(rpm, input);
      return hasStep ? { rpm, deg: roundSig(deg), fullThrottleDeg: roundSig(deg + stepDeg) } : { rpm, deg: roundSig(deg) };
    });

  const warnings: CalcWarning[] = [];
  let endbellElectricalDeg: number | undefined;
  if (endbellDeg !== undefined) {
    if (input.poles === undefined) {
      warnings.push({
        level: 'info',
        code: 'poles-assumed',
        field: 'poles',
        message: 'No pole count given: endbell degrees are converted as for a 2-pole motor (mechanical = electrical).',
      });
    }
    endbellElectricalDeg = endbellDeg * ((input.poles ?? 2) / 2);
  }
  if (stepDelayS !== undefined && !hasStep) {
    warnings.push({
      level: 'info',
      code: 'delay-without-step',
      field: 'stepDelayS',
      message: 'A full-throttle delay only matters with a full-throttle advance above 0°; it has no effect here.',
    });
  }

  const maxTotalDeg = baseDeg + rampDeg + stepDeg;
  const maxCombinedDeg = endbellElectricalDeg === undefined ? undefined : maxTotalDeg + endbellElectricalDeg;
  const worstDeg = maxCombinedDeg ?? maxTotalDeg;
  if (worstDeg >= HIGH_TIMING_DEG) {
    warnings.push({
      level: 'caution',
      code: 'high-timing',
      field: hasStep ? 'stepDeg' : 'rampDeg',
      message:
        `About ${roundSig(worstDeg, 3)}° of total timing: the motor and controller heat up fast. Gear down to compensate, ` +
        'check motor temperature after a few minutes and stop if it passes the hot band. ' +
        "Stay within the motor and controller makers' limits; hot motors and controllers burn skin.",
    });
  }
  if (baseDeg === 0 && rampDeg === 0 && stepDeg === 0) {
    warnings.push({
      level: 'info',
      code: 'zero-timing',
      message:
        "No electronic advance: this is what zero-timing spec classes require. Only the motor's fixed endbell timing applies; check the class rules for what is allowed there.",
    });
  } else {
    warnings.push({
      level: 'info',
      code: 'spec-class-rules',
      message:
        "Zero-timing spec classes forbid any electronic advance (static, ramped or full-throttle): check your class rules and the sanctioning body's before racing with these settings.",
    });
  }

  const results: TimingCurveResults = {
    points,
    maxTotalDeg: roundSig(maxTotalDeg),
    stepDeg,
    ...(stepDelayS !== undefined ? { stepDelayS } : {}),
    ...(atRpm !== undefined
      ? {
          totalDegAt: roundSig(timingAt(atRpm, input)),
          totalDegAtFullThrottle: roundSig(timingAt(atRpm, input) + stepDeg),
        }
      : {}),
    ...(endbellElectricalDeg !== undefined ? { endbellElectricalDeg: roundSig(endbellElectricalDeg) } : {}),
    ...(maxCombinedDeg !== undefined ? { maxCombinedDeg: roundSig(maxCombinedDeg) } : {}),
  };
  return { results, warnings };
}

/** The timing-curve calculator: controller advance against rpm, with the full-throttle step as a second curve. */
export const timingCurveCalculator = defineCalculator({
  name: 'timing-curve',
  title: 'Timing advance curve',
  description:
    "The controller's timing against motor speed: base timing plus an advance ramped in between two speeds, with any full-throttle step shown as a second curve.",
  input: timingCurveInput,
  defaults: { baseDeg: 0, rampDeg: 30, rampStartRpm: 10_000, rampEndRpm: 30_000, atRpm: 20_000 },
  compute: computeTimingCurve,
});
