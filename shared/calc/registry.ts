import { benchVerdictCalculator } from './bench-verdict';
import { brakeCalculator } from './brake';
import { electricalDegreesCalculator } from './electrical-degrees';
import { measuredKvCalculator } from './measured-kv';
import { windingResistanceCalculator } from './winding-resistance';
import { gearingCalculator } from './gearing';
import { toCalcIssues } from './inputs';
import { motorCalculator } from './motor';
import { packCalculator } from './pack';
import { runTimeCalculator } from './run-time';
import { temperatureCalculator } from './temperature';
import { throttleCalculator } from './throttle';
import { timingCurveCalculator } from './timing-curve';
import { topSpeedCalculator } from './top-speed';
import type { AnyCalculator, CalcIssue, CalcOutput } from './types';

/** Every calculator, by its fixed name (the `calc:` value of a worked-example block). */
export const calculators = {
  gearing: gearingCalculator,
  motor: motorCalculator,
  'top-speed': topSpeedCalculator,
  'timing-curve': timingCurveCalculator,
  pack: packCalculator,
  throttle: throttleCalculator,
  brake: brakeCalculator,
  temperature: temperatureCalculator,
  'run-time': runTimeCalculator,
  'measured-kv': measuredKvCalculator,
  'winding-resistance': windingResistanceCalculator,
  'electrical-degrees': electricalDegreesCalculator,
  'bench-verdict': benchVerdictCalculator,
} as const;

/** A calculator's name. */
export type CalculatorName = keyof typeof calculators;

/** The calculator names, in display order. */
export const calculatorNames = Object.keys(calculators) as CalculatorName[];

/** True when `name` is a calculator's name. */
export function isCalculatorName(name: unknown): name is CalculatorName {
  return typeof name === 'string' && Object.prototype.hasOwnProperty.call(calculators, name);
}

/** The calculator with this name, or undefined. */
export function getCalculator(name: string): AnyCalculator | undefined {
  return isCalculatorName(name) ? calculators[name] : undefined;
}

/** The message for a name that is not a calculator. */
export function unknownCalculatorMessage(name: unknown): string {
  const shown = typeof name === 'string' ? `"${name}"` : String(name);
  return `Unknown calculator ${shown}. Known calculators: ${calculatorNames.join(', ')}.`;
}

/** Result of {@link runCalculator}. */
export type RunCalculatorResult = { ok: true; output: CalcOutput<unknown> } | { ok: false; issues: CalcIssue[] };

/**
 * Validates raw input (strings allowed) against a calculator's schema and computes it; every problem
 * comes back as issues keyed by field, never as an exception.
 */
export function runCalculator(name: string, rawInput: unknown): RunCalculatorResult {
  const calculator = getCalculator(name);
  if (!calculator) return { ok: false, issues: [{ path: '', message: unknownCalculatorMessage(name) }] };
  const parsed = calculator.input.safeParse(rawInput);
  if (!parsed.success) {
    return {
      ok: false,
      issues: toCalcIssues(
        parsed.error,
        calculator.fields.map((field) => field.key),
      ),
    };
  }
  try {
    return { ok: true, output: calculator.compute(parsed.data as never) };
  } catch (error) {
    // Valid input should never get here; report it as an issue rather than crash a page.
    const detail = error instanceof Error ? error.message : String(error);
    return { ok: false, issues: [{ path: '', message: `The ${name} calculator failed on this input: ${detail}` }] };
  }
}
