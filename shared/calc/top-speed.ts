import type { z } from 'zod';
import { finalDriveRatio, gearingInput, roadSpeedKmh } from './gearing';
import { inputObject, numberInput } from './inputs';
import { highRpmWarning, motorInput } from './motor';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

/** Loaded speed above which the high-speed caution is shown (common practice, no source). */
export const HIGH_SPEED_KMH = 80;
/** 1 mile per hour = 1.609344 km/h exactly (NIST SP 811, Appendix B). */
const KMH_PER_MPH = 1.609344;

/** Input of the top-speed calculator: the motor and gearing inputs plus how much of no-load rpm survives load. */
export const topSpeedInput = inputObject({
  kv: motorInput.shape.kv,
  volts: motorInput.shape.volts,
  spur: gearingInput.shape.spur,
  pinion: gearingInput.shape.pinion,
  internalRatio: gearingInput.shape.internalRatio,
  tyreDiameterMm: gearingInput.shape.tyreDiameterMm,
  loadFactor: numberInput({
    label: 'Load factor',
    unit: '',
    min: 0.5,
    max: 1,
    step: 0.01,
    help: 'Fraction of no-load rpm the motor reaches on the track (drag, rolling resistance, voltage sag); 0.8–0.9 is a usual guess.',
  }),
});

/** Parsed top-speed input. */
export type TopSpeedInput = z.output<typeof topSpeedInput>;

/** Top-speed results. */
export type TopSpeedResults = {
  noLoadRpm: number;
  loadedRpm: number;
  finalDriveRatio: number;
  noLoadKmh: number;
  noLoadMph: number;
  loadedKmh: number;
  loadedMph: number;
};

/** Estimates top speed: no-load rpm (kV × V) through the final drive to the tyre, then scaled by the load factor. */
export function computeTopSpeed(input: TopSpeedInput) {
  const { kv, volts, spur, pinion, internalRatio, tyreDiameterMm, loadFactor } = input;
  const noLoadRpm = kv * volts;
  const ratio = finalDriveRatio(spur, pinion, internalRatio);
  const noLoadKmh = roadSpeedKmh(noLoadRpm, tyreDiameterMm, ratio);
  const loadedKmh = noLoadKmh * loadFactor;

  const warnings: CalcWarning[] = [];
  if (loadedKmh > HIGH_SPEED_KMH) {
    warnings.push({
      level: 'caution',
      code: 'high-speed',
      message:
        `Over ${HIGH_SPEED_KMH} km/h the car can injure someone and wreck itself in an impact: run it only where the track ` +
        "and the sanctioning body's rules allow, with people clear of the driving line. Tyres can balloon or come apart at this speed; " +
        'check they are glued and rated for it.',
    });
  }
  const rpmWarning = highRpmWarning(noLoadRpm, 'volts');
  if (rpmWarning) warnings.push(rpmWarning);
  warnings.push({
    level: 'info',
    code: 'spinning-drivetrain',
    message:
      'Holding the car with the wheels off the ground at full throttle spins the tyres and drivetrain at the no-load speed: ' +
      'keep fingers, hair and loose clothing clear of the wheels, pinion and spur.',
  });

  const results: TopSpeedResults = {
    noLoadRpm: Math.round(noLoadRpm),
    loadedRpm: Math.round(noLoadRpm * loadFactor),
    finalDriveRatio: roundSig(ratio),
    noLoadKmh: roundSig(noLoadKmh),
    noLoadMph: roundSig(noLoadKmh / KMH_PER_MPH),
    loadedKmh: roundSig(loadedKmh),
    loadedMph: roundSig(loadedKmh / KMH_PER_MPH),
  };
  return { results, warnings };
}

/** The top-speed calculator: estimated top speed from kV, voltage, gearing and tyre size. */
export const topSpeedCalculator = defineCalculator({
  name: 'top-speed',
  title: 'Estimated top speed',
  description:
    'Top speed from motor kV, pack voltage, gearing and tyre size: the no-load figure, and a loaded estimate scaled by how much rpm the motor keeps on the track.',
  input: topSpeedInput,
  defaults: { kv: 4000, volts: 8.4, spur: 84, pinion: 40, internalRatio: 1.9, tyreDiameterMm: 64, loadFactor: 0.85 },
  compute: computeTopSpeed,
});
