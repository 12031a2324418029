import { useMemo } from 'react';
import { useQuery } from '@tanstack/react-query';
import { finalDriveRatio, roadSpeedKmh } from '@shared/calc/gearing';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Card, PageHeader, Spinner } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useCurrentUser } from '@/features/auth/api/auth';
import { runQueries, useDeleteRun } from '@/features/runs/api/runs';
import { FiguresTable } from '@/features/runs/components/figures-table';
import { RunCharts } from '@/features/runs/components/run-charts';
import { RunLinks } from '@/features/runs/components/run-links';
import { RunsList } from '@/features/runs/components/runs-list';
import { motorQueries } from '@/features/motors/api/motors';
import { UploadPanel } from '@/features/runs/components/upload-panel';
import { setupQueries } from '@/features/setups/api/setups';
import { ApiError } from '@/lib/api-client';

/** The member's run logs and the upload. */
export function RunsPage() {
  const me = useCurrentUser();
  const runs = useQuery({ ...runQueries.list(), enabled: !!me.data });
  const library = useQuery({ ...setupQueries.library(), enabled: !!me.data });
  if (me.isPending) return <Spinner />;
  if (!me.data)
    return (
      <Card className="p-4 text-sm">
        <Link to="/sign-in?next=%2Fruns">Sign in</Link> to upload your run logs. Runs are private to your account.
      </Card>
    );
  const setups = (library.data?.uploads ?? []).map((u) => ({ id: u.id, label: u.originalName }));
  return (
    <>
      <PageHeader
        eyebrow="Your notebook"
        title="Run logs"
        actions={
          <Link to="/runs/compare" className="rounded-md border border-ink/25 bg-paper-card px-4 py-2 font-medium text-ink no-underline hover:bg-paper-deep">
            Compare two runs
          </Link>
        }
      >
        See what a setting change did to the car: throttle, motor speed, temperatures, current and pack voltage from your controller&apos;s data logging, with
        the figures worked out from every sample.
      </PageHeader>
      <div className="grid gap-8 lg:grid-cols-[1.3fr_1fr]">
        <section aria-labelledby="upload-title">
          <h2 id="upload-title" className="mb-3 text-xl font-semibold">
            Upload a run
          </h2>
          <Card className="p-4">
            <UploadPanel setups={setups} />
          </Card>
        </section>
        <section aria-labelledby="list-title">
          <h2 id="list-title" className="mb-3 text-xl font-semibold">
            Your runs
          </h2>
          {runs.isPending && <Spinner />}
          {runs.error && <Notice tone="danger">Your runs could not be loaded. Try again in a moment.</Notice>}
          {runs.data && <RunsList runs={runs.data} />}
        </section>
      </div>
    </>
  );
}

/** One run: figures, notes, stacked charts with a shared cursor. */
export function RunPage() {
  const { id = '' } = useParams();
  const run = useQuery(runQueries.detail(id));
  const series = useQuery(runQueries.series(id, 1500));
  const remove = useDeleteRun();
  const navigate = useNavigate();
  const own = !!run.data?.isOwn;
  const library = useQuery({ ...setupQueries.library(), enabled: own });
  const motors = useQuery({ ...motorQueries.list(), enabled: own });
  const gearing = run.data?.gearing;
  // Road speed through the shared gearing calculators, only when the run is attached to a setup (its gearing).
  const toKmh = useMemo(
    () =>
      gearing
        ? (rpm: number) => roadSpeedKmh(rpm, gearing.tyreDiameterMm, finalDriveRatio(gearing.spurTeeth, gearing.pinionTeeth, gearing.internalRatio))
        : null,
    [gearing],
  );
  if (run.isPending) return <Spinner />;
  if (run.error)
    return (
      <Notice tone="danger">
        {run.error instanceof ApiError && run.error.status === 404 ? 'That run does not exist, or it is private.' : 'The run could not be loaded.'}
      </Notice>
    );
  const r = run.data;
  return (
    <>
      <PageHeader
        eyebrow={r.demo ? 'Run log · invented demo data' : 'Run log'}
        title={r.title}
        actions={
          r.isOwn && (
            <>
              <Link
                to={`/runs/compare?a=${r.id}`}
                className="rounded-md border border-ink/25 bg-paper-card px-4 py-2 font-medium text-ink no-underline hover:bg-paper-deep"
              >
                Compare…
              </Link>
              <Button
                variant="danger"
                pending={remove.isPending}
                onClick={async () => {
                  if (!window.confirm('Delete this run for good?')) return;
                  await remove.mutateAsync(r.id);
                  navigate('/runs');
                }}
              >
                Delete
              </Button>
            </>
          )
        }
      >
        {r.setupLabel ? `Run on setup ${r.setupLabel}. ` : ''}
        {r.motorLabel ? `Motor: ${r.motorLabel}. ` : ''}
        {r.summary.sampleCount.toLocaleString('en-GB')} samples from {r.originalName}.
        {r.demo && ' Made by Tunewright’s run simulator for the demo: not a real car.'}
      </PageHeader>
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <section aria-label="Charts" className="min-w-0">
          {series.isPending && <Spinner label="Loading the charts…" />}
          {series.data && <RunCharts runs={[{ label: r.title, series: series.data }]} toKmh={toKmh} />}
        </section>
        <section aria-labelledby="figures-title" className="flex flex-col gap-4">
          {r.isOwn && (
            <RunLinks
              run={r}
              setups={(library.data?.uploads ?? []).map((u) => ({ id: u.id, label: u.originalName }))}
              motors={(motors.data ?? []).map((m) => ({ id: m.id, label: m.label }))}
            />
          )}
          <h2 id="figures-title" className="text-xl font-semibold">
            Figures
          </h2>
          <FiguresTable summary={r.summary} />
          {r.importNotes.length > 0 && (
            <Notice tone="info" title="Data quality and changes made on import">
              <ul className="list-disc pl-5">
                {r.importNotes.map((n, i) => (
                  <li key={i}>{n.message}</li>
                ))}
              </ul>
            </Notice>
          )}
        </section>
      </div>
    </>
  );
}
