import type { z } from 'zod';
import { choiceInput, inputObject, numberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

/** Temperature coefficient of annealed copper's resistance at 20 °C, per kelvin (IEC 60028). */
export const COPPER_ALPHA_20C = 0.00393;
/** Lowest and highest winding temperatures the bench calculations accept, in °C. */
export const WINDING_TEMP_MIN_C = -40;
export const WINDING_TEMP_MAX_C = 200;

/** Resistance of a copper winding at `tempC` from its resistance at 20 °C: R(T) = R20 × [1 + α (T − 20)] (IEC 60028). */
export function resistanceAtTemp(r20Ohm: number, tempC: number): number {
  return r20Ohm * (1 + COPPER_ALPHA_20C * (tempC - 20));
}

/** Resistance referred to 20 °C from a reading at `tempC`: R20 = R_T / [1 + α (T − 20)] (IEC 60028). */
export function resistanceAt20C(rAtTempOhm: number, tempC: number): number {
  return rAtTempOhm / (1 + COPPER_ALPHA_20C * (tempC - 20));
}

export const windingDirections = ['to-20c', 'from-20c'] as const;

/** Input of the winding-resistance calculator: a resistance, the temperature that goes with it, and which way to convert. */
export const windingResistanceInput = inputObject({
  direction: choiceInput({
    label: 'Convert',
    options: windingDirections,
    optionLabels: { 'to-20c': 'Reading at a temperature → at 20 °C', 'from-20c': 'At 20 °C → at a temperature' },
    aliases: { to20: 'to-20c', from20: 'from-20c', r20: 'to-20c' },
    help: 'Refer a bench reading to 20 °C to compare checks, or predict the resistance of a warm motor.',
  }),
  resistanceOhm: numberInput({
    label: 'Resistance',
    unit: 'Ω',
    min: 0.0001,
    max: 1000,
    step: 0.0001,
    help: 'Phase-to-phase resistance: the reading (to 20 °C) or the value at 20 °C (from 20 °C).',
  }),
  tempC: numberInput({
    label: 'Winding temperature',
    unit: '°C',
    min: WINDING_TEMP_MIN_C,
    max: WINDING_TEMP_MAX_C,
    step: 0.5,
    help: 'Temperature of the winding when read (let a motor cool to room temperature and read the room).',
  }),
});

/** Parsed winding-resistance input. */
export type WindingResistanceInput = z.output<typeof windingResistanceInput>;

/** Winding-resistance results: both ends of the conversion and the change between them. */
export type WindingResistanceResults = { r20Ohm: number; rAtTempOhm: number; changePct: number };

/** Converts a copper winding's resistance to or from 20 °C. */
export function computeWindingResistance(input: WindingResistanceInput) {
  const { direction, resistanceOhm, tempC } = input;
  const r20 = direction === 'to-20c' ? resistanceAt20C(resistanceOhm, tempC) : resistanceOhm;
  const rT = direction === 'to-20c' ? resistanceOhm : resistanceAtTemp(resistanceOhm, tempC);
  const warnings: CalcWarning[] = [];
  if (tempC > 60) {
    warnings.push({
      level: 'caution',
      code: 'hot-motor',
      field: 'tempC',
      message: "A motor this warm burns fingers: let it cool before handling it on the bench, and follow the motor maker's instructions.",
    });
  }
  warnings.push({
    level: 'info',
    code: 'copper-only',
    message: 'Copper windings only; meter leads and solder joints add their own resistance, so use the same leads each time.',
  });
  const results: WindingResistanceResults = { r20Ohm: roundSig(r20), rAtTempOhm: roundSig(rT), changePct: roundSig(((rT - r20) / r20) * 100, 4) };
  return { results, warnings };
}

/** The winding-resistance calculator (both directions). */
export const windingResistanceCalculator = defineCalculator({
  name: 'winding-resistance',
  title: 'Winding resistance and temperature',
  description:
    "A copper winding's resistance rises about 0.39 % per °C. Refer a bench reading to 20 °C so checks taken on warm and cold days compare, or predict the resistance at another temperature.",
  input: windingResistanceInput,
  defaults: { direction: 'to-20c', resistanceOhm: 0.0215, tempC: 24 },
  compute: computeWindingResistance,
});
