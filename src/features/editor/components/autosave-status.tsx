import { describeStatus, type SaveStatus } from '../lib/autosave';

const dot: Record<SaveStatus['kind'], string> = {
  idle: 'bg-ink-faint',
  pending: 'bg-caution',
  saving: 'bg-caution animate-pulse',
  saved: 'bg-ok',
  offline: 'bg-danger',
  local: 'bg-caution',
  error: 'bg-danger',
};

/** The draft's save state, announced politely to screen readers. */
export function AutosaveStatus({ status }: { status: SaveStatus }) {
  return (
    <p role="status" aria-live="polite" className="inline-flex items-center gap-2 text-sm text-ink-soft" data-testid="autosave-status" data-state={status.kind}>
      <span className={`h-2.5 w-2.5 rounded-full ${dot[status.kind]}`} aria-hidden />
      {describeStatus(status)}
    </p>
  );
}
