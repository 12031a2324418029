import { distance as levenshtein } from 'fastest-levenshtein';
import { z } from 'zod';
import type { CalcField, CalcIssue } from './types';

// Builders for calculator input fields. Every value may arrive as a string (query strings, form
// fields, worked-example blocks), so numbers are coerced; blanks count as missing rather than
// silently becoming 0, which z.coerce.number() alone would do.

type NumberFieldSpec = {
  label: string;
  unit: string;
  min: number;
  max: number;
  step?: number;
  /** Whole numbers only (teeth, cells, poles). */
  int?: boolean;
  help?: string;
};

function isBlank(value: unknown): boolean {
  return value === undefined || value === null || (typeof value === 'string' && value.trim() === '');
}

function blankToUndefined(value: unknown): unknown {
  return isBlank(value) ? undefined : value;
}

function withUnit(value: number, unit: string): string {
  if (!unit) return String(value);
  return unit === '%' || unit === '°' ? `${value}${unit}` : `${value} ${unit}`;
}

function describeInput(value: unknown): string {
  return typeof value === 'string' ? `"${value}"` : typeof value === 'object' ? 'a list or object' : String(value);
}

/**
 * Normalises a typed number to the form `Number()` reads: a decimal comma becomes a point ("1,5" →
 * "1.5"), and commas that group thousands are dropped ("2,200" and "12,000" → "2200", "12000"). A
 * single comma is a thousands separator only when exactly three digits follow it and the digits
 * before it do not start with 0 ("0,125" is a decimal). Anything else is returned trimmed.
 */
export function normaliseNumberText(text: string): string {
  const t = text.trim().replace(/^−/, '-');
  if (/^[-+]?[1-9]\d{0,2}(,\d{3})+(\.\d+)?$/.test(t)) return t.replace(/,/g, '');
  if (/^[-+]?\d*,\d+$/.test(t)) return t.replace(',', '.');
  return t;
}

function numberCore(spec: NumberFieldSpec) {
  let n = z.coerce
    .number({ error: `${spec.label} must be a number` })
    .min(spec.min, { error: `${spec.label} must be at least ${withUnit(spec.min, spec.unit)}` })
    .max(spec.max, { error: `${spec.label} must be at most ${withUnit(spec.max, spec.unit)}` });
  if (spec.int) n = n.int({ error: `${spec.label} must be a whole number` });
  // Pre-check the raw value so the message can quote it and booleans or lists are not coerced to 1 or NaN.
  return z
    .unknown()
    .transform((value) => (typeof value === 'string' ? normaliseNumberText(value) : value))
    .superRefine((value, ctx) => {
      if (isBlank(value)) {
        ctx.addIssue({ code: 'custom', message: `${spec.label} is required`, abort: true });
      } else if (!(typeof value === 'number' || typeof value === 'string') || !Number.isFinite(Number(typeof value === 'string' ? value.trim() : value))) {
        ctx.addIssue({
          code: 'custom',
          message: `${spec.label} must be a number (got ${describeInput(value)})`,
          abort: true,
        });
      }
    })
    .pipe(n);
}

function fieldMeta(spec: NumberFieldSpec, optional: boolean): Omit<CalcField, 'key'> {
  return {
    label: spec.label,
    unit: spec.unit,
    ...(spec.help ? { help: spec.help } : {}),
    kind: 'number',
    min: spec.min,
    max: spec.max,
    ...(spec.step !== undefined || spec.int ? { step: spec.step ?? 1 } : {}),
    optional,
  };
}

/** A required number field with bounds, coerced from strings, with messages that name the field. */
export function numberInput(spec: NumberFieldSpec) {
  return numberCore(spec).meta({ title: spec.label, description: spec.help, 'x-calc-field': fieldMeta(spec, false) });
}

/** An optional number field: left out or blank means "not given". */
export function optionalNumberInput(spec: NumberFieldSpec) {
  return z.preprocess(blankToUndefined, numberCore(spec).optional()).meta({ title: spec.label, description: spec.help, 'x-calc-field': fieldMeta(spec, true) });
}

type ChoiceFieldSpec<T extends readonly [string, ...string[]]> = {
  label: string;
  options: T;
  /** Display label for each option. */
  optionLabels: Record<T[number], string>;
  /** Other spellings people type, mapped to an option (compared case-insensitively). */
  aliases?: Record<string, T[number]>;
  help?: string;
};

