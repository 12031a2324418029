import { useState, type FormEvent } from 'react';
import { electricalToMechanicalDeg } from '@shared/calc/electrical-degrees';
import { BENCH_READINGS, MAX_REPEATS, QUANTITY_INFO, type BenchReading } from '@shared/motors/quantities';
import { Button } from '@/components/ui/button';
import { TextAreaField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { useAddCheck } from '../api/motors';
import { parseRepeats } from './format';

const HINTS: Record<BenchReading, string> = {
  testVoltageV: 'Required. At the motor leads while it spins.',
  noLoadRpm: 'Required. Nothing attached to the shaft.',
  noLoadCurrentA: 'Current drawn while spinning free.',
  timingDeg: 'As the bench reads it, in electrical degrees.',
  rotorSymmetryPct: 'How evenly the rotor’s poles read.',
  sensorDeviationPct: 'Sensor signal against the back-EMF.',
  phaseResistanceOhm: 'Phase to phase; give the temperature below.',
};

type Values = Record<BenchReading, string> & { testedAt: string; resistanceTempC: string; notes: string };
const empty = (): Values => ({
  ...(Object.fromEntries(BENCH_READINGS.map((q) => [q, ''])) as Record<BenchReading, string>),
  testedAt: '',
  resistanceTempC: '',
  notes: '',
});

/** The error for a reading, whether the server named the single field or one of its repeats. */
function errorFor(fe: Record<string, string>, q: string): string | undefined {
  return fe[q] ?? fe[`readings.${q}`] ?? Object.entries(fe).find(([k]) => k.startsWith(`readings.${q}.`))?.[1];
}

const degFmt = (n: number) => n.toLocaleString('en-GB', { maximumFractionDigits: 2 });

/**
 * The timing field's hint: the bench reads electrical degrees; as soon as a reading is typed, its mechanical
 * equivalent on this motor's rotor (the endbell's degrees) through the shared degrees calculator.
 */
function TimingHint({ text, poles }: { text: string; poles: number }) {
  const parsed = parseRepeats(text);
  const readings = Array.isArray(parsed) ? parsed : [];
  return (
    <>
      <span className="block">{HINTS.timingDeg}</span>
      <output className="mt-0.5 block font-medium text-ink-soft" data-testid="timing-mechanical" aria-live="polite">
        {readings.length > 0
          ? `${readings.map(degFmt).join(', ')}° electrical = ${readings.map((d) => degFmt(electricalToMechanicalDeg(d, poles))).join(', ')}° mechanical (endbell) on this ${poles}-pole rotor`
          : `Mechanical (endbell) degrees = electrical ÷ ${poles / 2} on this ${poles}-pole rotor.`}
      </output>
    </>
  );
}

/** Adds a bench check; each reading takes one value or up to five repeats separated by spaces. */
export function CheckForm({ motorId, poles, onAdded }: { motorId: string; poles: number; onAdded?: () => void }) {
  const add = useAddCheck(motorId);
  const [v, setV] = useState<Values>(empty);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const handleSubmit = async (e: FormEvent) => {
    e.preventDefault();
    setFormError(null);
    const body: Record<string, unknown> = {};
    const readings: Record<string, number[]> = {};
    const local: Record<string, string> = {};
    for (const q of BENCH_READINGS) {
      const parsed = parseRepeats(v[q]);
      if (parsed === 'invalid') local[q] = `${QUANTITY_INFO[q].label}: numbers only, separated by spaces`;
      else if (parsed && parsed.length > MAX_REPEATS) local[q] = `At most ${MAX_REPEATS} repeat readings`;
      else if (parsed?.length === 1) body[q] = parsed[0];
      else if (parsed) readings[q] = parsed;
    }
    if (Object.keys(local).length) return setErrors(local);
    if (Object.keys(readings).length) body.readings = readings;
    if (v.resistanceTempC.trim()) body.resistanceTempC = Number(v.resistanceTempC.replace(',', '.'));
    if (v.testedAt) body.testedAt = new Date(v.testedAt).toISOString();
    if (v.notes.trim()) body.notes = v.notes;
    try {
      await add.mutateAsync(body);
      setErrors({});
      setV(empty());
      onAdded?.();
    } catch (err) {
      const fe = err instanceof ApiError ? err.fieldErrors : {};
      const mapped = Object.fromEntries(
        [...BENCH_READINGS, 'resistanceTempC', 'testedAt', 'notes'].flatMap((k) => (errorFor(fe, k) ? [[k, errorFor(fe, k)!]] : [])),
      );
      setErrors(mapped);
      if (!Object.keys(mapped).length) setFormError(err instanceof Error ? err.message : 'Something went wrong. Try again.');
    }
  };

  return (
    <form onSubmit={handleSubmit} noValidate className="flex flex-col gap-4" aria-label="Add a bench check">
      {formError && <Notice tone="danger">{formError}</Notice>}
      <p className="text-sm text-ink-muted">
        Type repeat readings with spaces between them (up to {MAX_REPEATS}); Tunewright keeps each one and shows their mean and spread.
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        {BENCH_READINGS.map((q) => (
          <TextField
            key={q}
            name={q}
            label={
              q === 'timingDeg'
                ? `${QUANTITY_INFO[q].label}, electrical degrees (${QUANTITY_INFO[q].unit})`
                : `${QUANTITY_INFO[q].label} (${QUANTITY_INFO[q].unit})`
            }
            inputMode="decimal"
            value={v[q]}
            onChange={(e) => setV({ ...v, [q]: e.target.value })}
            error={errors[q]}
            hint={q === 'timingDeg' ? <TimingHint text={v[q]} poles={poles} /> : HINTS[q]}
          />
        ))}
        <TextField
          name="resistanceTempC"
          label="Resistance read at (°C)"
          inputMode="decimal"
          value={v.resistanceTempC}
          onChange={(e) => setV({ ...v, resistanceTempC: e.target.value })}
          error={errors.resistanceTempC}
          hint="Room temperature for a cooled motor; −40 to 200 °C."
        />
        <TextField
          name="testedAt"
          type="datetime-local"
          label="Tested at"
          value={v.testedAt}
          onChange={(e) => setV({ ...v, testedAt: e.target.value })}
          error={errors.testedAt}
          hint="Leave empty for now."
        />
      </div>
      <TextAreaField
        name="notes"
        label="Notes"
        rows={2}
        maxLength={2000}
        value={v.notes}
        onChange={(e) => setV({ ...v, notes: e.target.value })}
        error={errors.notes}
        hint="Before teardown, after new bearings, rotor swapped …"
      />
      <Button type="submit" pending={add.isPending} className="self-start">
        Save check
      </Button>
    </form>
  );
}
