import { useMemo } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type uPlot from 'uplot';
import type { RunListItem } from '@shared/schemas/run';
import { evidenceDiff } from '@shared/runlog/evidence-diff';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { runQueries, useToggleEvidence } from '../api/runs';
import { showFigure } from './figures';
import { UPlotChart } from './uplot-chart';

const KEY_FIGURES: Array<[keyof RunListItem['summary'], string, string, number, number?]> = [
  ['durationS', 'Duration', 's', 0],
  ['peakRpm', 'Peak motor speed', 'rpm', 0],
  ['fullThrottleShare', 'At full throttle', '%', 0, 100],
  ['peakCurrentA', 'Peak current', 'A', 0],
  ['energyMah', 'Charge used (estimate)', 'mAh', 0],
  ['maxMotorTempC', 'Hottest motor', '°C', 1],
  ['minPackV', 'Lowest pack', 'V', 2],
];

function KeyFigures({ run }: { run: RunListItem }) {
  return (
    <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-3">
      {KEY_FIGURES.filter(([k]) => run.summary[k] !== null).map(([k, label, unit, digits, scale]) => (
        <div key={k}>
          <dt className="text-xs text-ink-muted">{label}</dt>
          <dd className="tabular-nums">
            {showFigure(run.summary, k, digits, scale)} {unit}
          </dd>
        </div>
      ))}
    </dl>
  );
}

const DemoMark = ({ run }: { run: RunListItem }) =>
  run.demo ? <span className="ml-2 rounded bg-paper-deep px-1.5 text-xs font-normal">invented demo data</span> : null;

/** In the editor: offer your own runs as evidence on this draft (private until the version is live). */
export function EvidencePicker({ revisionId, editable }: { revisionId: string | null; editable: boolean }) {
  const mine = useQuery(runQueries.list());
  const attached = useQuery({ ...runQueries.evidence(revisionId ?? ''), enabled: !!revisionId });
  const toggle = useToggleEvidence(revisionId ?? '');
  const ids = new Set((attached.data ?? []).map((r) => r.id));
  return (
    <Card className="p-5" role="region" aria-labelledby="evidence-title">
      <h2 id="evidence-title" className="text-lg font-semibold">
        Evidence: logged runs
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        Back the guide with your own run logs. The moderator sees their figures in review; readers see them only once this version is live.
      </p>
      {!revisionId ? (
        <Notice>Save the draft first, then offer runs as evidence.</Notice>
      ) : mine.data && mine.data.length === 0 ? (
        <p className="text-sm">
          You have no runs yet. <Link to="/runs">Upload one</Link>.
        </p>
      ) : (
        <ul className="flex flex-col gap-1" data-testid="evidence-picker">
          {(mine.data ?? []).map((r) => (
            <li key={r.id}>
              <label className="flex items-center gap-2 text-sm">
                <input
                  type="checkbox"
                  disabled={!editable || toggle.isPending}
                  checked={ids.has(r.id)}
                  onChange={(e) => toggle.mutate({ runId: r.id, attach: e.target.checked })}
                />
                {r.title}
                <DemoMark run={r} />
              </label>
            </li>
          ))}
        </ul>
      )}
      {toggle.error && <Notice tone="danger">{toggle.error.message}</Notice>}
    </Card>
  );
}

const CHANGE_LABEL = { kept: 'Kept from the live version', added: 'Added by this proposal', removed: 'Taken off by this proposal' } as const;
const CHANGE_STYLE = { kept: 'bg-paper-deep', added: 'bg-ok-wash text-ok', removed: 'bg-danger-wash text-danger' } as const;

/**
 * In review: the runs the proposal offers against those on the live version (kept, added, taken off), each with
 * its figures; a new draft starts with its base's runs, so a removal here is the author's choice.
 */
export function EvidenceReview({ revisionId, liveRevisionId }: { revisionId: string; liveRevisionId: string | null }) {
  const runs = useQuery(runQueries.evidence(revisionId));
  const live = useQuery({ ...runQueries.evidence(liveRevisionId ?? ''), enabled: !!liveRevisionId });
  const diff = useMemo(
    () => (runs.data && (!liveRevisionId || live.data) ? evidenceDiff(runs.data, liveRevisionId ? live.data! : null) : []),
    [runs.data, live.data, liveRevisionId],
  );
  if (!diff.length) return null;
  const counts = { added: 0, removed: 0, kept: 0 };
  for (const d of diff) counts[d.change]++;
  return (
    <section aria-labelledby="review-evidence" className="mt-8" data-testid="review-evidence">
      <h2 id="review-evidence" className="mb-1 text-xl font-semibold">
        Evidence offered: logged runs
      </h2>
      <p className="mb-3 text-sm text-ink-muted" data-testid="evidence-diff-summary">
        {liveRevisionId
          ? `Against the live version: ${counts.added} added, ${counts.removed} taken off, ${counts.kept} kept.`
          : 'No other live version to compare with: every run is listed as added.'}
      </p>
      <div className="flex flex-col gap-3">
        {diff.map(({ run: r, change }) => (
          <Card key={r.id} className={`p-4 ${change === 'removed' ? 'opacity-80' : ''}`} data-change={change}>
            <h3 className="mb-2 flex flex-wrap items-center gap-2 font-semibold">
              <span className={change === 'removed' ? 'line-through' : ''}>{r.title}</span>
              <span className={`rounded px-1.5 text-xs font-normal ${CHANGE_STYLE[change]}`}>{CHANGE_LABEL[change]}</span>
              <DemoMark run={r} />
            </h3>
            <KeyFigures run={r} />
            {change !== 'removed' &&
              r.summary.cautions.map((c, i) => (
                <Notice key={i} tone={c.level === 'danger' ? 'danger' : 'caution'} className="mt-2">
                  {c.message}
                </Notice>
              ))}
          </Card>
        ))}
      </div>
    </section>
  );
}

function Sparkline({ runId }: { runId: string }) {
  const series = useQuery(runQueries.series(runId, 300));
  const data = useMemo(
    () => (series.data?.channels.motor_rpm ? ([series.data.t, series.data.channels.motor_rpm.max] as uPlot.AlignedData) : null),
    [series.data],
  );
  const options = useMemo(
    () => ({
      height: 70,
      legend: { show: false },
      cursor: { show: false },
      scales: { x: { time: false } },
      axes: [{ show: false }, { show: false }],
      series: [{}, { stroke: '#b8693a', width: 1.25 }],
    }),
    [],
  );
  if (!data) return null;
  return <UPlotChart options={options} data={data} className="mt-2" />;
}

/** On a published guide: the evidence cards (key figures, a small chart of motor speed, a link to the run). */
export function GuideEvidence({ slug }: { slug: string }) {
  const runs = useQuery(runQueries.guideEvidence(slug));
  if (!runs.data?.length) return null;
  return (
    <section id="evidence" aria-labelledby="evidence-heading" className="mt-10" data-testid="guide-evidence">
      <h2 id="evidence-heading" className="mb-3 text-xl font-semibold">
        Backed by logged runs
      </h2>
      <div className="flex flex-col gap-3">
        {runs.data.map((r) => (
          <Card key={r.id} className="p-4">
            <h3 className="mb-2 font-semibold">
              <Link to={`/runs/${r.id}`}>{r.title}</Link>
              <DemoMark run={r} />
            </h3>
            <KeyFigures run={r} />
            <Sparkline runId={r.id} />
          </Card>
        ))}
      </div>
    </section>
  );
}
