import { useQuery } from '@tanstack/react-query';
import { lazy, Suspense, useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { COMPARED_QUANTITIES, QUANTITY_INFO, type ComparedQuantity } from '@shared/motors/quantities';
import { Button } from '@/components/ui/button';
import { Card, PageHeader, Spinner } from '@/components/ui/card';
import { SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { RequireRole } from '@/components/layout/guards';
import { ApiError } from '@/lib/api-client';
import { motorLinks, motorQueries, useDeleteCheck, useDeleteMotor, useUpdateMotor } from '@/features/motors/api/motors';
import { BenchCautions } from '@/features/motors/components/bench-cautions';
import { CheckForm } from '@/features/motors/components/check-form';
import { ChecksTable } from '@/features/motors/components/checks-table';
import { CompareView } from '@/features/motors/components/compare-view';
import { ToleranceEditor } from '@/features/motors/components/tolerance-editor';

const HistoryChart = lazy(() => import('@/features/motors/components/history-chart'));

function MotorDetail({ id }: { id: string }) {
  const navigate = useNavigate();
  const motor = useQuery(motorQueries.detail(id));
  const checks = useQuery(motorQueries.checks(id));
  const update = useUpdateMotor(id);
  const del = useDeleteCheck(id);
  const delMotor = useDeleteMotor();
  const [quantity, setQuantity] = useState<ComparedQuantity>('measuredKv');
  if (motor.isPending) return <Spinner />;
  if (motor.error)
    return (
      <Notice tone="danger" title={motor.error instanceof ApiError && motor.error.status === 404 ? 'Motor not found' : 'Could not load this motor'}>
        It is not in your register. <Link to="/motors">Your motors</Link>
      </Notice>
    );
  const m = motor.data;
  const list = checks.data ?? [];
  const handleDeleteMotor = async () => {
    if (!window.confirm(`Delete “${m.label}” and all its ${m.checkCount} checks? This cannot be undone.`)) return;
    await delMotor.mutateAsync(m.id);
    toast.success('Motor deleted');
    navigate('/motors');
  };
  return (
    <>
      <PageHeader
        eyebrow="Motor bench"
        title={m.label}
        actions={
          <>
            <a
              href={motorLinks(id).csv}
              download
              className="rounded-md border border-ink/25 bg-paper-card px-4 py-2 font-medium text-ink no-underline hover:bg-paper-deep"
            >
              Checks as CSV
            </a>
            <Link
              to={motorLinks(id).print}
              className="rounded-md border border-ink/25 bg-paper-card px-4 py-2 font-medium text-ink no-underline hover:bg-paper-deep"
            >
              Printable sheet
            </Link>
          </>
        }
      >
        {[
          m.kvRpmPerV ? `${m.kvRpmPerV} rpm/V as labelled` : null,
          m.windTurns ? `${m.windTurns} turns` : null,
          `${m.poles}-pole rotor`,
          m.sensored ? 'sensored' : 'sensorless',
        ]
          .filter(Boolean)
          .join(' · ')}
        {m.rotorNotes && <span className="block text-sm">Rotor: {m.rotorNotes}</span>}
      </PageHeader>
      <div className="flex flex-col gap-10">
        <section aria-labelledby="checks-title">
          <h2 id="checks-title" className="mb-3 text-xl font-semibold">
            Bench checks
          </h2>
          {checks.isPending && <Spinner />}
          {list.length === 0 && !checks.isPending && (
            <p className="text-sm text-ink-muted">No checks yet. The first one becomes this motor&rsquo;s reference.</p>
          )}
          {list.length > 0 && (
            <ChecksTable
              checks={list}
              busy={update.isPending || del.isPending}
              onMakeReference={(checkId) => update.mutate({ referenceCheckId: checkId })}
              onDelete={(checkId) => window.confirm('Delete this check?') && del.mutate(checkId)}
            />
          )}
        </section>
        <section aria-labelledby="add-title" className="grid gap-6 lg:grid-cols-[1.4fr_1fr]">
          <div>
            <h2 id="add-title" className="mb-3 text-xl font-semibold">
              Add a check
            </h2>
            <Card className="p-4">
              <CheckForm motorId={id} poles={m.poles} onAdded={() => toast.success('Check saved')} />
            </Card>
          </div>
          <div className="flex flex-col gap-4">
            <BenchCautions />
            <p className="text-sm text-ink-soft">
              Run every check the same way — same supply voltage, same meter leads, motor at room temperature — or the numbers move for reasons that are not the
              motor. The <Link to="/parameters/bench-no-load-speed">bench entries in the parameter library</Link> say what each reading measures.
            </p>
          </div>
        </section>
        {list.length > 0 && (
          <section aria-labelledby="compare-title">
            <h2 id="compare-title" className="mb-3 text-xl font-semibold">
              Before and after
            </h2>
            <CompareView motorId={id} checks={list} />
          </section>
        )}
        {list.length > 0 && (
          <section aria-labelledby="history-title">
            <h2 id="history-title" className="mb-3 text-xl font-semibold">
              History
            </h2>
            <div className="mb-3 max-w-xs">
              <SelectField label="Quantity" value={quantity} onChange={(e) => setQuantity(e.target.value as ComparedQuantity)}>
                {COMPARED_QUANTITIES.map((q) => (
                  <option key={q} value={q}>
                    {QUANTITY_INFO[q].label}
                  </option>
                ))}
              </SelectField>
            </div>
            <Card className="p-4">
              <Suspense fallback={<Spinner label="Loading the chart…" />}>
                <HistoryChart checks={list} quantity={quantity} />
              </Suspense>
            </Card>
          </section>
        )}
        <section aria-labelledby="tolerances-title">
          <h2 id="tolerances-title" className="mb-1 text-xl font-semibold">
            Tolerances for this motor
          </h2>
          <p className="mb-3 text-sm text-ink-muted">
            How far from the &ldquo;before&rdquo; reading still counts as the same motor. Start from the defaults and tighten them as you learn how repeatable
            your bench is.
          </p>
          <ToleranceEditor key={m.updatedAt} motor={m} />
        </section>
        <section>
          <Button variant="danger" size="sm" onClick={handleDeleteMotor} pending={delMotor.isPending}>
            Delete this motor
          </Button>
        </section>
      </div>
    </>
  );
}

/** One motor: its checks, a new check, before/after comparison, history and tolerances. */
export function MotorPage() {
  const { id = '' } = useParams();
  return <RequireRole role="member">{() => <MotorDetail id={id} />}</RequireRole>;
}
