import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { BENCH_READINGS, QUANTITY_INFO } from '@shared/motors/quantities';
import { Spinner } from '@/components/ui/card';
import { motorLinks, motorQueries } from '../api/motors';
import { fmt, fmtDate } from './format';

/** A motor's bench record on paper: details and every check, black on white, landscape A4. */
export function MotorPrintSheet({ id }: { id: string }) {
  const motor = useQuery(motorQueries.detail(id));
  const checks = useQuery(motorQueries.checks(id));
  if (motor.isPending || checks.isPending) return <Spinner label="Loading the bench sheet…" />;
  if (motor.error || checks.error)
    return (
      <div className="mx-auto max-w-xl p-8">
        <h1 className="font-serif text-2xl font-bold">No bench sheet</h1>
        <p className="mt-2">This motor is not in your register, or you are signed out.</p>
        <Link to="/motors">Your motors</Link>
      </div>
    );
  const m = motor.data;
  return (
    <div className="print-sheet mx-auto max-w-[297mm] bg-white p-6 text-black print:max-w-none print:p-0">
      <div className="no-print mb-6 flex flex-wrap items-center gap-3 border-b border-paper-line pb-4">
        <Link to={`/motors/${id}`}>← Back to the motor</Link>
        <button type="button" onClick={() => window.print()} className="ml-auto rounded-md bg-copper px-4 py-2 font-medium text-white hover:bg-copper-dark">
          Print
        </button>
        <a href={motorLinks(id).csv} download>
          CSV
        </a>
      </div>
      <header className="mb-4 border-b-2 border-black pb-2">
        <p className="text-xs tracking-[0.14em] uppercase">Tunewright bench sheet</p>
        <h1 className="font-serif text-2xl leading-tight font-bold">{m.label}</h1>
        <p className="text-sm">
          {[m.kvRpmPerV ? `${m.kvRpmPerV} rpm/V` : null, m.windTurns ? `${m.windTurns} turns` : null, `${m.poles}-pole`, m.sensored ? 'sensored' : 'sensorless']
            .filter(Boolean)
            .join(' · ')}
          {m.rotorNotes && ` · ${m.rotorNotes}`}
        </p>
      </header>
      <table className="w-full border-collapse text-xs">
        <thead>
          <tr>
            <th className="border border-black px-1 py-1 text-left">Tested</th>
            {BENCH_READINGS.map((q) => (
              <th key={q} className="border border-black px-1 py-1 text-right">
                {QUANTITY_INFO[q].label} ({QUANTITY_INFO[q].unit})
              </th>
            ))}
            <th className="border border-black px-1 py-1 text-right">kV (rpm/V)</th>
            <th className="border border-black px-1 py-1 text-right">R at 20 °C (Ω)</th>
            <th className="border border-black px-1 py-1 text-left">Notes</th>
          </tr>
        </thead>
        <tbody>
          {checks.data.map((c) => (
            <tr key={c.id}>
              <td className="border border-black px-1 py-1">
                {fmtDate(c.testedAt)}
                {c.isReference ? ' · reference' : ''}
              </td>
              {BENCH_READINGS.map((q) => {
                const r = c.readings[q];
                return (
                  <td key={q} className="border border-black px-1 py-1 text-right tabular-nums">
                    {r ? fmt(q, r.mean, false) : ''}
                    {r && r.values.length > 1 ? ` (spread ${fmt(q, r.spread, false)})` : ''}
                  </td>
                );
              })}
              <td className="border border-black px-1 py-1 text-right tabular-nums">{fmt('measuredKv', c.computed.measuredKv, false)}</td>
              <td className="border border-black px-1 py-1 text-right tabular-nums">{fmt('resistanceAt20COhm', c.computed.resistanceAt20COhm, false)}</td>
              <td className="border border-black px-1 py-1">{c.notes}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-4 text-xs">
        Bench checks spin the motor without load: keep the pinion covered and fingers clear, let a hot motor cool before handling it, and follow the motor
        maker&rsquo;s instructions.
      </p>
    </div>
  );
}
