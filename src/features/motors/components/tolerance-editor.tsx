import { useState } from 'react';
import { COMPARED_QUANTITIES, QUANTITY_INFO, type ComparedQuantity, type Tolerance } from '@shared/motors/quantities';
import type { Motor } from '@shared/schemas/motor';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { useUpdateMotor } from '../api/motors';

/** Per-motor tolerances: starts from the defaults, saves only what the member changed. */
export function ToleranceEditor({ motor }: { motor: Motor }) {
  const update = useUpdateMotor(motor.id);
  const current = (q: ComparedQuantity): Tolerance => (motor.tolerances[q] as Tolerance | undefined) ?? QUANTITY_INFO[q].tolerance;
  const [draft, setDraft] = useState<Record<string, { kind: Tolerance['kind']; value: string }>>(() =>
    Object.fromEntries(COMPARED_QUANTITIES.map((q) => [q, { kind: current(q).kind, value: String(current(q).value) }])),
  );
  const [message, setMessage] = useState<{ tone: 'ok' | 'danger'; text: string } | null>(null);
  const handleSave = async () => {
    const tolerances = Object.fromEntries(COMPARED_QUANTITIES.map((q) => [q, { kind: draft[q].kind, value: Number(draft[q].value.replace(',', '.')) }]));
    try {
      await update.mutateAsync({ tolerances });
      setMessage({ tone: 'ok', text: 'Tolerances saved for this motor.' });
    } catch (err) {
      setMessage({
        tone: 'danger',
        text:
          err instanceof ApiError
            ? Object.entries(err.fieldErrors)
                .map(([k, m]) => `${k.replace('tolerances.', '')}: ${m}`)
                .join('; ') || err.message
            : 'Could not save.',
      });
    }
  };
  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-2 sm:grid-cols-2">
        {COMPARED_QUANTITIES.map((q) => (
          <div key={q} className="flex items-center gap-2 text-sm">
            <span className="min-w-0 flex-1">{QUANTITY_INFO[q].label}</span>
            <span aria-hidden>±</span>
            <input
              aria-label={`${QUANTITY_INFO[q].label} tolerance`}
              inputMode="decimal"
              className="w-20 rounded-md border border-ink/25 bg-white/80 px-2 py-1 text-right"
              value={draft[q].value}
              onChange={(e) => setDraft({ ...draft, [q]: { ...draft[q], value: e.target.value } })}
            />
            <select
              aria-label={`${QUANTITY_INFO[q].label} tolerance unit`}
              className="rounded-md border border-ink/25 bg-white/80 px-1 py-1"
              value={draft[q].kind}
              onChange={(e) => setDraft({ ...draft, [q]: { ...draft[q], kind: e.target.value as Tolerance['kind'] } })}
            >
              <option value="pct">% of before</option>
              <option value="abs">{QUANTITY_INFO[q].unit}</option>
            </select>
          </div>
        ))}
      </div>
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      <Button variant="secondary" size="sm" className="self-start" onClick={handleSave} pending={update.isPending}>
        Save tolerances
      </Button>
    </div>
  );
}
