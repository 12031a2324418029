import { useId, type KeyboardEvent } from 'react';
import type { CalcField } from '@shared/calc/types';
import { formatQuantity, type UnitSystem } from '@shared/units';
import type { CalcValues } from '../hooks/use-calculation';
import { unitLabel } from './result-format';

type Props = {
  fields: CalcField[];
  values: CalcValues;
  errors: Record<string, string>;
  onChange: (key: string, value: string) => void;
  /** Prefix for input ids, so two cards on one page never share an id. */
  idPrefix?: string;
  /** Fields to show up front; the rest go under "More inputs". All are shown when left out. */
  primaryKeys?: ReadonlySet<string>;
  /** Display units: in imperial, a millimetre or °C input shows its value in inches or °F beside it. */
  units?: UnitSystem;
};

/** "= 2.44 in" under a millimetre input (and °F under a °C one) for someone who reads imperial. */
function imperialHint(field: CalcField, raw: string | undefined): string | null {
  const n = raw !== undefined && raw.trim() !== '' ? Number(raw) : Number.NaN;
  if (!Number.isFinite(n)) return null;
  if (field.unit === 'mm') return `= ${formatQuantity('length', n, 'imperial', 3)}`;
  if (field.unit === '°C' || field.unit === 'C') return `= ${formatQuantity('temperature', n, 'imperial', 1)}`;
  return null;
}

const decimals = (step: number) => (String(step).split('.')[1] ?? '').length;

/** Arrow keys step a number field like a spin button (the fields are text so any typing can be explained). */
function stepValue(field: CalcField, current: string, direction: 1 | -1, big: boolean): string | null {
  const n = Number(current.trim() === '' ? (field.min ?? 0) : current);
  if (!Number.isFinite(n)) return null;
  const step = (field.step ?? 1) * (big ? 10 : 1);
  let next = n + direction * step;
  if (field.min !== undefined) next = Math.max(field.min, next);
  if (field.max !== undefined) next = Math.min(field.max, next);
  return next.toFixed(decimals(field.step ?? 1));
}

/** Inputs generated from a calculator's fields: labels with units, hints, and each field's own error under it. */
export function CalculatorForm({ fields, values, errors, onChange, idPrefix, primaryKeys, units = 'metric' }: Props) {
  const auto = useId();
  const prefix = idPrefix ?? auto;
  const primary = primaryKeys ? fields.filter((f) => primaryKeys.has(f.key)) : fields;
  const more = primaryKeys ? fields.filter((f) => !primaryKeys.has(f.key)) : [];
  const moreHasError = more.some((f) => errors[f.key]);
  const grid = 'grid grid-cols-1 gap-x-4 gap-y-3 min-[420px]:grid-cols-2';
  const render = (field: CalcField) => renderField(field, { values, errors, onChange, prefix, units });
  return (
    <div className="flex flex-col gap-3">
      <div className={grid}>{primary.map(render)}</div>
      {more.length > 0 && (
        <details className="group rounded-md border border-paper-line bg-paper/60 px-3 py-2" open={moreHasError || undefined}>
          <summary className="cursor-pointer text-sm font-medium text-ink-soft select-none">
            More inputs <span className="font-normal text-ink-muted">({more.map((f) => f.label.toLowerCase()).join(', ')})</span>
          </summary>
          <div className={`${grid} mt-3`}>{more.map(render)}</div>
        </details>
      )}
    </div>
  );
}

function renderField(
  field: CalcField,
  {
    values,
    errors,
    onChange,
    prefix,
    units,
  }: {
    values: CalcValues;
    errors: Record<string, string>;
    onChange: Props['onChange'];
    prefix: string;
    units: UnitSystem;
  },
) {
  {
    const id = `${prefix}-${field.key}`;
    const error = errors[field.key];
    const unit = unitLabel(field.unit);
    const hint = units === 'imperial' && field.kind === 'number' ? imperialHint(field, values[field.key]) : null;
    const describedBy = [error ? `${id}-error` : null, field.help ? `${id}-help` : null].filter(Boolean).join(' ') || undefined;
    const label = (
      <label htmlFor={id} className="flex items-baseline justify-between gap-2 text-sm font-medium text-ink">
        <span>
          {field.label}
          {field.optional && field.kind === 'number' && <span className="ml-1 text-xs font-normal text-ink-muted">(optional)</span>}
        </span>
        {unit && (
          <span className="text-xs font-normal text-ink-muted">
            {unit}
            {hint && <span data-imperial-hint> {hint}</span>}
          </span>
        )}
      </label>
    );
    const control = `w-full rounded-md border bg-white/85 px-2.5 py-1.5 text-[0.95rem] text-ink shadow-inner focus:border-copper ${error ? 'border-danger' : 'border-ink/25'}`;
    return (
      <div key={field.key} className="flex min-w-0 flex-col gap-1">
        {label}
        {field.kind === 'select' ? (
          <select
            id={id}
            className={control}
            value={values[field.key] ?? ''}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy}
            onChange={(e) => onChange(field.key, e.target.value)}
          >
            {!field.options?.some((o) => o.value === values[field.key]) && <option value={values[field.key] ?? ''}>{values[field.key] || 'Choose…'}</option>}
            {field.options?.map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </select>
        ) : (
          <input
            id={id}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            className={`${control} font-mono`}
            value={values[field.key] ?? ''}
            placeholder={field.optional ? 'not set' : undefined}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy}
            onChange={(e) => onChange(field.key, e.target.value)}
            onKeyDown={(e: KeyboardEvent<HTMLInputElement>) => {
              if (e.key !== 'ArrowUp' && e.key !== 'ArrowDown') return;
              const next = stepValue(field, values[field.key] ?? '', e.key === 'ArrowUp' ? 1 : -1, e.shiftKey);
              if (next !== null) {
                e.preventDefault();
                onChange(field.key, next);
              }
            }}
          />
        )}
        {error && (
          <p id={`${id}-error`} className="text-xs leading-5 text-danger" data-field-error={field.key}>
            {error}
          </p>
        )}
        {field.help && !error && (
          <p id={`${id}-help`} className="text-xs leading-5 text-ink-muted">
            {field.help}
          </p>
        )}
      </div>
    );
  }
}
