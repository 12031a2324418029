import type { z } from 'zod';
import { inputObject, numberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

// Relations (common practice; they follow from the gear-train relation, Wikipedia "Gear train"):
// final drive ratio = (spur / pinion) × internal ratio; rollout = π × tyre diameter / final drive ratio.

/** Above this rollout the motor is geared tall for any common class (common practice, no source). */
export const TALL_ROLLOUT_MM = 90;
/** Below this rollout gearing is crawler-short; fine there, but the motor spins fast for the speed. */
export const SHORT_ROLLOUT_MM = 15;
/** How many teeth either side of the chosen pinion the sweep covers. */
const SWEEP_TEETH = 6;

/** Input of the gearing calculator: spur and pinion teeth, the car's internal ratio and the tyre size. */
export const gearingInput = inputObject({
  spur: numberInput({ label: 'Spur', unit: 'teeth', min: 10, max: 200, int: true, help: 'Teeth on the spur gear.' }),
  pinion: numberInput({
    label: 'Pinion',
    unit: 'teeth',
    min: 5,
    max: 100,
    int: true,
    help: 'Teeth on the motor pinion.',
  }),
  internalRatio: numberInput({
    label: 'Internal ratio',
    unit: ':1',
    min: 0.5,
    max: 60,
    step: 0.01,
    help: 'Reduction between the spur and the wheels (transmission and diffs); 1 for direct drive.',
  }),
  tyreDiameterMm: numberInput({
    label: 'Tyre diameter',
    unit: 'mm',
    min: 20,
    max: 250,
    step: 0.1,
    help: 'Outside diameter of the driven tyre, measured on the car.',
  }),
});

/** Parsed gearing input. */
export type GearingInput = z.output<typeof gearingInput>;

/** One point of the pinion sweep (same spur, internal ratio and tyre). */
export type PinionSweepPoint = { pinion: number; finalDriveRatio: number; rolloutMm: number };

/** Gearing results. */
export type GearingResults = {
  finalDriveRatio: number;
  rolloutMm: number;
  rolloutIn: number;
  kmhPer1000Rpm: number;
  tyreCircumferenceMm: number;
  pinionSweep: PinionSweepPoint[];
};

/** Final drive ratio: motor turns per wheel turn, (spur / pinion) × internal ratio. */
export function finalDriveRatio(spur: number, pinion: number, internalRatio: number): number {
  return (spur / pinion) * internalRatio;
}

/** Road speed in km/h for a motor speed (rpm), a tyre diameter (mm) and a final drive ratio. */
export function roadSpeedKmh(motorRpm: number, tyreDiameterMm: number, ratio: number): number {
  const mmPerMinute = (motorRpm * Math.PI * tyreDiameterMm) / ratio;
  return (mmPerMinute * 60) / 1e6; // 60 min/h, 1e6 mm/km
}

/** Computes final drive ratio, rollout and speed per 1000 rpm, with a sweep of nearby pinions for a chart. */
export function computeGearing(input: GearingInput) {
  const { spur, pinion, internalRatio, tyreDiameterMm } = input;
  const ratio = finalDriveRatio(spur, pinion, internalRatio);
  const circumferenceMm = Math.PI * tyreDiameterMm;
  const rolloutMm = circumferenceMm / ratio;

  const pinionSweep: PinionSweepPoint[] = [];
  for (let p = Math.max(5, pinion - SWEEP_TEETH); p <= Math.min(100, pinion + SWEEP_TEETH); p++) {
    const r = finalDriveRatio(spur, p, internalRatio);
    pinionSweep.push({ pinion: p, finalDriveRatio: roundSig(r), rolloutMm: roundSig(circumferenceMm / r) });
  }

  const warnings: CalcWarning[] = [];
  if (rolloutMm > TALL_ROLLOUT_MM) {
    warnings.push({
      level: 'caution',
      code: 'tall-gearing',
      field: 'pinion',
      message:
        `Tall gearing (rollout over ${TALL_ROLLOUT_MM} mm): the motor labours at low speed and runs hot. ` +
        'Check motor and controller temperatures after a few laps and gear down if they climb; ' +
        "stay within the motor and controller makers' limits.",
    });
  } else if (rolloutMm < SHORT_ROLLOUT_MM) {
    warnings.push({
      level: 'info',
      code: 'short-gearing',
      field: 'pinion',
      message:
        `Very short gearing (rollout under ${SHORT_ROLLOUT_MM} mm) is normal for crawling, but the motor spins fast ` +
        "for the road speed: keep it within the maker's rpm limit and check temperatures.",
    });
  }
  if (pinion > spur) {
    warnings.push({
      level: 'info',
      code: 'pinion-larger-than-spur',
      field: 'pinion',
      message: 'The pinion is larger than the spur, so the first stage gears up rather than down. Check the numbers.',
    });
  }

  const results: GearingResults = {
    finalDriveRatio: roundSig(ratio),
    rolloutMm: roundSig(rolloutMm),
    rolloutIn: roundSig(rolloutMm / 25.4), // 1 in = 25.4 mm exactly (NIST SP 811, App. B)
    kmhPer1000Rpm: roundSig(roadSpeedKmh(1000, tyreDiameterMm, ratio)),
    tyreCircumferenceMm: roundSig(circumferenceMm),
    pinionSweep,
  };
  return { results, warnings };
}

/** The gearing calculator: final drive ratio, rollout and a pinion sweep. */
export const gearingCalculator = defineCalculator({
  name: 'gearing',
  title: 'Final drive ratio and rollout',
  description: 'How many motor turns make one wheel turn, and how far the car travels for each motor turn, for a spur, pinion, internal ratio and tyre size.',
  input: gearingInput,
  defaults: { spur: 84, pinion: 40, internalRatio: 1.9, tyreDiameterMm: 64 },
  compute: computeGearing,
});
