import { PARAMETER_CATEGORIES } from '@shared/constants';
import { calculatorNames } from '@shared/calc/registry';
import type { ParameterSummary } from '@shared/schemas/parameter';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { CommaListField, ParameterPicker } from './list-fields';

/** A parameter entry as the form holds it (the shape of parameterContentSchema). */
export type ParameterForm = {
  name: string;
  aliases: string[];
  category: string;
  unit: string;
  range: { min: number | null; max: number | null; step: number | null };
  summary: string;
  related: string[];
  calculator: string | null;
  body: string;
};

export function toParameterForm(content: Record<string, unknown> | null | undefined): ParameterForm {
  const c = content ?? {};
  const str = (v: unknown) => (typeof v === 'string' ? v : '');
  const list = (v: unknown) => (Array.isArray(v) ? v.map(String) : []);
  const r = (c.range ?? {}) as Record<string, unknown>;
  const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
  return {
    name: str(c.name),
    aliases: list(c.aliases),
    category: str(c.category),
    unit: str(c.unit),
    range: { min: num(r.min), max: num(r.max), step: num(r.step) },
    summary: str(c.summary),
    related: list(c.related),
    calculator: typeof c.calculator === 'string' && c.calculator ? c.calculator : null,
    body: str(c.body),
  };
}

type Props = {
  slug: string;
  value: ParameterForm;
  onChange: (patch: Partial<ParameterForm>) => void;
  errors: Record<string, string>;
  parameterOptions: ParameterSummary[];
};

function NumberInput({ label, value, onChange, error }: { label: string; value: number | null; onChange: (v: number | null) => void; error?: string }) {
  return (
    <TextField
      label={label}
      type="number"
      inputMode="decimal"
      step="any"
      value={value ?? ''}
      onChange={(e) => onChange(e.target.value === '' ? null : Number(e.target.value))}
      error={error}
    />
  );
}

/** Name, other names, category, unit, typical range, summary, related settings and calculator. */
export function ParameterFields({ slug, value, onChange, errors, parameterOptions }: Props) {
  const setRange = (patch: Partial<ParameterForm['range']>) => onChange({ range: { ...value.range, ...patch } });
  return (
    <div className="flex flex-col gap-4">
      <TextField label="Name" value={value.name} onChange={(e) => onChange({ name: e.target.value })} error={errors.name} limit={80} />
      <CommaListField
        label="Also called"
        value={value.aliases}
        onChange={(aliases) => onChange({ aliases })}
        error={errors.aliases}
        hint="Other common names and common misspellings, separated by commas."
      />
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField label="Category" value={value.category} onChange={(e) => onChange({ category: e.target.value })} error={errors.category}>
          <option value="">Choose…</option>
          {PARAMETER_CATEGORIES.map((c) => (
            <option key={c} value={c}>
              {c}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Unit"
          value={value.unit}
          onChange={(e) => onChange({ unit: e.target.value })}
          error={errors.unit}
          hint="%, deg, rpm, V, kHz, A, °C, s — empty for a mode."
          limit={12}
        />
      </div>
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-1 text-sm font-medium">Typical range</legend>
        <NumberInput label="From" value={value.range.min} onChange={(min) => setRange({ min })} error={errors['range.min']} />
        <NumberInput label="To" value={value.range.max} onChange={(max) => setRange({ max })} error={errors['range.max']} />
        <NumberInput label="Step" value={value.range.step} onChange={(step) => setRange({ step })} error={errors['range.step']} />
      </fieldset>
      <TextAreaField
        label="Summary"
        rows={2}
        value={value.summary}
        onChange={(e) => onChange({ summary: e.target.value })}
        error={errors.summary}
        hint="What it does and its main trade-off."
        limit={400}
      />
      <SelectField
        label="Calculator that illustrates it"
        value={value.calculator ?? ''}
        onChange={(e) => onChange({ calculator: e.target.value || null })}
        error={errors.calculator}
      >
        <option value="">None</option>
        {calculatorNames.map((n) => (
          <option key={n} value={n}>
            {n}
          </option>
        ))}
      </SelectField>
      <ParameterPicker label="Related settings" options={parameterOptions} value={value.related} onChange={(related) => onChange({ related })} exclude={slug} />
    </div>
  );
}
