import { Link } from 'react-router-dom';
import type { RunListItem } from '@shared/schemas/run';
import { showFigure } from './figures';

/** The member's runs, newest first, with a few key figures. */
export function RunsList({ runs }: { runs: RunListItem[] }) {
  if (!runs.length) return <p className="text-sm text-ink-muted">No runs yet. Upload a log from your controller&apos;s data logging to see it here.</p>;
  return (
    <ul className="flex flex-col divide-y divide-ink/10" data-testid="runs-list">
      {runs.map((r) => (
        <li key={r.id} className="py-2">
          <Link to={`/runs/${r.id}`} className="font-medium">
            {r.title}
          </Link>
          {r.demo && <span className="ml-2 rounded bg-paper-deep px-1.5 text-xs">invented demo data</span>}
          <span className="block text-xs text-ink-muted tabular-nums">
            {showFigure(r.summary, 'durationS', 0)} s · peak {showFigure(r.summary, 'peakRpm', 0)} rpm · {showFigure(r.summary, 'energyMah', 0)} mAh (estimate)
            {r.setupLabel ? ` · ${r.setupLabel}` : ''}
          </span>
        </li>
      ))}
    </ul>
  );
}
