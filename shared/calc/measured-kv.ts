import type { z } from 'zod';
import { highRpmWarning, torqueConstantFromKv } from './motor';
import { inputObject, numberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

/**
 * Measured speed constant in rpm/V from a bench run without load: kV = no-load rpm / test voltage
 * (Wikipedia, "Motor constants"). The few percent of losses at no load are ignored, as on every bench.
 */
export function measuredKv(noLoadRpm: number, testVoltageV: number): number {
  if (!(testVoltageV > 0)) throw new RangeError('The test voltage must be above 0 V');
  return noLoadRpm / testVoltageV;
}

/** Input of the measured-kV calculator: what the bench read. */
export const measuredKvInput = inputObject({
  noLoadRpm: numberInput({
    label: 'No-load speed',
    unit: 'rpm',
    min: 1,
    max: 200_000,
    step: 10,
    help: 'Motor speed with nothing attached, read with a tachometer or the bench meter.',
  }),
  testVoltageV: numberInput({
    label: 'Test voltage',
    unit: 'V',
    min: 0.5,
    max: 60,
    step: 0.01,
    help: 'Voltage at the motor leads while it spins (a regulated supply keeps checks comparable).',
  }),
});

/** Parsed measured-kV input. */
export type MeasuredKvInput = z.output<typeof measuredKvInput>;

/** Measured-kV results. */
export type MeasuredKvResults = { measuredKv: number; ktNmPerA: number };

/** Computes the measured kV and the torque constant that goes with it. */
export function computeMeasuredKv(input: MeasuredKvInput) {
  const kv = measuredKv(input.noLoadRpm, input.testVoltageV);
  const warnings: CalcWarning[] = [
    {
      level: 'info',
      code: 'same-voltage',
      message: 'Compare checks taken at the same test voltage: a motor reads a slightly different kV at another voltage.',
    },
  ];
  const rpmWarning = highRpmWarning(input.noLoadRpm, 'noLoadRpm');
  if (rpmWarning) warnings.push(rpmWarning);
  const results: MeasuredKvResults = { measuredKv: roundSig(kv), ktNmPerA: roundSig(torqueConstantFromKv(kv)) };
  return { results, warnings };
}

/** The measured-kV calculator: speed constant from a no-load bench run. */
export const measuredKvCalculator = defineCalculator({
  name: 'measured-kv',
  title: 'Measured kV from a bench run',
  description: 'The speed constant a motor actually has, from its no-load speed at a known test voltage, and the torque constant that goes with it.',
  input: measuredKvInput,
  defaults: { noLoadRpm: 15_840, testVoltageV: 7.4 },
  compute: computeMeasuredKv,
});
