import type { z } from 'zod';
import { checkEvenPoles } from './motor';
import { choiceInput, inputObject, numberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator } from './types';

/** Electrical degrees from mechanical degrees: one mechanical turn is one electrical cycle per pole pair. */
export function mechanicalToElectricalDeg(mechanicalDeg: number, poles: number): number {
  return mechanicalDeg * (poles / 2);
}

/** Mechanical degrees from electrical degrees (the inverse of {@link mechanicalToElectricalDeg}). */
export function electricalToMechanicalDeg(electricalDeg: number, poles: number): number {
  return electricalDeg / (poles / 2);
}

export const degreeKinds = ['mechanical', 'electrical'] as const;

/** Input of the degrees calculator: an angle, what kind it is, and the rotor's pole count. */
export const electricalDegreesInput = inputObject({
  degrees: numberInput({ label: 'Angle', unit: 'deg', min: -360, max: 360, step: 0.5, help: 'A timing angle: an endbell mark or a bench reading.' }),
  from: choiceInput({
    label: 'The angle is in',
    options: degreeKinds,
    optionLabels: { mechanical: 'Mechanical degrees (endbell marks)', electrical: 'Electrical degrees (bench readings, controller advance)' },
    aliases: { mech: 'mechanical', elec: 'electrical' },
  }),
  poles: numberInput({ label: 'Rotor poles', unit: 'poles', min: 2, max: 24, int: true, help: 'Magnet poles on the rotor (2 on most 1/10 racing motors).' }),
}).superRefine(checkEvenPoles);

/** Parsed degrees input. */
export type ElectricalDegreesInput = z.output<typeof electricalDegreesInput>;

/** Both forms of the angle and the pole pairs between them. */
export type ElectricalDegreesResults = { mechanicalDeg: number; electricalDeg: number; polePairs: number };

/** Converts a timing angle between mechanical and electrical degrees. */
export function computeElectricalDegrees(input: ElectricalDegreesInput) {
  const { degrees, from, poles } = input;
  const mech = from === 'mechanical' ? degrees : electricalToMechanicalDeg(degrees, poles);
  const elec = from === 'electrical' ? degrees : mechanicalToElectricalDeg(degrees, poles);
  const results: ElectricalDegreesResults = { mechanicalDeg: roundSig(mech), electricalDeg: roundSig(elec), polePairs: poles / 2 };
  return {
    results,
    warnings: [
      {
        level: 'info' as const,
        code: 'same-kind',
        message:
          'On a 2-pole rotor the two are equal; on a 4-pole rotor one endbell degree is two electrical degrees. Compare timing only in the same kind of degree.',
      },
    ],
  };
}

/** The degrees calculator: mechanical ↔ electrical by pole count. */
export const electricalDegreesCalculator = defineCalculator({
  name: 'electrical-degrees',
  title: 'Mechanical and electrical degrees',
  description: 'Endbell marks are mechanical degrees; the controller and a timing bench work in electrical degrees. Pole pairs convert one into the other.',
  input: electricalDegreesInput,
  defaults: { degrees: 15, from: 'mechanical', poles: 4 },
  compute: computeElectricalDegrees,
});
