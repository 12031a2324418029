import type { Check } from '@shared/schemas/motor';
import { BENCH_READINGS, QUANTITY_INFO } from '@shared/motors/quantities';
import { Button } from '@/components/ui/button';
import { fmt, fmtDate } from './format';

/** Mean of a reading, with its spread when there were repeats. */
function Reading({ check, q }: { check: Check; q: (typeof BENCH_READINGS)[number] }) {
  const r = check.readings[q];
  if (!r) return <span className="text-ink-faint">—</span>;
  return (
    <span className="whitespace-nowrap">
      {fmt(q, r.mean, false)}
      {r.values.length > 1 && (
        <span className="block text-xs text-ink-muted" title={r.values.join(', ')}>
          ±{fmt(q, r.spread / 2, false)} ({r.values.length}×)
        </span>
      )}
    </span>
  );
}

/** Every check of a motor, newest first, the reference marked; scrolls sideways on a phone. */
export function ChecksTable({
  checks,
  onMakeReference,
  onDelete,
  busy,
}: {
  checks: Check[];
  onMakeReference: (id: string) => void;
  onDelete: (id: string) => void;
  busy?: boolean;
}) {
  const rows = [...checks].reverse();
  return (
    <div className="overflow-x-auto rounded-lg border border-paper-line bg-paper-card">
      <table className="w-full min-w-[50rem] border-collapse text-sm">
        <caption className="sr-only">Bench checks, newest first</caption>
        <thead>
          <tr className="border-b border-paper-line text-left text-xs tracking-wide text-ink-muted uppercase">
            <th scope="col" className="px-3 py-2">
              Tested
            </th>
            {BENCH_READINGS.map((q) => (
              <th key={q} scope="col" className="px-3 py-2 text-right">
                {QUANTITY_INFO[q].label} <span className="normal-case">({QUANTITY_INFO[q].unit})</span>
              </th>
            ))}
            <th scope="col" className="px-3 py-2 text-right">
              kV (rpm/V)
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              R at 20 °C (Ω)
            </th>
            <th scope="col" className="px-3 py-2">
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((c) => (
            <tr key={c.id} className="border-b border-paper-line/70 align-top last:border-0" data-check-id={c.id}>
              <th scope="row" className="px-3 py-2 text-left font-normal">
                <span className="whitespace-nowrap">{fmtDate(c.testedAt)}</span>
                {c.isReference && <span className="ml-2 rounded-full border border-copper/40 bg-copper-wash px-2 text-xs text-copper-dark">reference</span>}
                {c.notes && <span className="block max-w-[16rem] text-xs text-ink-muted">{c.notes}</span>}
              </th>
              {BENCH_READINGS.map((q) => (
                <td key={q} className="px-3 py-2 text-right tabular-nums">
                  <Reading check={c} q={q} />
                </td>
              ))}
              <td className="px-3 py-2 text-right font-medium tabular-nums">{fmt('measuredKv', c.computed.measuredKv, false)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{fmt('resistanceAt20COhm', c.computed.resistanceAt20COhm, false)}</td>
              <td className="flex flex-col items-end px-3 py-2 whitespace-nowrap">
                {!c.isReference && (
                  <Button size="sm" variant="ghost" disabled={busy} onClick={() => onMakeReference(c.id)}>
                    Make reference
                  </Button>
                )}
                <Button size="sm" variant="ghost" disabled={busy} onClick={() => onDelete(c.id)} aria-label={`Delete the check of ${fmtDate(c.testedAt)}`}>
                  Delete
                </Button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
