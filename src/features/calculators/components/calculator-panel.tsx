import { lazy, Suspense, type ReactNode } from 'react';
import { getCalculator, isCalculatorName } from '@shared/calc/registry';
import type { CalcWarning } from '@shared/calc/types';
import { Notice } from '@/components/ui/notice';
import { useUnits } from '@/lib/preferences';
import type { CalcValues } from '../hooks/use-calculation';
import { useCalculation } from '../hooks/use-calculation';
import { CalculatorForm } from './calculator-form';
import { CalcErrorBoundary } from './calc-error-boundary';
import { hasChart, resultLines } from './result-format';

// recharts is the heaviest thing on a reading page: fetch it only when a chart is on screen.
const CalcChart = lazy(() => import('./calc-chart'));

const TONES = { danger: 'danger', caution: 'caution', info: 'info' } as const;
const TITLES = { danger: 'Danger', caution: 'Caution', info: 'Note' } as const;
const ORDER = { danger: 0, caution: 1, info: 2 } as const;

function Warnings({ warnings }: { warnings: CalcWarning[] }) {
  if (warnings.length === 0) return null;
  const sorted = [...warnings].sort((a, b) => ORDER[a.level] - ORDER[b.level]);
  return (
    <div className="flex flex-col gap-2" aria-label="Cautions for these numbers">
      {sorted.map((w) => (
        <Notice key={w.code} tone={TONES[w.level]} title={TITLES[w.level]} className="py-2.5">
          <span data-warning={w.code}>{w.message}</span>
        </Notice>
      ))}
    </div>
  );
}

type Props = {
  name: string;
  values: CalcValues;
  onChange: (key: string, value: string) => void;
  /** Buttons shown under the inputs (reset, copy link). */
  actions?: ReactNode;
  idPrefix?: string;
  showHelp?: boolean;
  /** Fields shown up front (see CalculatorForm). */
  primaryKeys?: ReadonlySet<string>;
};

/** Inputs, live results, cautions and (where one helps) a chart for one calculator. */
export function CalculatorPanel({ name, values, onChange, actions, idPrefix, showHelp = true, primaryKeys }: Props) {
  const calculator = getCalculator(name);
  const calc = useCalculation(name, values);
  const units = useUnits();
  if (!calculator || !isCalculatorName(name)) {
    return (
      <Notice tone="danger" title="Unknown calculator">
        There is no calculator called “{name}”.
      </Notice>
    );
  }
  const fields = showHelp ? calculator.fields : calculator.fields.map(({ help: _help, ...f }) => f);
  const general = calc.fieldErrors[''];
  const results = calc.output?.results as Record<string, unknown> | undefined;
  return (
    <div className="grid gap-5 md:grid-cols-[minmax(0,1fr)_minmax(0,1.15fr)]">
      <div className="flex min-w-0 flex-col gap-3">
        <CalculatorForm
          fields={fields}
          values={values}
          errors={calc.fieldErrors}
          onChange={onChange}
          idPrefix={idPrefix}
          primaryKeys={primaryKeys}
          units={units}
        />
        {general && (
          <p className="text-sm text-danger" role="alert">
            {general}
          </p>
        )}
        {actions && <div className="flex flex-wrap gap-2 pt-1">{actions}</div>}
      </div>
      <div className="flex min-w-0 flex-col gap-4" aria-live="polite">
        {results ? (
          <div className={calc.stale ? 'opacity-45 grayscale transition' : 'transition'} data-results-state={calc.stale ? 'stale' : 'fresh'}>
            {calc.stale && <p className="mb-2 font-sans text-xs font-semibold text-ink-muted">Last good result — fix the highlighted input to update.</p>}
            <dl className="grid grid-cols-2 gap-x-4 gap-y-3">
              {resultLines(name, results, values, units).map((line) => (
                <div key={line.key} className={`min-w-0 ${line.key === 'neutralFeel' || line.key === 'band' ? 'col-span-2' : ''}`} data-result={line.key}>
                  <dt className="font-sans text-xs font-medium tracking-wide text-ink-muted uppercase">{line.label}</dt>
                  <dd
                    className={`${line.primary ? 'font-mono text-xl font-semibold text-copper-dark' : line.key === 'neutralFeel' ? 'font-serif text-sm leading-6 text-ink' : 'font-mono text-base text-ink'} break-words`}
                  >
                    {line.value}
                  </dd>
                  {line.note && <dd className="font-sans text-xs text-ink-muted">{line.note}</dd>}
                </div>
              ))}
            </dl>
            {hasChart(name) && (
              <div className="mt-4 rounded-md border border-paper-line bg-white/60 p-2 pt-3" data-units={units}>
                <CalcErrorBoundary
                  fallback={() => <p className="p-4 text-sm text-ink-muted">The chart could not be drawn; the numbers above are still right.</p>}
                >
                  <Suspense
                    fallback={
                      <div role="status" className="h-[276px] animate-pulse rounded bg-paper-deep/60">
                        <span className="sr-only">Loading chart…</span>
                      </div>
                    }
                  >
                    <CalcChart name={name} results={results} inputs={values} units={units} />
                  </Suspense>
                </CalcErrorBoundary>
              </div>
            )}
          </div>
        ) : (
          <p className="text-sm text-ink-muted">Fill in the inputs to see the results.</p>
        )}
        {calc.output && !calc.stale && <Warnings warnings={calc.output.warnings} />}
      </div>
    </div>
  );
}
