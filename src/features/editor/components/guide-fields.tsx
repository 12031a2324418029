import { CLASSES, SURFACES } from '@shared/constants';
import type { ParameterSummary } from '@shared/schemas/parameter';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { CommaListField, ParameterPicker } from './list-fields';

/** The guide's content as the form holds it (the shape of guideContentSchema). */
export type GuideForm = {
  title: string;
  summary: string;
  class: string;
  surface: string;
  conditions: string;
  tags: string[];
  parameters: string[];
  body: string;
};

export const emptyGuide: GuideForm = { title: '', summary: '', class: '', surface: '', conditions: '', tags: [], parameters: [], body: '' };

/** Normalises stored content into the form's shape. */
export function toGuideForm(content: Record<string, unknown> | null | undefined): GuideForm {
  const c = content ?? {};
  const str = (v: unknown) => (typeof v === 'string' ? v : '');
  const list = (v: unknown) => (Array.isArray(v) ? v.map(String) : []);
  return {
    title: str(c.title),
    summary: str(c.summary),
    class: str(c.class),
    surface: str(c.surface),
    conditions: str(c.conditions),
    tags: list(c.tags),
    parameters: list(c.parameters),
    body: str(c.body),
  };
}

type Props = { value: GuideForm; onChange: (patch: Partial<GuideForm>) => void; errors: Record<string, string>; parameterOptions: ParameterSummary[] };

/** Title, summary, class, surface, conditions, tags and the parameters discussed. */
export function GuideFields({ value, onChange, errors, parameterOptions }: Props) {
  return (
    <div className="flex flex-col gap-4">
      <TextField
        label="Title"
        value={value.title}
        onChange={(e) => onChange({ title: e.target.value })}
        error={errors.title}
        hint="The class and the track or layout, e.g. “Stock 2WD buggy on Harbour Flats clay, tight layout”. Your draft is saved to your workbench as soon as it has a title."
        limit={140}
      />
      <TextAreaField
        label="Summary"
        rows={2}
        value={value.summary}
        onChange={(e) => onChange({ summary: e.target.value })}
        error={errors.summary}
        hint="One or two sentences: who it is for and what it sets up."
        limit={500}
      />
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField label="Class" value={value.class} onChange={(e) => onChange({ class: e.target.value })} error={errors.class}>
          <option value="">Choose a class…</option>
          {CLASSES.map((c) => (
            <option key={c.slug} value={c.slug}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Surface" value={value.surface} onChange={(e) => onChange({ surface: e.target.value })} error={errors.surface}>
          <option value="">Choose a surface…</option>
          {SURFACES.map((s) => (
            <option key={s.slug} value={s.slug}>
              {s.name}
            </option>
          ))}
        </SelectField>
      </div>
      <TextField
        label="Conditions"
        value={value.conditions}
        onChange={(e) => onChange({ conditions: e.target.value })}
        error={errors.conditions}
        hint="Indoor or outdoor, grip, layout, air temperature."
        limit={300}
      />
      <CommaListField
        label="Tags"
        value={value.tags}
        onChange={(tags) => onChange({ tags })}
        error={errors.tags}
        hint="Separated by commas: stock, 17.5T, 2S, indoor."
      />
      <ParameterPicker label="Settings discussed" options={parameterOptions} value={value.parameters} onChange={(parameters) => onChange({ parameters })} />
    </div>
  );
}
