import type { RunCompare } from '@shared/schemas/run';
import { useUnits } from '@/lib/preferences';
import { FIGURE_ROWS, figureUnit, figureValue } from './figures';

const show = (v: number | null, digits: number, scale = 1, signed = false) =>
  v === null ? '–' : `${signed && v > 0 ? '+' : ''}${(v * scale).toLocaleString('en-GB', { maximumFractionDigits: digits })}`;

/** Both runs' figures side by side with b − a, and the settings that differ between their setups. */
export function CompareFigures({ compare }: { compare: RunCompare }) {
  const units = useUnits();
  return (
    <div className="flex flex-col gap-6">
      <table className="w-full text-sm tabular-nums" data-testid="compare-figures">
        <thead>
          <tr className="text-left text-ink-muted">
            <th className="py-1 pr-2 font-medium">Figure</th>
            <th className="py-1 pr-2 text-right font-medium">A: {compare.a.title}</th>
            <th className="py-1 pr-2 text-right font-medium">B: {compare.b.title}</th>
            <th className="py-1 text-right font-medium">B − A</th>
          </tr>
        </thead>
        <tbody>
          {compare.differences.map((d) => {
            const row = FIGURE_ROWS.find((r) => r.key === d.key);
            if (!row || (d.a === null && d.b === null)) return null;
            return (
              <tr key={d.key} className="border-t border-ink/10">
                <th scope="row" className="py-1.5 pr-2 text-left font-normal">
                  {row.label} <span className="text-xs text-ink-muted">({figureUnit(row, units)})</span>
                </th>
                <td className="py-1.5 pr-2 text-right">{show(figureValue(row, d.a, units), row.digits, row.scale)}</td>
                <td className="py-1.5 pr-2 text-right">{show(figureValue(row, d.b, units), row.digits, row.scale)}</td>
                <td className="py-1.5 text-right font-medium">{show(figureValue(row, d.delta, units, true), row.digits, row.scale, true)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <section aria-labelledby="settings-title">
        <h3 id="settings-title" className="mb-2 text-lg font-semibold">
          Settings that differ
        </h3>
        {compare.settingsNote && <p className="text-sm text-ink-muted">{compare.settingsNote}</p>}
        {compare.settings.length > 0 && (
          <table className="w-full text-sm" data-testid="compare-settings">
            <tbody>
              {compare.settings.map((s) => (
                <tr key={s.path} className="border-t border-ink/10">
                  <th scope="row" className="py-1.5 pr-2 text-left font-normal">
                    {s.label}
                  </th>
                  <td className="py-1.5 pr-2 text-right">
                    {String(s.a ?? '–')} {s.unit}
                  </td>
                  <td className="py-1.5 text-right">
                    {String(s.b ?? '–')} {s.unit}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
