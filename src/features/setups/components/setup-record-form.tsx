import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useMemo, useState, type ChangeEvent, type ReactNode } from 'react';
import { get, useForm, type FieldErrors, type Resolver } from 'react-hook-form';
import { CLASSES, SURFACES } from '@shared/constants';
import { packChemistries, chemistryVoltages } from '@shared/calc/chemistry';
import { canonicalRecord, DRIVETRAINS, SETUP_SCHEMA_VERSION, setupRecordSchema, SLUGS_WITH_OWN_FIELD, type SetupRecord } from '@shared/schemas/setup-record';
import type { SettingDefinitionRow } from '@shared/schemas/setup';
import { computeSetup } from '@shared/setup/computed';
import { parseSetupText, type SetupIssue } from '@shared/setup/import';
import { normaliseNumberText } from '@shared/calc/inputs';
import { settingChoices, typicalStart } from '@shared/setup/choices';
import { fileChanges, type FileChange } from './file-changes';
import { classLabel, showValue } from './labels';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { Spinner } from '@/components/ui/card';
import { setupQueries } from '../api/setups';
import { CautionList } from './caution-list';
import { ComputedValues } from './computed-values';

/** A new record's starting values: the required choices filled, the numbers left for the author. */
const EMPTY: SetupRecord = {
  format: 'tunewright.setup',
  schemaVersion: SETUP_SCHEMA_VERSION,
  vehicle: { class: 'buggy-2wd-stock', chassis: '', drivetrain: '2wd' },
  motor: { poles: 2, sensored: true },
  escSettings: {},
  gearing: {} as SetupRecord['gearing'],
  battery: { chemistry: 'lipo', cells: 2 },
  conditions: { surface: 'clay' },
};

// A decimal comma is read as a point, and thousands commas are dropped ("1,5" → 1.5, "2,200" → 2200).
const toNumber = (v: unknown) => (v === '' || v === null || v === undefined ? undefined : typeof v === 'number' ? v : Number(normaliseNumberText(String(v))));
const toText = (v: unknown) => (v === '' || v === undefined ? undefined : String(v));

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <fieldset className="rounded-lg border border-paper-line bg-paper-card p-4">
      <legend className="px-1 text-sm font-semibold tracking-wide uppercase">{title}</legend>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">{children}</div>
    </fieldset>
  );
}

type Props = {
  /** The record to start from (an existing baseline), or nothing for a blank form. */
  defaultValue?: SetupRecord | null;
  /** Called with a valid, canonical record. */
  onSubmit: (record: SetupRecord) => void | Promise<void>;
  submitLabel?: string;
  /** Extra actions beside the submit button (e.g. the editor's "Remove baseline"). */
  actions?: ReactNode;
  /** The member's registered motors to pick from (a private setup only: a guide's public baseline never names one). */
  motors?: Array<{ id: string; label: string }>;
  /** What a blank form starts from (the guide's class, surface and worked examples' gearing); ignored when there is a defaultValue. */
  start?: SetupStart;
};

/** The facts a new baseline can start from. */
export type SetupStart = { class?: string; surface?: string; gearing?: Partial<SetupRecord['gearing']> };

/** A blank record with the given starting facts filled in. */
export function startingRecord(start?: SetupStart): SetupRecord {
  const record: SetupRecord = JSON.parse(JSON.stringify(EMPTY)) as SetupRecord;
  if (!start) return record;
  const cls = CLASSES.find((c) => c.slug === start.class);
  if (cls) record.vehicle.class = cls.slug;
  // Four-wheel-drive classes start as 4WD; the author can change it.
  if (cls && /4wd|touring|8th/.test(cls.slug)) record.vehicle.drivetrain = '4wd';
  const surface = SURFACES.find((x) => x.slug === start.surface);
  if (surface) record.conditions.surface = surface.slug;
  record.gearing = { ...record.gearing, ...start.gearing };
  return record;
}

/**
 * A form for a whole setup record: ESC settings are offered from the parameter library with
 * their unit and range, and a .json/.csv file can fill the form. Usable on its own (/setups/new)
 * and inside the guide editor.
 */
export function SetupRecordForm(props: Props) {
  const library = useQuery(setupQueries.escSettings());
  if (library.isPending) return <Spinner label="Loading the parameter library…" />;
  if (library.error) return <Notice tone="danger">The parameter library could not be loaded, so ESC settings cannot be checked. Try again in a moment.</Notice>;
  return <RecordForm {...props} definitions={library.data} />;
}

