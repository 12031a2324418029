import { useCallback, useMemo, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { getCalculator } from '@shared/calc/registry';
import { parseWorkedExample } from '@shared/calc/worked-example';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { valuesFromInputs, type CalcValues } from '../hooks/use-calculation';
import { CalcErrorBoundary } from './calc-error-boundary';
import { CalculatorPanel } from './calculator-panel';

function CardShell({ title, calcName, children }: { title: string; calcName?: string; children: ReactNode }) {
  return (
    <section
      className="not-prose my-6 rounded-lg border border-copper/35 bg-paper-card font-sans shadow-[0_1px_0_rgba(29,42,68,0.06)]"
      aria-label={`Worked example: ${title}`}
      data-worked-example
    >
      <header className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1 rounded-t-lg border-b border-copper/25 bg-copper-wash/60 px-4 py-2">
        <h3 className="m-0 flex flex-wrap items-baseline gap-x-2 font-sans text-[0.95rem] font-semibold text-ink">
          <span className="text-[0.7rem] font-semibold tracking-[0.14em] text-copper-dark uppercase">Worked example</span>
          <span>{title}</span>
        </h3>
        {calcName && (
          <Link to={`/calculators/${calcName}`} className="text-xs">
            Open in the calculator
          </Link>
        )}
      </header>
      <div className="p-4">{children}</div>
    </section>
  );
}

function BadBlock({ issues, body }: { issues: { path: string; message: string }[]; body: string }) {
  return (
    <CardShell title="needs fixing">
      <Notice tone="caution" title="This worked example cannot be computed">
        <ul className="my-1 list-disc pl-5">
          {issues.map((issue, i) => (
            <li key={i} data-block-issue={issue.path}>
              {issue.path ? <code className="rounded bg-paper-deep px-1 font-mono text-[0.85em]">{issue.path}</code> : null}
              {issue.path ? ': ' : ''}
              {issue.message}
            </li>
          ))}
        </ul>
      </Notice>
      <pre className="mt-3 overflow-x-auto rounded-md bg-ink p-3 font-mono text-xs leading-5 text-paper">{body}</pre>
    </CardShell>
  );
}

function LiveCard({ calc, initial }: { calc: string; initial: CalcValues }) {
  const calculator = getCalculator(calc)!;
  const [values, setValues] = useState(initial);
  // Optional inputs the example leaves out wait under "More inputs", so the card shows what the text talks about.
  const primaryKeys = useMemo(() => new Set(calculator.fields.filter((f) => !f.optional || initial[f.key] !== '').map((f) => f.key)), [calculator, initial]);
  const changed = useMemo(() => Object.keys(initial).some((k) => initial[k] !== values[k]), [initial, values]);
  const handleChange = useCallback((key: string, value: string) => setValues((v) => ({ ...v, [key]: value })), []);
  return (
    <CardShell title={calculator.title} calcName={calc}>
      <CalculatorPanel
        name={calc}
        values={values}
        onChange={handleChange}
        showHelp={false}
        primaryKeys={primaryKeys}
        actions={
          <Button type="button" variant="secondary" size="sm" disabled={!changed} onClick={() => setValues(initial)}>
            Reset to the example
          </Button>
        }
      />
    </CardShell>
  );
}

/**
 * A ```worked-example block made live: the block's inputs become editable fields, and the results,
 * cautions and chart follow every keystroke. A broken block explains itself instead of breaking the page.
 */
export function WorkedExampleCard({ body }: { body: string }) {
  const parsed = useMemo(() => parseWorkedExample(body), [body]);
  const initial = useMemo(() => (parsed.ok ? valuesFromInputs(parsed.calc, parsed.rawInputs, parsed.inputs) : null), [parsed]);
  return (
    <CalcErrorBoundary
      fallback={(error, reset) => (
        <CardShell title="could not be shown">
          <Notice tone="danger" title="Something went wrong in this worked example">
            <p>{error.message}</p>
            <Button type="button" size="sm" variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Notice>
        </CardShell>
      )}
    >
      {parsed.ok ? initial && <LiveCard key={body} calc={parsed.calc} initial={initial} /> : <BadBlock issues={parsed.issues} body={body} />}
    </CalcErrorBoundary>
  );
}
