import { useMemo, useRef } from 'react';
import { getCalculator, runCalculator } from '@shared/calc/registry';
import type { CalcOutput } from '@shared/calc/types';

/** Form values as typed: every input is text until the calculator's schema coerces it. */
export type CalcValues = Record<string, string>;

export type Calculation = {
  /** The newest output that validated; stays on screen (greyed) while the inputs are invalid. */
  output: CalcOutput<unknown> | null;
  /** True when `output` is from earlier inputs because the current ones do not validate. */
  stale: boolean;
  /** Messages keyed by field; `''` holds problems with the inputs as a whole. */
  fieldErrors: Record<string, string>;
};

/** Drops blank optional values so "left empty" means "not given" rather than an empty string. */
function toRawInput(values: CalcValues): Record<string, string> {
  return Object.fromEntries(Object.entries(values).filter(([, v]) => v.trim() !== ''));
}

/**
 * Runs a shared calculator on every change, in the browser (the same code the API runs), keeping the
 * last good output so a half-typed number never blanks the results.
 */
export function useCalculation(name: string, values: CalcValues): Calculation {
  const lastGood = useRef<{ name: string; output: CalcOutput<unknown> } | null>(null);
  return useMemo(() => {
    const calculator = getCalculator(name);
    if (!calculator) return { output: null, stale: false, fieldErrors: { '': `Unknown calculator "${name}"` } };
    const known = new Set(calculator.fields.map((f) => f.key));
    const result = runCalculator(name, toRawInput(values));
    if (result.ok) {
      lastGood.current = { name, output: result.output };
      return { output: result.output, stale: false, fieldErrors: {} };
    }
    const fieldErrors: Record<string, string> = {};
    for (const issue of result.issues) {
      const key = known.has(issue.path) ? issue.path : '';
      fieldErrors[key] = fieldErrors[key] ? `${fieldErrors[key]} ${issue.message}` : issue.message;
    }
    const previous = lastGood.current?.name === name ? lastGood.current.output : null;
    return { output: previous, stale: previous !== null, fieldErrors };
  }, [name, values]);
}

/**
 * Turns inputs as written into form text, filling every field the calculator has. A choice left out
 * takes its default from `parsed` (the validated inputs), so its select shows what is computed.
 */
export function valuesFromInputs(name: string, inputs: Record<string, unknown>, parsed: Record<string, unknown> = {}): CalcValues {
  const calculator = getCalculator(name);
  const out: CalcValues = {};
  for (const field of calculator?.fields ?? []) {
    const v = inputs[field.key] ?? (field.kind === 'select' ? parsed[field.key] : undefined);
    out[field.key] = v === undefined || v === null ? '' : String(v);
  }
  return out;
}
