import { expect } from 'vitest';
import { runCalculator, type CalculatorName } from '../../../shared/calc/registry';
import type { CalcIssue, CalcOutput } from '../../../shared/calc/types';

/** Asserts |actual − expected| ≤ rel × |expected|. */
export function expectRelClose(actual: number | undefined, expected: number, rel: number): void {
  expect(actual).toBeTypeOf('number');
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(rel * Math.abs(expected));
}

/** Relative tolerance that covers the calculators' 5-significant-figure display rounding. */
export const DISPLAY_REL = 1e-4;

/** Runs a calculator through the registry on raw input and returns its output, failing the test on issues. */
export function run<R>(name: CalculatorName, input: unknown): CalcOutput<R> {
  const result = runCalculator(name, input);
  if (!result.ok) throw new Error(`expected ${name} to accept ${JSON.stringify(input)}: ${JSON.stringify(result.issues)}`);
  return result.output as CalcOutput<R>;
}

/** Runs a calculator on input that should be rejected and returns the issues. */
export function rejected(name: CalculatorName, input: unknown): CalcIssue[] {
  const result = runCalculator(name, input);
  if (result.ok) throw new Error(`expected ${name} to reject ${JSON.stringify(input)}`);
  return result.issues;
}

/** The issue at `path`, failing the test when there is none. */
export function issueAt(issues: CalcIssue[], path: string): CalcIssue {
  const found = issues.find((issue) => issue.path === path);
  if (!found) throw new Error(`no issue at "${path}" in ${JSON.stringify(issues)}`);
  return found;
}
