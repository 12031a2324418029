import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { getCalculator } from '@shared/calc/registry';
import { PageHeader } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { CalculatorIndex } from '@/features/calculators/components/calculator-index';
import { CalculatorWorkbench } from '@/features/calculators/components/calculator-workbench';

export function CalculatorsPage() {
  useEffect(() => {
    document.title = 'Calculators · Tunewright';
  }, []);
  return (
    <div>
      <PageHeader eyebrow="Work the numbers" title="Calculators">
        The same calculators that power the worked examples in the library and the guides. Results update as you type, and every page keeps its inputs in the
        link, so you can send a result to a clubmate.
      </PageHeader>
      <CalculatorIndex />
    </div>
  );
}

export function CalculatorPage() {
  const { name = '' } = useParams();
  const calculator = getCalculator(name);
  useEffect(() => {
    document.title = `${calculator?.title ?? 'Unknown calculator'} · Tunewright`;
  }, [calculator]);
  if (!calculator) {
    return (
      <div className="mx-auto max-w-xl">
        <Notice tone="caution" title="No calculator by that name">
          <p>
            “{name}” is not one of our calculators. <Link to="/calculators">See all calculators</Link>.
          </p>
        </Notice>
      </div>
    );
  }
  return (
    <div>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/calculators">Calculators</Link>
        <span className="px-1.5 text-ink-faint" aria-hidden>
          /
        </span>
        <span className="text-ink-muted">{calculator.title}</span>
      </nav>
      <PageHeader eyebrow="Calculator" title={calculator.title}>
        {calculator.description}
      </PageHeader>
      <CalculatorWorkbench key={name} name={name} />
      <p className="mt-4 max-w-3xl text-xs leading-5 text-ink-muted">
        Results are estimates from the standard relations, rounded for reading. Your equipment maker’s instructions and your track’s and sanctioning body’s
        rules come first.
      </p>
    </div>
  );
}
