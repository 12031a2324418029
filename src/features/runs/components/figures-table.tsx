import type { RunSummary } from '@shared/schemas/run';
import { Notice } from '@/components/ui/notice';
import { useUnits } from '@/lib/preferences';
import { FIGURE_ROWS, figureUnit, showFigure } from './figures';

const BAND_WORDS = { cool: 'cool', warm: 'warm', hot: 'hot', 'too-hot': 'too hot' } as const;

/** The run's figures with their notes, bands and the usual cautions. */
export function FiguresTable({ summary }: { summary: RunSummary }) {
  const units = useUnits();
  const band = (key: keyof RunSummary) => (key === 'maxMotorTempC' ? summary.motorBand : key === 'maxEscTempC' ? summary.escBand : null);
  return (
    <div className="flex flex-col gap-3">
      {summary.cautions.map((c, i) => (
        <Notice key={i} tone={c.level === 'danger' ? 'danger' : 'caution'}>
          {c.message}
        </Notice>
      ))}
      <table className="w-full text-sm" data-testid="run-figures">
        <tbody>
          {FIGURE_ROWS.filter((r) => summary[r.key] !== null).map((r) => (
            <tr key={r.key} className="border-b border-ink/10 align-top">
              <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                {r.label}
                {r.note && <span className="block text-xs text-ink-muted">{r.note}</span>}
              </th>
              <td className="py-1.5 text-right tabular-nums whitespace-nowrap">
                {showFigure(summary, r.key, r.digits, r.scale, units)} {figureUnit(r, units)}
                {band(r.key) && (
                  <span className={`ml-2 rounded px-1.5 text-xs ${band(r.key) === 'hot' || band(r.key) === 'too-hot' ? 'bg-danger-wash' : 'bg-paper-deep'}`}>
                    {BAND_WORDS[band(r.key)!]}
                  </span>
                )}
              </td>
            </tr>
          ))}
          {summary.cutoffWindowV && (
            <tr className="border-b border-ink/10">
              <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                Usual cutoff window per cell
              </th>
              <td className="py-1.5 text-right tabular-nums">
                {summary.cutoffWindowV.min}–{summary.cutoffWindowV.max} V
              </td>
            </tr>
          )}
        </tbody>
      </table>
      <p className="text-xs text-ink-muted">
        Figures come from every logged sample, not from the chart. Temperature bands are early warnings, not limits: your motor, controller and pack
        makers&apos; instructions and your track&apos;s and sanctioning body&apos;s rules come first.
      </p>
    </div>
  );
}
