import type { z } from 'zod';
import { inputObject, numberInput, optionalNumberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

// Model (common practice, no source): at neutral the controller applies the drag brake; just past
// neutral on the brake side it applies the initial brake, rising linearly to the brake strength at full
// brake stick. Brake never falls below the drag brake once the stick leaves neutral, since letting go
// of the brake would otherwise brake harder than holding it lightly.

/** Drag brake from which the heat and rear-lock caution shows (common practice, no source). */
export const HEAVY_DRAG_PCT = 40;

const pct = (label: string, help: string) => numberInput({ label, unit: '%', min: 0, max: 100, step: 1, help });

/** Input of the brake calculator. */
export const brakeInput = inputObject({
  dragBrakePct: pct('Drag brake', 'Brake applied automatically at neutral throttle, as a percentage of full brake.'),
  initialBrakePct: pct('Initial brake', 'Brake applied as soon as the stick leaves neutral on the brake side.'),
  brakeStrengthPct: pct('Brake strength', 'Brake at full brake stick.'),
  brakeStickPct: optionalNumberInput({
    label: 'Brake stick',
    unit: '%',
    min: 0,
    max: 100,
    step: 1,
    help: 'Brake stick travel past neutral to read the curve at.',
  }),
});

/** Parsed brake input. */
export type BrakeInput = z.output<typeof brakeInput>;

/** Brake results. */
export type BrakeResults = {
  atNeutralPct: number;
  /** Brake just past neutral (stick barely on the brake side). */
  justPastNeutralPct: number;
  points: { stickPct: number; brakePct: number }[];
  brakeAtStickPct?: number;
  neutralFeel: string;
};

/** Brake (% of full) at a brake-stick position; 0 % stick is neutral, where only the drag brake acts. */
export function brakeAtStick(stickPct: number, input: Pick<BrakeInput, 'dragBrakePct' | 'initialBrakePct' | 'brakeStrengthPct'>): number {
  if (stickPct <= 0) return input.dragBrakePct;
  // An initial brake above the strength would make the curve fall with more stick; cap it at the strength.
  const initial = Math.min(input.initialBrakePct, input.brakeStrengthPct);
  const onCurve = initial + ((input.brakeStrengthPct - initial) * Math.min(stickPct, 100)) / 100;
  return Math.max(input.dragBrakePct, onCurve);
}

/** A short description of how the car behaves off throttle at this drag brake. */
export function describeNeutralFeel(dragBrakePct: number): string {
  if (dragBrakePct === 0) return 'Free-rolling: the car coasts off throttle and carries its speed into the corner.';
  if (dragBrakePct <= 10) return 'Light drag: a gentle slowdown off throttle that helps the car settle into corners.';
  if (dragBrakePct <= 30) return 'Firm drag: the car slows noticeably off throttle, like a light dab of brake every time you lift.';
  return 'Heavy drag: lifting off is like braking hard; the rear can step out or lock on low grip.';
}

/** Computes the brake at neutral and across the brake stick, and describes the off-throttle feel. */
export function computeBrake(input: BrakeInput) {
  const { dragBrakePct, initialBrakePct, brakeStrengthPct, brakeStickPct } = input;
  const points = [];
  for (let stick = 0; stick <= 100; stick += 5) {
    points.push({ stickPct: stick, brakePct: roundSig(brakeAtStick(stick, input)) });
  }
  const warnings: CalcWarning[] = [];
  if (initialBrakePct > brakeStrengthPct) {
    warnings.push({
      level: 'caution',
      code: 'initial-above-strength',
      field: 'initialBrakePct',
      message: `Initial brake (${initialBrakePct}%) is above the brake strength (${brakeStrengthPct}%); it is treated as ${brakeStrengthPct}% here. Most controllers cap it the same way or refuse the setting.`,
    });
  }
  if (dragBrakePct > brakeStrengthPct) {
    warnings.push({
      level: 'caution',
      code: 'drag-above-strength',
      field: 'dragBrakePct',
      message: 'The drag brake is stronger than full brake stick, so lifting off brakes harder than braking. Lower the drag brake or raise the brake strength.',
    });
  }
  if (dragBrakePct >= HEAVY_DRAG_PCT) {
    warnings.push({
      level: 'caution',
      code: 'heavy-drag-brake',
      field: 'dragBrakePct',
      message:
        'Heavy drag brake turns the motor into a brake every time you lift: the motor and controller run hotter and the rear can lock on low grip. ' +
        "Check temperatures after a run and stay within the makers' limits.",
    });
  }
  const results: BrakeResults = {
    atNeutralPct: dragBrakePct,
    justPastNeutralPct: roundSig(brakeAtStick(Number.MIN_VALUE, input)),
    points,
    neutralFeel: describeNeutralFeel(dragBrakePct),
    ...(brakeStickPct !== undefined ? { brakeAtStickPct: roundSig(brakeAtStick(brakeStickPct, input)) } : {}),
  };
  return { results, warnings };
}

/** The brake calculator: drag brake at neutral and the brake curve across the stick. */
export const brakeCalculator = defineCalculator({
  name: 'brake',
  title: 'Drag brake and brake curve',
  description: 'What the car does at neutral and how much brake each position of the brake stick gives, from the drag brake, initial brake and brake strength.',
  input: brakeInput,
  defaults: { dragBrakePct: 10, initialBrakePct: 15, brakeStrengthPct: 80 },
  compute: computeBrake,
});
