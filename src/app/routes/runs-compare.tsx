import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { useSearchParams } from 'react-router-dom';
import { Card, PageHeader, Spinner } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { RunCompare } from '@shared/schemas/run';
import { runQueries } from '@/features/runs/api/runs';
import { CompareFigures } from '@/features/runs/components/compare-figures';
import { RunCharts } from '@/features/runs/components/run-charts';

/** How the offset was found, in words (the method is the server's; see alignRuns). */
function alignmentMethod(al: RunCompare['alignment']): string {
  if (al.method === 'cross-correlation')
    return `matched ${al.channel === 'motor_rpm' ? 'motor speed' : 'throttle'} traces by cross-correlation, r = ${(al.correlation ?? 0).toFixed(2)}`;
  if (al.method === 'full-throttle') return 'first sustained full throttle: the throttle traces did not match well enough';
  return 'run starts: no trace to match and one run never held full throttle';
}

/** "Did my change help?": two runs overlaid on one time axis, lined up by matching their throttle traces. */
export function RunsComparePage() {
  const [params, setParams] = useSearchParams();
  const a = params.get('a') ?? '';
  const b = params.get('b') ?? '';
  const list = useQuery(runQueries.list());
  const ready = !!a && !!b && a !== b;
  const compare = useQuery({ ...runQueries.compare(a, b), enabled: ready });
  const seriesA = useQuery({ ...runQueries.series(a, 1200), enabled: ready });
  const seriesB = useQuery({ ...runQueries.series(b, 1200), enabled: ready });
  const [nudge, setNudge] = useState(0);
  const offset = (compare.data?.alignment.offsetS ?? 0) + nudge;
  const runs = useMemo(
    () =>
      seriesA.data && seriesB.data && compare.data
        ? [
            { label: 'A', series: seriesA.data },
            { label: 'B', series: seriesB.data, offsetS: offset },
          ]
        : null,
    [seriesA.data, seriesB.data, compare.data, offset],
  );
  const pick = (key: 'a' | 'b', value: string) => {
    const next = new URLSearchParams(params);
    next.set(key, value);
    setParams(next, { replace: true });
    setNudge(0);
  };

  return (
    <>
      <PageHeader eyebrow="Run logs" title="Compare two runs">
        Pick the run before a change (A) and the one after it (B). B is shifted so the two throttle traces line up best (cross-correlation), or on their first
        sustained full throttle when the traces do not match; nudge the offset if another moment lines up better.
      </PageHeader>
      <Card className="mb-6 grid gap-3 p-4 sm:grid-cols-2">
        {(['a', 'b'] as const).map((key) => (
          <label key={key} className="flex flex-col gap-1 text-sm font-medium">
            Run {key.toUpperCase()}
            <select
              className="rounded-md border border-ink/25 bg-white px-2 py-1.5 font-normal"
              value={key === 'a' ? a : b}
              onChange={(e) => pick(key, e.target.value)}
            >
              <option value="">— choose a run —</option>
              {(list.data ?? []).map((r) => (
                <option key={r.id} value={r.id}>
                  {r.title}
                </option>
              ))}
            </select>
          </label>
        ))}
      </Card>
      {a && a === b && <Notice tone="caution">Choose two different runs.</Notice>}
      {compare.error && <Notice tone="danger">These runs could not be compared. Check that both are yours.</Notice>}
      {ready && (compare.isPending || !runs) && !compare.error && <Spinner />}
      {compare.data && runs && (
        <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
          <section aria-label="Overlaid charts" className="min-w-0">
            <div className="mb-2 flex flex-wrap items-center gap-2 text-sm" data-testid="alignment">
              <span>
                B shifted by <strong className="tabular-nums">{offset.toFixed(2)} s</strong> ({alignmentMethod(compare.data.alignment)}
                {nudge !== 0 && `, nudged ${nudge > 0 ? '+' : '−'}${Math.abs(nudge).toFixed(1)} s`})
              </span>
              {[-1, -0.1, 0.1, 1].map((d) => (
                <Button key={d} size="sm" variant="secondary" type="button" onClick={() => setNudge((n) => Math.round((n + d) * 100) / 100)}>
                  {d > 0 ? '+' : '−'}
                  {Math.abs(d)} s
                </Button>
              ))}
            </div>
            <RunCharts runs={runs} />
          </section>
          <section aria-label="Figures">
            <CompareFigures compare={compare.data} />
          </section>
        </div>
      )}
    </>
  );
}
