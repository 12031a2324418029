import type { z } from 'zod';
import { choiceInput, defaultedChoiceInput, inputObject, numberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

// Conversion: t/°C = (t/°F − 32) / 1.8 (NIST SP 811, Appendix B, temperature conversions).

/** Parts with temperature bands. */
export const temperatureParts = ['motor', 'esc', 'pack'] as const;
/** One of {@link temperatureParts}. */
export type TemperaturePart = (typeof temperatureParts)[number];
/** Temperature bands from coolest to hottest. */
export type TemperatureBand = 'cool' | 'warm' | 'hot' | 'too-hot';

/**
 * Band limits in °C, read just after a run: `cool` below warmFromC, `warm` from warmFromC, `hot` from
 * hotFromC up to and including tooHotAboveC, `too-hot` above it.
 */
export type BandLimitsC = { warmFromC: number; hotFromC: number; tooHotAboveC: number };

/**
 * Band limits per part. Guides and parameter entries state motor temperatures in these same words.
 * - motor: commonly kept below about 71–82 °C (160–180 °F) after a run (common practice, no source),
 *   so `hot` is that window (at the usual limit: go no taller) and `too-hot` is above 82; warm from
 *   55 °C (common practice, no source). Why a ceiling: winding insulation is rated at its hottest spot
 *   by thermal class (IEC 60085: A 105, E 120, B 130, F 155, H 180 °C), which is inside the windings,
 *   hotter than the can; sintered NdFeB magnets lose strength as they heat (Wikipedia, "Rare-earth
 *   magnet", properties), for good past the grade's working temperature.
 * - esc: common practice, no source; the case runs a little cooler than a motor's can, and most
 *   controllers' own thermal cutoffs sit well above these, so they are early warnings.
 * - pack: lithium packs too hot above about 60 °C (common practice, no source); warm from 40, hot from 50.
 */
export const temperatureBands: Readonly<Record<TemperaturePart, BandLimitsC>> = Object.freeze({
  motor: { warmFromC: 55, hotFromC: 71, tooHotAboveC: 82 },
  esc: { warmFromC: 50, hotFromC: 70, tooHotAboveC: 85 },
  pack: { warmFromC: 40, hotFromC: 50, tooHotAboveC: 60 },
});

const partLabels: Record<TemperaturePart, string> = { motor: 'motor', esc: 'speed controller', pack: 'pack' };

const tooHotMessage: Record<TemperaturePart, string> = {
  motor:
    'Too hot for a motor: stop running. Heat like this weakens the rotor magnet and the winding insulation for good. ' +
    "Let it cool, gear down or reduce timing before the next run, and stay within the motor maker's limits. The can burns skin at this temperature.",
  esc:
    'Too hot for a speed controller: stop running before its thermal protection cuts out mid-race or the electronics are damaged. ' +
    "Let it cool, check its airflow and fan, gear down or reduce timing, and stay within the controller maker's limits. The heat sink burns skin at this temperature.",
  pack:
    'Too hot for a pack: stop using it. Let it cool on a non-flammable surface away from anything that burns, and do not charge it until it is at room temperature. ' +
    "A lithium pack this hot can swell, vent or catch fire; if it swells or smells, retire it as the maker instructs and follow the track's rules.",
};

/** Input of the temperature calculator: a reading, its unit and the part it was taken on. */
export const temperatureInput = inputObject({
  value: numberInput({
    label: 'Temperature',
    unit: '',
    min: -60,
    max: 300,
    step: 1,
    help: 'The reading, in the unit chosen below.',
  }),
  unit: choiceInput({
    label: 'Unit',
    options: ['C', 'F'],
    optionLabels: { C: '°C', F: '°F' },
    aliases: { '°c': 'C', '°f': 'F', celsius: 'C', fahrenheit: 'F' },
  }),
  part: defaultedChoiceInput({
    label: 'Part',
    options: temperatureParts,
    optionLabels: { motor: 'Motor', esc: 'Speed controller (ESC)', pack: 'Pack' },
    aliases: { controller: 'esc', battery: 'pack' },
    fallback: 'motor',
    help: 'Which part the reading was taken on, right after a run.',
  }),
});

/** Parsed temperature input. */
export type TemperatureInput = z.output<typeof temperatureInput>;

/** Temperature results. */
export type TemperatureResults = {
  c: number;
  f: number;
  band: TemperatureBand;
  part: TemperaturePart;
  bandLimitsC: BandLimitsC;
};

/** Degrees Fahrenheit to Celsius. */
export function fahrenheitToCelsius(f: number): number {
  return (f - 32) / 1.8;
}

/** Degrees Celsius to Fahrenheit. */
export function celsiusToFahrenheit(c: number): number {
  return c * 1.8 + 32;
}

/** The band a Celsius reading falls in for a part (limits in {@link temperatureBands}). */
export function temperatureBand(c: number, part: TemperaturePart): TemperatureBand {
  const limits = temperatureBands[part];
  if (c > limits.tooHotAboveC) return 'too-hot';
  if (c >= limits.hotFromC) return 'hot';
  if (c >= limits.warmFromC) return 'warm';
  return 'cool';
}

/** Converts a reading between °C and °F and says which band it falls in for the part. */
export function computeTemperature(input: TemperatureInput) {
  const { value, unit, part } = input;
  const c = unit === 'C' ? value : fahrenheitToCelsius(value);
  const f = unit === 'F' ? value : celsiusToFahrenheit(value);
  const band = temperatureBand(c, part);
  const limits = temperatureBands[part];
  const name = partLabels[part];
  const warnings: CalcWarning[] = [];

  if (band === 'hot') {
    warnings.push({
      level: 'caution',
      code: 'hot',
      field: 'value',
      message:
        (part === 'motor'
          ? 'At the usual upper limit for a motor (commonly kept below about 71–82 °C / 160–180 °F after a run): go no taller on gearing or timing, '
          : `Hot for a ${name}: `) +
        `let it cool fully before the next run and find the cause ` +
        (part === 'pack'
          ? '(too much current for the pack, a hot day, or a tired pack). '
          : '(gearing too tall, too much timing, heavy drag brake, or a binding drivetrain). ') +
        `Hot parts burn: handle with care. Follow the ${name} maker's limits.`,
    });
  } else if (band === 'too-hot') {
    warnings.push({ level: 'danger', code: 'too-hot', field: 'value', message: tooHotMessage[part] });
  }

  const results: TemperatureResults = {
    c: roundSig(c),
    f: roundSig(f),
    band,
    part,
    bandLimitsC: { ...limits },
  };
  return { results, warnings };
}

/** The temperature calculator: °C/°F conversion and the cool/warm/hot/too-hot band for a part. */
export const temperatureCalculator = defineCalculator({
  name: 'temperature',
  title: 'Temperature and heat bands',
  description: 'Converts a reading between °C and °F and says whether it is cool, warm, hot or too hot for a motor, speed controller or pack just after a run.',
  input: temperatureInput,
  defaults: { value: 160, unit: 'F', part: 'motor' },
  compute: computeTemperature,
});