function normaliseChoice<T extends readonly [string, ...string[]]>(spec: ChoiceFieldSpec<T>) {
  return (value: unknown): unknown => {
    if (isBlank(value)) return undefined;
    if (typeof value !== 'string') return value;
    const wanted = value.trim().toLowerCase();
    const direct = spec.options.find((option) => option.toLowerCase() === wanted);
    if (direct) return direct;
    const aliasKey = Object.keys(spec.aliases ?? {}).find((alias) => alias.toLowerCase() === wanted);
    return aliasKey ? spec.aliases![aliasKey] : value;
  };
}

function choiceCore<T extends readonly [string, ...string[]]>(spec: ChoiceFieldSpec<T>) {
  const allowed = spec.options.map((option) => spec.optionLabels[option as T[number]]).join(', ');
  return z.enum(spec.options as unknown as [T[number], ...T[number][]], {
    error: (issue) =>
      issue.input === undefined
        ? `${spec.label} is required (one of: ${allowed})`
        : `${spec.label} must be one of: ${allowed} (got ${describeInput(issue.input)})`,
  });
}

function choiceMeta<T extends readonly [string, ...string[]]>(spec: ChoiceFieldSpec<T>, optional: boolean): Omit<CalcField, 'key'> {
  return {
    label: spec.label,
    unit: '',
    ...(spec.help ? { help: spec.help } : {}),
    kind: 'select',
    options: spec.options.map((value) => ({ value, label: spec.optionLabels[value as T[number]] })),
    optional,
  };
}

/** A required choice, matched case-insensitively (so "LiPo" and "lipo" both work) and via aliases. */
export function choiceInput<const T extends readonly [string, ...string[]]>(spec: ChoiceFieldSpec<T>) {
  return z.preprocess(normaliseChoice(spec), choiceCore(spec)).meta({ title: spec.label, description: spec.help, 'x-calc-field': choiceMeta(spec, false) });
}

/** A choice that falls back to `fallback` when left out or blank. */
export function defaultedChoiceInput<const T extends readonly [string, ...string[]]>(spec: ChoiceFieldSpec<T> & { fallback: T[number] }) {
  return z
    .preprocess(normaliseChoice(spec), choiceCore(spec).default(spec.fallback))
    .meta({ title: spec.label, description: spec.help, 'x-calc-field': choiceMeta(spec, true) });
}

/** The message for one unknown input key, suggesting the nearest known key when one is close. */
export function unknownKeyMessage(key: string, knownKeys: readonly string[]): string {
  const lower = key.toLowerCase();
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const known of knownKeys) {
    const knownLower = known.toLowerCase();
    // Also compare with the key minus its unit suffix (dragBrakePct → dragBrake), since people leave units off.
    const stem = known.replace(/(?<=[a-z])(Pct|PctPerS|Mm|In|Rpm|Deg|DegC|V|S|PerCellV|PerS)$/, '').toLowerCase();
    const distance = knownLower.startsWith(lower) || lower.startsWith(knownLower) ? 1 : Math.min(levenshtein(lower, knownLower), levenshtein(lower, stem));
    if (distance < bestDistance) {
      best = known;
      bestDistance = distance;
    }
  }
  const hint = best !== undefined && bestDistance <= Math.max(2, Math.floor(key.length / 3)) ? ` Did you mean "${best}"?` : '';
  return `Unknown field "${key}".${hint} Known fields: ${knownKeys.join(', ')}.`;
}

/** An input object that rejects unknown keys with a message naming each one. */
export function inputObject<Shape extends z.core.$ZodLooseShape>(shape: Shape) {
  const knownKeys = Object.keys(shape);
  return z.strictObject(shape, {
    error: (issue) => {
      if (issue.code === 'unrecognized_keys') {
        return issue.keys.map((key) => unknownKeyMessage(key, knownKeys)).join(' ');
      }
      if (issue.code === 'invalid_type') return 'Inputs must be a set of named values (key: value)';
      return undefined;
    },
  });
}

/**
 * Maps zod issues to `{ path, message }` pairs keyed by field; an unknown-keys issue becomes one
 * issue per unknown key so a form or a worked-example card can point at each.
 */
export function toCalcIssues(error: z.ZodError, knownKeys: readonly string[]): CalcIssue[] {
  return error.issues.flatMap((issue): CalcIssue[] => {
    const base = issue.path.map(String).join('.');
    if (issue.code === 'unrecognized_keys') {
      return issue.keys.map((key) => ({
        path: base ? `${base}.${key}` : key,
        message: unknownKeyMessage(key, knownKeys),
      }));
    }
    return [{ path: base, message: issue.message }];
  });
}
