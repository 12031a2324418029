import type { z } from 'zod';
import { inputObject, numberInput, optionalNumberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

// Charge: 1 mAh = 3.6 C, so minutes = capacity (mAh) / current (A) × 60 / 1000 (NIST SP 811, the
// ampere-hour as a unit of charge). Racers plan on about 80 % of the rated capacity, keeping a
// reserve above the cutoff and away from over-discharge (common practice, no source).

/** Share of the rated capacity planned for use unless the reader says otherwise (common practice). */
export const DEFAULT_USABLE_PCT = 80;

/** Input of the run-time calculator: capacity, average current, the share used and an optional race length. */
export const runTimeInput = inputObject({
  capacityMah: numberInput({ label: 'Capacity', unit: 'mAh', min: 100, max: 30_000, step: 50, help: "The pack's rated capacity, from its label." }),
  averageCurrentA: numberInput({
    label: 'Average current',
    unit: 'A',
    min: 0.1,
    max: 500,
    step: 0.5,
    help: 'Average current over a run: mAh put back by the charger ÷ run minutes × 0.06, or from a data log.',
  }),
  usablePct: optionalNumberInput({
    label: 'Capacity used',
    unit: '%',
    min: 10,
    max: 100,
    step: 5,
    help: 'How much of the rated capacity you plan to use (80 % if left empty).',
  }),
  raceMin: optionalNumberInput({ label: 'Race length', unit: 'min', min: 0.5, max: 120, step: 0.5, help: 'A heat or main to check the pack against.' }),
});

/** Parsed run-time input. */
export type RunTimeInput = z.output<typeof runTimeInput>;

/** Run-time results. */
export type RunTimeResults = {
  usableMah: number;
  /** Minutes at the average current until the planned share is used. */
  runTimeMin: number;
  /** Minutes until the whole rated capacity is used (never plan on this). */
  runTimeToEmptyMin: number;
  /** Average current as a multiple of the capacity (C rate). */
  cRate: number;
  /** The highest average current that lasts the race on the planned share. */
  maxAverageCurrentForRaceA?: number;
  lastsRace?: boolean;
};

/** Minutes a charge (mAh) lasts at a current (A). */
export function minutesAtCurrent(mAh: number, currentA: number): number {
  return (mAh / 1000 / currentA) * 60;
}

/** Run time from capacity and average current, and the average current a race allows. */
export function computeRunTime(input: RunTimeInput) {
  const usablePct = input.usablePct ?? DEFAULT_USABLE_PCT;
  const usableMah = (input.capacityMah * usablePct) / 100;
  const warnings: CalcWarning[] = [];
  const results: RunTimeResults = {
    usableMah: roundSig(usableMah),
    runTimeMin: roundSig(minutesAtCurrent(usableMah, input.averageCurrentA)),
    runTimeToEmptyMin: roundSig(minutesAtCurrent(input.capacityMah, input.averageCurrentA)),
    cRate: roundSig(input.averageCurrentA / (input.capacityMah / 1000)),
  };
  if (usablePct > DEFAULT_USABLE_PCT) {
    warnings.push({
      level: 'caution',
      code: 'deep-discharge',
      field: 'usablePct',
      message: `Planning on more than about ${DEFAULT_USABLE_PCT} % of the capacity leaves no reserve: the pack reaches its cutoff mid-run, and running a lithium pack that low shortens its life and can damage it. Follow the pack maker's limits.`,
    });
  }
  if (input.raceMin !== undefined) {
    results.maxAverageCurrentForRaceA = roundSig(usableMah / 1000 / (input.raceMin / 60));
    results.lastsRace = results.runTimeMin >= input.raceMin;
    if (!results.lastsRace) {
      warnings.push({
        level: 'caution',
        code: 'short-of-race',
        field: 'averageCurrentA',
        message: `At this current the pack runs short of the race: the low-voltage cutoff would cut power before the end. Gear down, or use a larger pack; do not lower the cutoff to finish.`,
      });
    }
  }
  return { results, warnings };
}

/** The run-time calculator: minutes from capacity and average current, and the current a race allows. */
export const runTimeCalculator = defineCalculator({
  name: 'run-time',
  title: 'Run time and average current',
  description: 'How long a pack lasts at an average current, on the share of its capacity you plan to use, and the highest average current that lasts a race.',
  input: runTimeInput,
  defaults: { capacityMah: 5000, averageCurrentA: 25, raceMin: 5 },
  compute: computeRunTime,
});
