import { parseDocument, stringify } from 'yaml';
import { normaliseNumberText, toCalcIssues } from './inputs';
import { getCalculator, isCalculatorName, unknownCalculatorMessage, type CalculatorName } from './registry';
import type { CalcIssue } from './types';

/** A worked-example block that validated: the calculator, its parsed inputs and the inputs as written. */
export type WorkedExampleOk = {
  ok: true;
  calc: CalculatorName;
  inputs: Record<string, unknown>;
  rawInputs: Record<string, unknown>;
};

/** A worked-example block that did not validate; `calc` is set when the calculator name was readable. */
export type WorkedExampleError = {
  ok: false;
  calc?: string;
  rawInputs?: Record<string, unknown>;
  issues: CalcIssue[];
};

/** Result of {@link parseWorkedExample}. */
export type WorkedExampleResult = WorkedExampleOk | WorkedExampleError;

function isPlainRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/**
 * Parses the body of a ```worked-example fenced block: `key: value` lines, where `calc` names the
 * calculator and every other key is one of its inputs. Never throws; every problem is an issue
 * naming the field (or `''` for the block as a whole).
 */
export function parseWorkedExample(body: string): WorkedExampleResult {
  try {
    return parseUnsafe(body);
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    return { ok: false, issues: [{ path: '', message: `This worked example could not be read: ${detail}` }] };
  }
}

function parseUnsafe(body: string): WorkedExampleResult {
  if (typeof body !== 'string' || body.trim() === '') {
    return {
      ok: false,
      issues: [{ path: '', message: 'This worked example is empty: it needs a "calc:" line and the inputs.' }],
    };
  }
  const document = parseDocument(body, { prettyErrors: true, uniqueKeys: true });
  if (document.errors.length > 0) {
    return {
      ok: false,
      issues: document.errors.map((error) => ({
        path: '',
        message: `Syntax error in the worked example${error.linePos ? ` at line ${error.linePos[0].line}` : ''}: ${error.message.split('\n')[0]}`,
      })),
    };
  }
  const data: unknown = document.toJS();
  if (!isPlainRecord(data)) {
    return {
      ok: false,
      issues: [{ path: '', message: 'A worked example must be "key: value" lines, starting with "calc: <calculator name>".' }],
    };
  }
  const { calc, ...rawInputs } = data;
  if (calc === undefined || calc === null || calc === '') {
    return { ok: false, rawInputs, issues: [{ path: 'calc', message: 'Missing "calc:" line naming the calculator.' }] };
  }
  const calcName = String(calc).trim();
  if (!isCalculatorName(calcName)) {
    return {
      ok: false,
      calc: calcName,
      rawInputs,
      issues: [{ path: 'calc', message: unknownCalculatorMessage(calcName) }],
    };
  }
  const calculator = getCalculator(calcName)!;
  const parsed = calculator.input.safeParse(rawInputs);
  if (!parsed.success) {
    return {
      ok: false,
      calc: calcName,
      rawInputs,
      issues: toCalcIssues(
        parsed.error,
        calculator.fields.map((field) => field.key),
      ),
    };
  }
  return { ok: true, calc: calcName, inputs: parsed.data as Record<string, unknown>, rawInputs };
}

/**
 * Writes a ```worked-example fenced block for a calculator and its inputs as typed (blank inputs
 * are left out; numbers typed with a decimal comma are written with a point). The text between the
 * fences reads back through {@link parseWorkedExample}; values are written by the YAML library, so
 * nothing typed can break out of its line.
 */
export function formatWorkedExample(calc: string, inputs: Record<string, unknown>): string {
  const lines: Record<string, unknown> = { calc };
  for (const [key, raw] of Object.entries(inputs)) {
    if (raw === undefined || raw === null || (typeof raw === 'string' && raw.trim() === '')) continue;
    const text = typeof raw === 'string' ? normaliseNumberText(raw) : raw;
    lines[key] = typeof text === 'string' && text !== '' && Number.isFinite(Number(text)) ? Number(text) : text;
  }
  return `\`\`\`worked-example\n${stringify(lines, { lineWidth: 0 })}\`\`\`\n`;
}
