import type { CalcWarning } from '@shared/calc/types';
import { Notice } from '@/components/ui/notice';

type Caution = CalcWarning & { side?: 'a' | 'b' };

const TITLES: Record<string, string> = {
  'cutoff-below-window': 'Cutoff below the safe window',
  'cutoff-above-full': 'Cutoff at or above a full cell',
  'high-timing': 'High total timing: heat',
  'heat-timing-and-gearing': 'More timing on taller gearing: heat',
  'heat-pinion-up': 'Bigger pinion on a setup that runs hot',
  'tall-gearing': 'Tall gearing: heat',
  'high-rpm': 'Motor speed beyond many ratings',
  'high-speed': 'High speed',
  'zero-timing-class': 'Class rule: zero timing',
};

/**
 * Danger and caution notices at the point of use; the general care notes (charging, spinning
 * parts, estimates) are listed below them in a plainer box.
 */
export function CautionList({ cautions, sideLabels }: { cautions: Caution[]; sideLabels?: { a: string; b: string } }) {
  const serious = cautions.filter((c) => c.level !== 'info');
  const notes = cautions.filter((c) => c.level === 'info');
  if (!cautions.length) return null;
  return (
    <div className="flex flex-col gap-3" data-testid="cautions">
      {serious.map((c, i) => (
        <Notice
          key={`${c.code}-${c.side ?? ''}-${i}`}
          tone={c.level === 'danger' ? 'danger' : 'caution'}
          title={`${TITLES[c.code] ?? 'Check this'}${c.side && sideLabels ? ` — ${sideLabels[c.side]}` : ''}`}
        >
          <p>{c.message}</p>
        </Notice>
      ))}
      {notes.length > 0 && (
        <Notice tone="info" title="Before you run it">
          <ul className="list-disc space-y-1 pl-5">
            {notes.map((c, i) => (
              <li key={`${c.code}-${i}`}>{c.message}</li>
            ))}
          </ul>
        </Notice>
      )}
    </div>
  );
}
