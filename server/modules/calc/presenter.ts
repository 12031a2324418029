import type { CalculatorInfo } from '../../../shared/schemas/calc';
import type { AnyCalculator } from '../../../shared/calc/types';
import { calculatorInputJsonSchema } from './service';

export function presentCalculator(calculator: AnyCalculator): CalculatorInfo {
  return {
    name: calculator.name,
    title: calculator.title,
    description: calculator.description,
    fields: calculator.fields,
    defaults: calculator.defaults as Record<string, unknown>,
    inputSchema: calculatorInputJsonSchema(calculator),
  };
}
