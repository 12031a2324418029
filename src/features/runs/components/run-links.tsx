import type { Run } from '@shared/schemas/run';
import { SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useUpdateRun } from '../api/runs';

type Option = { id: string; label: string };

/**
 * The setup a run was on and the registered motor it used, changeable after upload (the owner's own only).
 * Attaching a setup brings the road-speed line and per-cell figures; choosing "None" detaches.
 */
export function RunLinks({ run, setups, motors }: { run: Run; setups: Option[]; motors: Option[] }) {
  const update = useUpdateRun(run.id);
  return (
    <div className="flex flex-col gap-3 rounded-lg border border-paper-line bg-paper-card p-3 text-sm" data-testid="run-links">
      <SelectField
        label="Run on setup"
        value={run.setupId ?? ''}
        disabled={update.isPending}
        onChange={(e) => update.mutate({ setupId: e.target.value || null })}
        hint={
          setups.length
            ? 'With a setup, the charts add the road speed from its gearing and the pack is checked per cell.'
            : 'Upload a setup on the Setups page to attach it here.'
        }
      >
        <option value="">None</option>
        {setups.map((s) => (
          <option key={s.id} value={s.id}>
            {s.label}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Motor used"
        value={run.motorId ?? ''}
        disabled={update.isPending}
        onChange={(e) => update.mutate({ motorId: e.target.value || null })}
      >
        <option value="">Not recorded</option>
        {motors.map((m) => (
          <option key={m.id} value={m.id}>
            {m.label}
          </option>
        ))}
      </SelectField>
      {update.error && <Notice tone="danger">{update.error.message}</Notice>}
    </div>
  );
}
