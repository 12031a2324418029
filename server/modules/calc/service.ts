import { z } from 'zod';
import { calculatorNames, calculators, getCalculator, runCalculator } from '../../../shared/calc/registry';
import type { AnyCalculator, CalcField } from '../../../shared/calc/types';
import { notFound, validationFailed } from '../../lib/errors';

/**
 * JSON Schema of what a calculator accepts. `io: 'input'` describes the request side (defaulted fields
 * are not required). The number builders pre-check `unknown` before coercing, which JSON Schema cannot
 * express, so their type and bounds are filled back in from the field metadata the schema carries.
 */
export function calculatorInputJsonSchema(calculator: AnyCalculator): Record<string, unknown> {
  return z.toJSONSchema(calculator.input, {
    io: 'input',
    unrepresentable: 'any',
    override: ({ jsonSchema }) => {
      const meta = (jsonSchema as Record<string, unknown>)['x-calc-field'] as Omit<CalcField, 'key'> | undefined;
      if (!meta || meta.kind !== 'number' || 'type' in jsonSchema) return;
      const whole = meta.step === 1 && Number.isInteger(meta.min ?? 0);
      Object.assign(jsonSchema, {
        type: whole ? 'integer' : 'number',
        ...(meta.min !== undefined ? { minimum: meta.min } : {}),
        ...(meta.max !== undefined ? { maximum: meta.max } : {}),
      });
    },
  }) as Record<string, unknown>;
}

/** Calculator listing and evaluation for the API; the computation itself is the shared code the client runs too. */
export const calcService = {
  list() {
    return calculatorNames.map((name) => calculators[name] as unknown as AnyCalculator);
  },

  /** Validates and computes; throws 404 for an unknown name and 400 naming each bad field (body.<field>). */
  run(name: string, input: unknown) {
    if (!getCalculator(name)) throw notFound(`The calculator "${name}"`);
    const outcome = runCalculator(name, input);
    if (!outcome.ok) {
      throw validationFailed(
        outcome.issues.map((issue) => ({ path: issue.path ? `body.${issue.path}` : 'body', message: issue.message })),
        'Some inputs need attention',
      );
    }
    return outcome.output;
  },
};
