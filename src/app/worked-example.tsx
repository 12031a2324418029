import { lazy, Suspense, type ReactNode } from 'react';
import { WhenNear } from '@/components/ui/when-near';

const WorkedExampleCard = lazy(() => import('@/features/calculators/components/worked-example-card').then((m) => ({ default: m.WorkedExampleCard })));

/**
 * Holds the card's place (roughly its height) until the calculator code has loaded. Its button is a stop for Tab:
 * focusing it loads the card, and the focus moves on to the card's first input (WhenNear).
 */
function CardPlaceholder() {
  return (
    <div className="not-prose my-6 min-h-72 rounded-lg border border-copper/35 bg-paper-card font-sans" data-example-placeholder>
      <div className="rounded-t-lg border-b border-copper/25 bg-copper-wash/60 px-4 py-2 text-[0.7rem] font-semibold tracking-[0.14em] text-copper-dark uppercase">
        Worked example
      </div>
      <p className="px-4 py-3 text-sm text-ink-soft">
        <button type="button" className="rounded-md border border-ink/25 bg-paper-card px-3 py-1.5 font-medium text-ink hover:bg-paper-deep">
          Open the worked example’s inputs
        </button>{' '}
        The live calculator loads as you reach it.
      </p>
    </div>
  );
}

/**
 * How guide pages, parameter pages and the editor preview render ```worked-example blocks: the live
 * calculator card, loaded when it comes near the viewport. One place, so the reader and the author
 * see the same thing.
 */
export function renderWorkedExample(body: string, index: number): ReactNode {
  return (
    <WhenNear key={index} placeholder={<CardPlaceholder />}>
      <Suspense fallback={<CardPlaceholder />}>
        <WorkedExampleCard body={body} />
      </Suspense>
    </WhenNear>
  );
}