function RecordForm({
  defaultValue,
  onSubmit,
  submitLabel = 'Save setup',
  actions,
  motors,
  definitions,
  start,
}: Props & { definitions: SettingDefinitionRow[] }) {
  const schema = useMemo(() => setupRecordSchema(definitions), [definitions]);
  const escOptions = useMemo(() => definitions.filter((d) => !(d.slug in SLUGS_WITH_OWN_FIELD)), [definitions]);
  const bySlug = useMemo(() => new Map(definitions.map((d) => [d.slug, d])), [definitions]);
  const names = useMemo(() => Object.fromEntries(definitions.map((d) => [d.slug, d.name])), [definitions]);
  // Explicit generics (input, context, output) as zod 4 resolvers need; the record type is the same both ways.
  const form = useForm<SetupRecord, unknown, SetupRecord>({
    resolver: zodResolver(schema) as Resolver<SetupRecord, unknown, SetupRecord>,
    defaultValues: defaultValue ?? startingRecord(start),
    mode: 'onBlur',
  });
  const { register, handleSubmit, formState, reset, setValue, unregister, watch } = form;
  const [slugs, setSlugs] = useState<string[]>(() => Object.keys(defaultValue?.escSettings ?? {}));
  const [adding, setAdding] = useState('');
  const [fileIssues, setFileIssues] = useState<SetupIssue[] | null>(null);
  const [fileSummary, setFileSummary] = useState<{ name: string; changes: FileChange[] } | null>(null);
  const errors = formState.errors as FieldErrors;
  const err = (path: string): string | undefined =>
    (get(errors, path) as { message?: string } | undefined)?.message ?? (get(errors, `${path}.root`) as { message?: string } | undefined)?.message;

  const values = watch();
  const preview = useMemo(() => {
    const parsed = schema.safeParse(JSON.parse(JSON.stringify(values)));
    return parsed.success ? computeSetup(parsed.data) : null;
  }, [schema, values]);

  const addSetting = () => {
    const def = bySlug.get(adding);
    if (!def || slugs.includes(def.slug)) return;
    // The class's typical value when the library names one; otherwise empty for the author to fill.
    const startValue = typicalStart(def, String(values.vehicle?.class ?? ''));
    setValue(`escSettings.${def.slug}`, { value: startValue as number, unit: def.unit });
    setSlugs((s) => [...s, def.slug]);
    setAdding('');
  };
  const removeSetting = (slug: string) => {
    unregister(`escSettings.${slug}`);
    setSlugs((s) => s.filter((x) => x !== slug));
  };

  const handleFile = async (e: ChangeEvent<HTMLInputElement>) => {
    const file = e.target.files?.[0];
    e.target.value = '';
    if (!file) return;
    const kind = /\.csv$/i.test(file.name) ? 'csv' : /\.json$/i.test(file.name) ? 'json' : null;
    if (!kind) return setFileIssues([{ path: 'file.name', message: 'Choose a .json or .csv setup file' }]);
    const result = parseSetupText(await file.text(), kind, definitions);
    if (!result.ok) return setFileIssues(result.issues);
    setFileIssues(null);
    setFileSummary({ name: file.name, changes: fileChanges(values, result.record, names) });
    reset(result.record);
    setSlugs(Object.keys(result.record.escSettings));
  };

  const num = (path: string) => register(path as never, { setValueAs: toNumber });

  return (
    <form
      onSubmit={handleSubmit(async (record) => {
        const plain = JSON.parse(JSON.stringify(record)) as SetupRecord;
        // Naming a registered motor needs schema version 2; a version 1 file read into the form is written as 2.
        if ((plain.motor as { registeredMotorId?: string }).registeredMotorId) plain.schemaVersion = 2;
        return onSubmit(canonicalRecord(plain));
      })}
      className="flex flex-col gap-4"
      noValidate
    >
      <div className="flex flex-wrap items-center gap-3 rounded-lg border border-dashed border-ink/30 p-3 text-sm">
        <label htmlFor="setup-fill-file" className="font-medium">
          Fill from a file
        </label>
        <input id="setup-fill-file" type="file" accept=".json,.csv" onChange={handleFile} className="text-sm" />
        <span className="text-ink-muted">Our .json setup record or .csv layout; nothing is uploaded.</span>
      </div>
      {fileIssues && (
        <Notice tone="danger" title="That file cannot fill the form">
          <ul className="list-disc pl-5">
            {fileIssues.map((i, n) => (
              <li key={n}>
                <code>{i.path}</code> {i.message}
              </li>
            ))}
          </ul>
        </Notice>
      )}

      {fileSummary && (
        <Notice tone="info" title={`What ${fileSummary.name} changed`}>
          {fileSummary.changes.length === 0 ? (
            <p>Nothing: the file holds the same values as the form.</p>
          ) : (
            <>
              <p>
                {fileSummary.changes.length} {fileSummary.changes.length === 1 ? 'field' : 'fields'} changed. Check them, then save.
              </p>
              <ul className="mt-1 list-disc pl-5" data-testid="file-changes">
                {fileSummary.changes.map((c) => (
                  <li key={c.path}>
                    <span className="font-medium">{c.label}</span>: {c.before === null ? 'added' : showValue(c.path, c.before, c.unit)} →{' '}
                    {c.after === null ? 'removed' : showValue(c.path, c.after, c.unit)}
                  </li>
                ))}
              </ul>
            </>
          )}
        </Notice>
      )}

      <Section title="Vehicle">
        <SelectField label="Class" error={err('vehicle.class')} {...register('vehicle.class')}>
          {CLASSES.map((c) => (
            <option key={c.slug} value={c.slug}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <TextField label="Chassis" hint="Free text, e.g. 2WD buggy, mid-motor" error={err('vehicle.chassis')} {...register('vehicle.chassis')} />
        <SelectField label="Drivetrain" error={err('vehicle.drivetrain')} {...register('vehicle.drivetrain')}>
          {DRIVETRAINS.map((d) => (
            <option key={d} value={d}>
              {d.toUpperCase()}
            </option>
          ))}
        </SelectField>
      </Section>

      <Section title="Motor">
        <TextField label="kV (rpm/V)" inputMode="decimal" hint="kV or wind, or both" error={err('motor.kvRpmPerV')} {...num('motor.kvRpmPerV')} />
        <TextField label="Wind (turns)" inputMode="decimal" error={err('motor.windTurns')} {...num('motor.windTurns')} />
        <TextField label="Rotor poles" inputMode="numeric" error={err('motor.poles')} {...num('motor.poles')} />
        <TextField
          label="Endbell timing (°)"
          inputMode="decimal"
          hint="Mechanical degrees on the motor"
          error={err('motor.endbellTimingDeg')}
          {...num('motor.endbellTimingDeg')}
        />
        <label className="flex items-center gap-2 text-sm font-medium">
          <input type="checkbox" {...register('motor.sensored')} /> Sensored
        </label>
        {motors && (
          <SelectField
            label="Registered motor"
            hint={motors.length ? 'One of your motors (kept private)' : 'Register a motor on the Motors page to name it here'}
            error={err('motor.registeredMotorId')}
            {...register('motor.registeredMotorId', { setValueAs: toText })}
          >
            <option value="">Not named</option>
            {motors.map((m) => (
              <option key={m.id} value={m.id}>
                {m.label}
              </option>
            ))}
          </SelectField>
        )}
      </Section>

      <fieldset className="rounded-lg border border-paper-line bg-paper-card p-4">
        <legend className="px-1 text-sm font-semibold tracking-wide uppercase">ESC settings</legend>
        {err('escSettings') && <p className="mb-2 text-sm text-danger">{err('escSettings')}</p>}
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {slugs.map((slug) => {
            const def = bySlug.get(slug);
            const unitShown = def?.unit ? ` (${def.unit === 'deg' ? '°' : def.unit})` : '';
            const choices = settingChoices(slug);
            const typical = def?.typical?.[String(values.vehicle?.class ?? '')];
            const typicalHint = typical ? `Typical for ${classLabel(String(values.vehicle?.class))}: ${typical.text}` : null;
            const error = err(`escSettings.${slug}.value`) ?? err(`escSettings.${slug}.unit`) ?? err(`escSettings.${slug}`);
            return (
              <div key={slug} className="flex items-end gap-2">
                <div className="flex-1">
                  {choices ? (
                    <SelectField label={def?.name ?? slug} hint={typicalHint ?? undefined} error={error} {...num(`escSettings.${slug}.value`)}>
                      <option value="">Choose…</option>
                      {choices.map((label, value) => (
                        <option key={label} value={value}>
                          {label}
                        </option>
                      ))}
                    </SelectField>
                  ) : (
                    <TextField
                      label={`${def?.name ?? slug}${unitShown}`}
                      inputMode="decimal"
                      hint={
                        def
                          ? [typicalHint, `Range ${def.range.min}–${def.range.max}${def.unit ? ` ${def.unit === 'deg' ? '°' : def.unit}` : ''}`]
                              .filter(Boolean)
                              .join('. ')
                          : 'Not in the parameter library'
                      }
                      error={error}
                      {...num(`escSettings.${slug}.value`)}
                    />
                  )}
                  <input type="hidden" {...register(`escSettings.${slug}.unit` as never)} />
                </div>
                <Button type="button" variant="ghost" size="sm" onClick={() => removeSetting(slug)} aria-label={`Remove ${def?.name ?? slug}`}>
                  Remove
                </Button>
              </div>
            );
          })}
        </div>
        <div className="mt-3 flex flex-wrap items-end gap-2">
          <SelectField label="Add a setting" value={adding} onChange={(e) => setAdding(e.target.value)} className="min-w-56">
            <option value="">Choose from the parameter library…</option>
            {escOptions
              .filter((d) => !slugs.includes(d.slug))
              .map((d) => (
                <option key={d.slug} value={d.slug}>
                  {d.name}
                  {d.unit ? ` (${d.unit})` : ''}
                </option>
              ))}
          </SelectField>
          <Button type="button" variant="secondary" onClick={addSetting} disabled={!adding}>
            Add
          </Button>
        </div>
      </fieldset>

      <Section title="Gearing">
        <TextField label="Spur (teeth)" inputMode="numeric" error={err('gearing.spurTeeth')} {...num('gearing.spurTeeth')} />
        <TextField label="Pinion (teeth)" inputMode="numeric" error={err('gearing.pinionTeeth')} {...num('gearing.pinionTeeth')} />
        <TextField
          label="Internal ratio (:1)"
          inputMode="decimal"
          hint="1 for direct drive"
          error={err('gearing.internalRatio')}
          {...num('gearing.internalRatio')}
        />
        <TextField
          label="Tyre diameter (mm)"
          inputMode="decimal"
          hint="Measured on the car"
          error={err('gearing.tyreDiameterMm')}
          {...num('gearing.tyreDiameterMm')}
        />
      </Section>

      <Section title="Battery">
        <SelectField label="Chemistry" error={err('battery.chemistry')} {...register('battery.chemistry')}>
          {packChemistries.map((c) => (
            <option key={c} value={c}>
              {chemistryVoltages[c].label}
            </option>
          ))}
        </SelectField>
        <TextField label="Cells in series (S)" inputMode="numeric" error={err('battery.cells')} {...num('battery.cells')} />
        <TextField label="Capacity (mAh)" inputMode="numeric" error={err('battery.capacityMah')} {...num('battery.capacityMah')} />
      </Section>

      <Section title="Conditions">
        <SelectField label="Surface" error={err('conditions.surface')} {...register('conditions.surface')}>
          {SURFACES.map((s) => (
            <option key={s.slug} value={s.slug}>
              {s.name}
            </option>
          ))}
        </SelectField>
        <TextField label="Layout" error={err('conditions.layout')} {...register('conditions.layout', { setValueAs: toText })} />
        <TextField label="Ambient temperature (°C)" inputMode="decimal" error={err('conditions.ambientTempC')} {...num('conditions.ambientTempC')} />
        <TextField label="Track temperature (°C)" inputMode="decimal" error={err('conditions.trackTempC')} {...num('conditions.trackTempC')} />
      </Section>

      <TextAreaField label="Notes" rows={3} error={err('notes')} {...register('notes', { setValueAs: toText })} />

      {preview ? (
        <section aria-label="Computed from this setup" className="flex flex-col gap-3 rounded-lg border border-paper-line bg-paper-card p-4">
          <h3 className="text-sm font-semibold tracking-wide uppercase">Computed from this setup</h3>
          <ComputedValues computed={preview} dense />
          <CautionList cautions={preview.cautions} />
        </section>
      ) : (
        <p className="text-sm text-ink-muted">Fill in the gearing and battery to see final drive ratio, rollout, speeds, pack voltages and cautions.</p>
      )}
      {Object.keys(errors).length > 0 && formState.isSubmitted && <Notice tone="danger">Some fields need attention; each one says what is wrong.</Notice>}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" pending={formState.isSubmitting}>
          {submitLabel}
        </Button>
        {actions}
      </div>
    </form>
  );
}
