import { useState, type FormEvent } from 'react';
import type { Motor } from '@shared/schemas/motor';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { useCreateMotor } from '../api/motors';

const POLES = [2, 4, 6, 8, 10, 12, 14];

/** Registers a motor: the member's own label, kV and/or wind, poles, sensored, rotor notes. */
export function MotorForm({ onCreated }: { onCreated: (m: Motor) => void }) {
  const create = useCreateMotor();
  const [v, setV] = useState({ label: '', kv: '', wind: '', poles: '2', sensored: true, rotorNotes: '' });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV({ ...v, [k]: e.target.value });

  const handleSubmit = async (e: FormEvent) => {
    e.preventDefault();
    setErrors({});
    setFormError(null);
    const num = (s: string) => (s.trim() === '' ? undefined : Number(s.replace(',', '.')));
    try {
      const m = await create.mutateAsync({
        label: v.label,
        kvRpmPerV: num(v.kv),
        windTurns: num(v.wind),
        poles: Number(v.poles),
        sensored: v.sensored,
        rotorNotes: v.rotorNotes || undefined,
      });
      setV({ label: '', kv: '', wind: '', poles: '2', sensored: true, rotorNotes: '' });
      onCreated(m);
    } catch (err) {
      const fe = err instanceof ApiError ? err.fieldErrors : {};
      setErrors(fe);
      if (!Object.keys(fe).length) setFormError(err instanceof Error ? err.message : 'Something went wrong. Try again.');
    }
  };

  return (
    <form onSubmit={handleSubmit} noValidate className="flex flex-col gap-4">
      {formError && <Notice tone="danger">{formError}</Notice>}
      <TextField
        label="Your label"
        value={v.label}
        onChange={set('label')}
        error={errors.label}
        hint="Anything that tells your motors apart: “Blue can 17.5”, “Spare mod”."
        required
        maxLength={80}
      />
      <div className="grid grid-cols-2 gap-3">
        <TextField label="kV (rpm/V)" inputMode="decimal" value={v.kv} onChange={set('kv')} error={errors.kvRpmPerV} hint="As labelled, if known" />
        <TextField label="Wind (turns)" inputMode="decimal" value={v.wind} onChange={set('wind')} error={errors.windTurns} hint="e.g. 17.5" />
      </div>
      <div className="grid grid-cols-2 items-end gap-3">
        <SelectField label="Rotor poles" value={v.poles} onChange={set('poles')} error={errors.poles}>
          {POLES.map((p) => (
            <option key={p} value={p}>
              {p}
            </option>
          ))}
        </SelectField>
        <label className="flex items-center gap-2 pb-2 text-sm font-medium">
          <input type="checkbox" checked={v.sensored} onChange={(e) => setV({ ...v, sensored: e.target.checked })} className="h-4 w-4 accent-copper" />
          Sensored
        </label>
      </div>
      <TextAreaField
        label="Rotor notes"
        value={v.rotorNotes}
        onChange={set('rotorNotes')}
        error={errors.rotorNotes}
        rows={2}
        maxLength={500}
        hint="Rotor size or grade, shims — whatever you would want to know after a rebuild."
      />
      <Button type="submit" pending={create.isPending} className="self-start">
        Register motor
      </Button>
    </form>
  );
}
