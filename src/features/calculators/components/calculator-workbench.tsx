import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { getCalculator } from '@shared/calc/registry';
import { formatWorkedExample } from '@shared/calc/worked-example';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { valuesFromInputs, type CalcValues } from '../hooks/use-calculation';
import { CalcErrorBoundary } from './calc-error-boundary';
import { CalculatorPanel } from './calculator-panel';
import { Notice } from '@/components/ui/notice';

/** Form values from the query string; a link without any of the calculator's keys starts from its example. */
function valuesFromSearch(name: string, search: URLSearchParams): CalcValues {
  const calculator = getCalculator(name)!;
  const anyGiven = calculator.fields.some((f) => search.has(f.key));
  if (!anyGiven) return valuesFromInputs(name, calculator.defaults as Record<string, unknown>);
  return Object.fromEntries(calculator.fields.map((f) => [f.key, search.get(f.key) ?? '']));
}

async function copyText(text: string) {
  if (navigator.clipboard?.writeText) {
    await navigator.clipboard.writeText(text);
    return;
  }
  throw new Error('Clipboard not available');
}

/** A standalone calculator whose inputs live in the query string, so any result can be shared as a link. */
export function CalculatorWorkbench({ name }: { name: string }) {
  const calculator = getCalculator(name);
  const [search, setSearch] = useSearchParams();
  const values = useMemo(() => (calculator ? valuesFromSearch(name, search) : {}), [calculator, name, search]);

  const handleChange = useCallback(
    (key: string, value: string) => {
      const next = new URLSearchParams();
      for (const [k, v] of Object.entries({ ...values, [key]: value })) next.set(k, v);
      // replace: typing a number should not leave one history entry per keystroke
      setSearch(next, { replace: true, preventScrollReset: true });
    },
    [values, setSearch],
  );

  // The same block the editor's "Insert worked example" writes, with the numbers on screen.
  const handleUseInGuide = async () => {
    const block = formatWorkedExample(name, values);
    try {
      await copyText(block);
      toast.success('Worked example copied: paste it into a guide’s body, where it becomes a live card.');
    } catch {
      toast.error(`Could not copy automatically. The block is:\n${block}`);
    }
  };

  const handleReset = () => setSearch(new URLSearchParams(), { replace: true, preventScrollReset: true });

  const handleCopy = async () => {
    const next = new URLSearchParams(values);
    const url = `${window.location.origin}${window.location.pathname}?${next.toString()}`;
    try {
      await copyText(url);
      toast.success('Link copied: it opens this calculator with these numbers.');
    } catch {
      toast.error(`Could not copy automatically. The link is: ${url}`);
    }
  };

  if (!calculator) return null;
  return (
    <Card className="p-4 sm:p-6">
      <CalcErrorBoundary
        fallback={(e) => (
          <Notice tone="danger" title="This calculator hit a snag">
            {e.message}
          </Notice>
        )}
      >
        <CalculatorPanel
          name={name}
          values={values}
          onChange={handleChange}
          idPrefix={`calc-${name}`}
          actions={
            <>
              <Button type="button" size="sm" onClick={handleCopy}>
                Copy link
              </Button>
              <Button type="button" size="sm" variant="secondary" onClick={handleUseInGuide}>
                Use in a guide
              </Button>
              <Button type="button" size="sm" variant="secondary" onClick={handleReset}>
                Reset to the example
              </Button>
            </>
          }
        />
      </CalcErrorBoundary>
    </Card>
  );
}
