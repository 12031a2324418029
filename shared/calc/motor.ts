import type { z } from 'zod';
import { inputObject, numberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

/**
 * No-load rpm above which a caution is shown. Many 1/10 brushless motors are rated somewhere around
 * 50,000–60,000 rpm (common practice, no source); the maker's own limit is what counts.
 */
export const HIGH_RPM_CAUTION = 50_000;

/** Accepts an even pole count only: magnets come in north/south pairs. */
export function checkEvenPoles(value: { poles?: unknown }, ctx: z.RefinementCtx): void {
  if (typeof value.poles === 'number' && Number.isInteger(value.poles) && value.poles % 2 !== 0) {
    ctx.addIssue({
      code: 'custom',
      path: ['poles'],
      message: 'Poles must be an even number (magnet poles come in pairs: 2, 4, 6 …)',
    });
  }
}

/** Input of the motor calculator: speed constant, supply voltage and rotor pole count. */
export const motorInput = inputObject({
  kv: numberInput({
    label: 'Motor kV',
    unit: 'rpm/V',
    min: 100,
    max: 20_000,
    help: 'Speed constant: no-load rpm per volt.',
  }),
  volts: numberInput({
    label: 'Voltage',
    unit: 'V',
    min: 1,
    max: 60,
    step: 0.01,
    help: 'Pack voltage under use (e.g. 7.4 V nominal 2S, 8.4 V full).',
  }),
  poles: numberInput({
    label: 'Rotor poles',
    unit: 'poles',
    min: 2,
    max: 24,
    int: true,
    help: 'Magnet poles on the rotor (1/10 racing motors are usually 2-pole; 4-pole is common in larger scales).',
  }),
}).superRefine(checkEvenPoles);

/** Parsed motor input. */
export type MotorInput = z.output<typeof motorInput>;

/** Motor results. */
export type MotorResults = {
  noLoadRpm: number;
  ktNmPerA: number;
  polePairs: number;
  electricalRpm: number;
  electricalHz: number;
};

/** Torque constant in N·m/A from kV in rpm/V: Kt = 60 / (2π·Kv) (Wikipedia, "Motor constants"). */
export function torqueConstantFromKv(kv: number): number {
  return 60 / (2 * Math.PI * kv);
}

/** Electrical frequency in Hz at a mechanical rpm: f = rpm × poles / 120 (synchronous-speed relation). */
export function electricalFrequencyHz(rpm: number, poles: number): number {
  return (rpm * poles) / 120;
}

/** Caution about free-revving a motor near or past its rated speed. */
export function highRpmWarning(noLoadRpm: number, field: string): CalcWarning | null {
  if (noLoadRpm <= HIGH_RPM_CAUTION) return null;
  return {
    level: 'caution',
    code: 'high-rpm',
    field,
    message:
      `About ${Math.round(noLoadRpm).toLocaleString('en-GB')} rpm unloaded is beyond what many motors are rated for. ` +
      "Check the maker's rpm limit, never free-rev the motor at full throttle on the bench, and keep fingers clear of the pinion and spur.",
  };
}

/** Computes no-load speed, torque constant and the electrical speed and frequency the controller switches at. */
export function computeMotor(input: MotorInput) {
  const { kv, volts, poles } = input;
  const noLoadRpm = kv * volts;
  const polePairs = poles / 2;
  const warnings: CalcWarning[] = [];
  const rpmWarning = highRpmWarning(noLoadRpm, 'volts');
  if (rpmWarning) warnings.push(rpmWarning);
  warnings.push({
    level: 'info',
    code: 'no-load-estimate',
    message: 'No-load figures: under load on the track the motor turns slower and draws far more current.',
  });
  const results: MotorResults = {
    noLoadRpm: Math.round(noLoadRpm),
    ktNmPerA: roundSig(torqueConstantFromKv(kv)),
    polePairs,
    electricalRpm: Math.round(noLoadRpm * polePairs),
    electricalHz: roundSig(electricalFrequencyHz(noLoadRpm, poles)),
  };
  return { results, warnings };
}

/** The motor calculator: no-load rpm, torque constant, electrical rpm and frequency. */
export const motorCalculator = defineCalculator({
  name: 'motor',
  title: 'Motor speed and torque constant',
  description:
    'No-load speed from kV and voltage, the torque constant that goes with that kV, and the electrical speed the controller has to switch at for the pole count.',
  input: motorInput,
  defaults: { kv: 4000, volts: 8.4, poles: 2 },
  compute: computeMotor,
});
