import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { BENCH_VERDICT_LABELS } from '@shared/calc/bench-verdict';
import type { Check } from '@shared/schemas/motor';
import { SelectField } from '@/components/ui/field';
import { Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { motorQueries } from '../api/motors';
import { BenchCautions } from './bench-cautions';
import { fmt, fmtDate, fmtDelta, VERDICT_TONE } from './format';

const checkLabel = (c: Check) => `${fmtDate(c.testedAt)}${c.isReference ? ' (reference)' : ''}${c.notes ? ` — ${c.notes.slice(0, 40)}` : ''}`;

/** Two checks side by side: what moved against its tolerance, and what that usually means. */
export function CompareView({ motorId, checks }: { motorId: string; checks: Check[] }) {
  // Until the member picks, "before" follows the reference and "after" the newest check (a new check moves it).
  const [picked, setPicked] = useState<{ from?: string; to?: string }>({});
  const has = (id?: string) => !!id && checks.some((c) => c.id === id);
  const from = has(picked.from) ? picked.from! : (checks.find((c) => c.isReference) ?? checks[0]).id;
  const to = has(picked.to) ? picked.to! : checks[checks.length - 1].id;
  const setFrom = (id: string) => setPicked({ ...picked, from: id });
  const setTo = (id: string) => setPicked({ ...picked, to: id });
  const q = useQuery(motorQueries.compare(motorId, from, to));
  return (
    <div className="flex flex-col gap-4">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Before (teardown or reference)" value={from} onChange={(e) => setFrom(e.target.value)}>
          {checks.map((c) => (
            <option key={c.id} value={c.id}>
              {checkLabel(c)}
            </option>
          ))}
        </SelectField>
        <SelectField label="After (rebuild or latest)" value={to} onChange={(e) => setTo(e.target.value)}>
          {checks.map((c) => (
            <option key={c.id} value={c.id}>
              {checkLabel(c)}
            </option>
          ))}
        </SelectField>
      </div>
      {q.isPending && <Spinner />}
      {q.error && <Notice tone="danger">The comparison could not be loaded: {q.error.message}</Notice>}
      {q.data && (
        <>
          {/* On a phone each quantity is a short block, so the verdict never sits off-screen. */}
          <ul
            className="flex flex-col divide-y divide-paper-line rounded-lg border border-paper-line bg-paper-card sm:hidden"
            aria-label="Comparison of two checks"
          >
            {q.data.quantities.map((r) => (
              <li
                key={r.name}
                data-quantity={r.name}
                data-verdict={r.verdict ?? 'none'}
                className={`px-3 py-2 text-sm ${r.verdict === 'clearly_outside' ? 'bg-danger-wash/60' : ''}`}
              >
                <div className="flex items-baseline justify-between gap-2">
                  <span className="font-medium">{r.label}</span>
                  {r.verdict ? (
                    <span className={`rounded-full border px-2 py-0.5 text-xs whitespace-nowrap ${VERDICT_TONE[r.verdict]}`}>
                      {BENCH_VERDICT_LABELS[r.verdict]}
                    </span>
                  ) : (
                    <span className="text-xs text-ink-faint">not in both</span>
                  )}
                </div>
                {r.delta !== null && (
                  <p className="text-ink-soft tabular-nums">
                    {fmt(r.name, r.from)} → {fmt(r.name, r.to)} ({fmtDelta(r.name, r.delta)}, tolerance ± {fmt(r.name, r.tolerance)})
                  </p>
                )}
              </li>
            ))}
          </ul>
          <div className="hidden overflow-x-auto rounded-lg border border-paper-line bg-paper-card sm:block">
            <table className="w-full min-w-[36rem] border-collapse text-sm" aria-label="Comparison of two checks">
              <thead>
                <tr className="border-b border-paper-line text-left text-xs tracking-wide text-ink-muted uppercase">
                  <th scope="col" className="px-3 py-2">
                    Quantity
                  </th>
                  <th scope="col" className="px-3 py-2 text-right">
                    Before
                  </th>
                  <th scope="col" className="px-3 py-2 text-right">
                    After
                  </th>
                  <th scope="col" className="px-3 py-2 text-right">
                    Change
                  </th>
                  <th scope="col" className="px-3 py-2 text-right">
                    Tolerance
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Verdict
                  </th>
                </tr>
              </thead>
              <tbody>
                {q.data.quantities.map((r) => (
                  <tr
                    key={r.name}
                    data-quantity={r.name}
                    data-verdict={r.verdict ?? 'none'}
                    className={`border-b border-paper-line/70 last:border-0 ${r.verdict === 'clearly_outside' ? 'bg-danger-wash/60' : ''}`}
                  >
                    <th scope="row" className="px-3 py-2 text-left font-medium">
                      {r.label}
                    </th>
                    <td className="px-3 py-2 text-right tabular-nums">{fmt(r.name, r.from)}</td>
                    <td className="px-3 py-2 text-right tabular-nums">{fmt(r.name, r.to)}</td>
                    <td className="px-3 py-2 text-right tabular-nums">
                      {fmtDelta(r.name, r.delta)}
                      {r.deltaPct !== null && (
                        <span className="block text-xs text-ink-muted">{`${r.deltaPct >= 0 ? '+' : '−'}${Math.abs(r.deltaPct).toFixed(1)} %`}</span>
                      )}
                    </td>
                    <td className="px-3 py-2 text-right text-ink-soft tabular-nums">{r.tolerance === null ? '—' : `± ${fmt(r.name, r.tolerance)}`}</td>
                    <td className="px-3 py-2">
                      {r.verdict ? (
                        <span className={`inline-block rounded-full border px-2 py-0.5 text-xs whitespace-nowrap ${VERDICT_TONE[r.verdict]}`}>
                          {BENCH_VERDICT_LABELS[r.verdict]}
                        </span>
                      ) : (
                        <span className="text-xs text-ink-faint">not in both</span>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <section aria-labelledby="findings-title">
            <h3 id="findings-title" className="mb-2 font-semibold">
              What moved, and what it usually means
            </h3>
            {q.data.findings.length === 0 ? (
              <Notice tone="ok">Nothing moved beyond its tolerance: by these readings it went back together as the same motor.</Notice>
            ) : (
              <ul className="flex flex-col gap-2 text-sm">
                {q.data.findings.map((f) => (
                  <li
                    key={f.code}
                    data-finding={f.code}
                    className={`rounded-md border px-3 py-2 ${f.level === 'moved' ? 'border-danger-line bg-danger-wash' : f.level === 'watch' ? 'border-caution-line bg-caution-wash' : 'border-ink/20 bg-paper-card'}`}
                  >
                    {f.message}
                  </li>
                ))}
              </ul>
            )}
            <p className="mt-2 text-xs text-ink-muted">
              These are general bench rules of thumb, not a diagnosis. The motor maker&rsquo;s instructions for timing, rotors and sensor boards come first.
            </p>
          </section>
          <BenchCautions />
        </>
      )}
    </div>
  );
}
